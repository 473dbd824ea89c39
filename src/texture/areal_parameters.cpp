// Areal height parameters through ArealMoments, and Sdr from cell-square slopes.
// Inputs: residual heightfield um; output: ArealParameters. Cost O(cells) / threads, summed in
// fixed row blocks (the same result for any thread count).
// Method: ISO 25178-2:2012 §4.1 and §4.3.2.
#include "texture/areal_parameters.h"

#include <algorithm>
#include <cassert>
#include <cmath>
#include <vector>

#include "core/parallel_blocks.h"
#include "core/units.h"
#include "core/widen_floats.h"
#include "texture/areal_moments.h"

#if defined(__SSE2__)
#include <emmintrin.h>
#endif

namespace cuspmap {
namespace {

// Rows per partial sum: the field is cut into fixed row blocks whatever the thread count, and
// the blocks' sums are added in order, so results do not depend on the threads.
constexpr int kRowsPerBlock = 64;

int row_blocks(int rows) { return (rows + kRowsPerBlock - 1) / kRowsPerBlock; }

// Sdr sums over the squares between two rows a (lower) and b (upper) of nx cells. The slopes and
// each square's term are formed two squares at a time in double lanes (the scalar form's
// operations one by one, IEEE-rounded alike: the same doubles), and summed in order.
void sdr_row_pair(const float* a, const float* b, int nx, double k, double& sum,
                  std::int64_t& squares) {
  int i = 0;
#if defined(__SSE2__)
  const auto two = [](const float* p) { return widen_two_floats(p); };
  const __m128d kv = _mm_set1_pd(k), one = _mm_set1_pd(1.0);
  for (; i + 2 < nx; i += 2) {
    const __m128d z00 = two(a + i), z10 = two(a + i + 1);
    const __m128d z01 = two(b + i), z11 = two(b + i + 1);
    const __m128d gx =
        _mm_mul_pd(_mm_add_pd(_mm_sub_pd(z10, z00), _mm_sub_pd(z11, z01)), kv);
    const __m128d gy =
        _mm_mul_pd(_mm_add_pd(_mm_sub_pd(z01, z00), _mm_sub_pd(z11, z10)), kv);
    const __m128d g2 = _mm_add_pd(_mm_mul_pd(gx, gx), _mm_mul_pd(gy, gy));
    const __m128d term = _mm_div_pd(g2, _mm_add_pd(_mm_sqrt_pd(_mm_add_pd(one, g2)), one));
    alignas(16) double g2s[2], terms[2];
    _mm_store_pd(g2s, g2);
    _mm_store_pd(terms, term);
    for (int lane = 0; lane < 2; ++lane) {
      if (std::isnan(g2s[lane])) continue;
      sum += terms[lane];
      ++squares;
    }
  }
#endif
  for (; i + 1 < nx; ++i) {
    const double z00 = a[i], z10 = a[i + 1];
    const double z01 = b[i], z11 = b[i + 1];
    const double gx = ((z10 - z00) + (z11 - z01)) * k;
    const double gy = ((z01 - z00) + (z11 - z10)) * k;
    const double g2 = gx * gx + gy * gy;
    if (std::isnan(g2)) continue;
    // sqrt(1 + g2) - 1 written to keep its digits for small slopes.
    sum += g2 / (std::sqrt(1.0 + g2) + 1.0);
    ++squares;
  }
}

// Per row block: the height moments of rows [j0, j1) and the Sdr sums of the squares whose
// lower-left cell is in them. Rows come from `row(j, scratch)`: the field's own row, or a
// residual row made into scratch (nx floats) so that no whole residual is held.
struct BlockSums {
  ArealMoments moments;
  double sdr_sum = 0.0;
  std::int64_t squares = 0;
};

template <class RowOf>
ArealParameters parameters_of(const Heightfield& hf, bool moments, const RowOf& row_of,
                              std::int64_t* squares_out, double* sdr_out) {
  // Slopes are height (um -> mm) over run (mm); the 1/(2 cell) averages the two edges.
  const double k = 1.0 / (kUmPerMm * 2.0 * hf.cell_mm);
  std::vector<BlockSums> part(static_cast<std::size_t>(row_blocks(hf.ny)));
  parallel_blocks(row_blocks(hf.ny), 0, [&](int b) {
    BlockSums& s = part[static_cast<std::size_t>(b)];
    std::vector<float> scratch(2 * static_cast<std::size_t>(hf.nx));
    const int j0 = b * kRowsPerBlock, j1 = std::min(hf.ny, (b + 1) * kRowsPerBlock);
    const float* lower = row_of(j0, scratch.data());
    for (int j = j0; j < j1; ++j) {
      if (moments) {
        for (int i = 0; i < hf.nx; ++i) s.moments.add(lower[i]);
      }
      if (j + 1 >= hf.ny) break;
      const float* upper = row_of(j + 1, scratch.data() + ((j + 1 - j0) % 2) * hf.nx);
      sdr_row_pair(lower, upper, hf.nx, k, s.sdr_sum, s.squares);
      lower = upper;
    }
  });
  ArealMoments m;
  std::int64_t squares = 0;
  double sdr_sum = 0.0;
  for (const BlockSums& p : part) {
    m.merge(p.moments);
    sdr_sum += p.sdr_sum;
    squares += p.squares;
  }
  *squares_out = squares;
  *sdr_out = squares > 0 ? sdr_sum / static_cast<double>(squares) : 0.0;
  ArealParameters p;
  if (!moments) return p;
  assert(m.count > 0 && "areal parameters need a finite cell");
  const AmplitudeParameters a = amplitude_parameters(m);
  p.sa_um = a.mean_abs_um;
  p.sq_um = a.rms_um;
  p.sp_um = a.peak_um;
  p.sv_um = a.valley_um;
  p.sz_um = a.total_um;
  p.ssk = a.skewness;
  p.sku = a.kurtosis;
  p.shape_defined = a.shape_defined;
  p.cells = m.count;
  p.sdr = *sdr_out;
  p.squares = squares;
  return p;
}

const float* own_row(const Heightfield& hf, int j) { return &hf.z_um(j, 0); }

}  // namespace

double developed_area_ratio(const Heightfield& hf, std::int64_t& squares) {
  double sdr = 0.0;
  parameters_of(hf, false, [&](int j, float*) { return own_row(hf, j); }, &squares, &sdr);
  return sdr;
}

ArealParameters areal_parameters(const Heightfield& residual) {
  std::int64_t squares = 0;
  double sdr = 0.0;
  return parameters_of(residual, true, [&](int j, float*) { return own_row(residual, j); },
                       &squares, &sdr);
}

ArealParameters areal_parameters(const Heightfield& floor, const Plane& plane) {
  std::int64_t squares = 0;
  double sdr = 0.0;
  const ResidualRows rows(floor, plane);
  return parameters_of(floor, true,
                       [&](int j, float* scratch) {
                         rows.row(j, scratch);
                         return static_cast<const float*>(scratch);
                       },
                       &squares, &sdr);
}

}  // namespace cuspmap

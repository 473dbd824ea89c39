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
#include "texture/areal_moments.h"

namespace cuspmap {
namespace {

// Rows per partial sum: the field is cut into fixed row blocks whatever the thread count, and
// the blocks' sums are added in order, so results do not depend on the threads.
constexpr int kRowsPerBlock = 64;

int row_blocks(int rows) { return (rows + kRowsPerBlock - 1) / kRowsPerBlock; }

// Sdr sums over the squares whose lower-left cell is in rows [j0, j1).
void sdr_rows(const Heightfield& hf, int j0, int j1, double& sum, std::int64_t& squares) {
  // Slopes are height (um -> mm) over run (mm); the 1/(2 cell) averages the two edges.
  const double k = 1.0 / (kUmPerMm * 2.0 * hf.cell_mm);
  for (int j = j0; j < j1; ++j) {
    for (int i = 0; i + 1 < hf.nx; ++i) {
      const double z00 = hf.z_um(j, i), z10 = hf.z_um(j, i + 1);
      const double z01 = hf.z_um(j + 1, i), z11 = hf.z_um(j + 1, i + 1);
      const double gx = ((z10 - z00) + (z11 - z01)) * k;
      const double gy = ((z01 - z00) + (z11 - z10)) * k;
      const double g2 = gx * gx + gy * gy;
      if (std::isnan(g2)) continue;
      // sqrt(1 + g2) - 1 written to keep its digits for small slopes.
      sum += g2 / (std::sqrt(1.0 + g2) + 1.0);
      ++squares;
    }
  }
}

}  // namespace

double developed_area_ratio(const Heightfield& hf, std::int64_t& squares) {
  const int rows = std::max(hf.ny - 1, 0);
  std::vector<double> sums(static_cast<std::size_t>(row_blocks(rows)), 0.0);
  std::vector<std::int64_t> counts(sums.size(), 0);
  parallel_blocks(row_blocks(rows), 0, [&](int b) {
    sdr_rows(hf, b * kRowsPerBlock, std::min(rows, (b + 1) * kRowsPerBlock), sums[b], counts[b]);
  });
  squares = 0;
  double sum = 0.0;
  for (std::size_t b = 0; b < sums.size(); ++b) {
    sum += sums[b];
    squares += counts[b];
  }
  return squares > 0 ? sum / static_cast<double>(squares) : 0.0;
}

ArealParameters areal_parameters(const Heightfield& residual) {
  std::vector<ArealMoments> part(static_cast<std::size_t>(row_blocks(residual.ny)));
  parallel_blocks(row_blocks(residual.ny), 0, [&](int b) {
    const int j1 = std::min(residual.ny, (b + 1) * kRowsPerBlock);
    for (int j = b * kRowsPerBlock; j < j1; ++j) {
      const float* z = &residual.z_um(j, 0);
      for (int i = 0; i < residual.nx; ++i) part[b].add(z[i]);
    }
  });
  ArealMoments m;
  for (const ArealMoments& p : part) m.merge(p);
  assert(m.count > 0 && "areal parameters need a finite cell");
  const AmplitudeParameters a = amplitude_parameters(m);
  ArealParameters p;
  p.sa_um = a.mean_abs_um;
  p.sq_um = a.rms_um;
  p.sp_um = a.peak_um;
  p.sv_um = a.valley_um;
  p.sz_um = a.total_um;
  p.ssk = a.skewness;
  p.sku = a.kurtosis;
  p.shape_defined = a.shape_defined;
  p.cells = m.count;
  p.sdr = developed_area_ratio(residual, p.squares);
  return p;
}

}  // namespace cuspmap

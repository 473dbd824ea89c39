// NaN-aware k x k block mean / minimum / anti-aliased mean of a float grid.
// Inputs: grid, block side k; output: the reduced grid (same row convention).
// Method: box-filter decimation (Gonzalez & Woods 2008, sec. 2.4); separable Gaussian pre-filter
// sampled at the block centres (ibid., 4.5-4.6); sums in double.
#include "report/reduce_blocks.h"

#include <algorithm>
#include <cassert>
#include <cmath>
#include <cstdint>
#include <cstring>
#include <limits>
#include <vector>

#include "core/widen_floats.h"
#include "report/finite_row.h"

#if defined(__SSE2__)
#include <emmintrin.h>
#endif

namespace cuspmap {
namespace {

// The Gaussian weights of one output sample along one axis: cells first .. first + w.size() - 1.
struct Taps {
  int first = 0;
  std::vector<double> w;
};

// Taps of every block along an axis of n cells: centred on the block (the partial last block on
// its own centre), sigma = kAntiAliasSigmaPx k cells, cut at kAntiAliasCutoffSigmas sigma.
std::vector<Taps> gaussian_taps(int n, int k) {
  const int blocks = (n + k - 1) / k;
  const double sigma = kAntiAliasSigmaPx * k;
  const double reach = kAntiAliasCutoffSigmas * sigma;
  std::vector<Taps> taps(static_cast<std::size_t>(blocks));
  for (int b = 0; b < blocks; ++b) {
    const double centre = 0.5 * (b * k + std::min(n, (b + 1) * k) - 1);
    const int lo = std::max(0, static_cast<int>(std::ceil(centre - reach)));
    const int hi = std::min(n - 1, static_cast<int>(std::floor(centre + reach)));
    taps[b].first = lo;
    for (int i = lo; i <= hi; ++i) {
      const double u = (i - centre) / sigma;
      taps[b].w.push_back(std::exp(-0.5 * u * u));
    }
  }
  return taps;
}

// Outputs summed together in registers (independent sums, each in its own order), as pairs of
// doubles (GCC/Clang vector extension: plain IEEE lane-wise multiply and add, no fusing on the
// x86-64 baseline), so the compiler cannot turn the sums across the taps instead.
using Pair = double __attribute__((vector_size(16)));
using FloatPair = float __attribute__((vector_size(8)));
constexpr int kPairs = 4;
constexpr int kLanes = 2 * kPairs;

Pair load_pair(const double* p) {
  Pair v;
  std::memcpy(&v, p, sizeof v);
  return v;
}

Pair load_pair(const float* p) {
#if defined(__SSE2__)
  // One cvtps2pd (GCC converts a float pair element by element).
  return reinterpret_cast<Pair>(widen_two_floats(p));
#else
  FloatPair v;
  std::memcpy(&v, p, sizeof v);
  return __builtin_convertvector(v, Pair);
#endif
}

// acc[u] += w * p[u] for the kLanes values from p on.
template <class T>
void add_lanes(Pair (&acc)[kPairs], double w, const T* p) {
  const Pair wp = {w, w};
  for (int u = 0; u < kPairs; ++u) acc[u] += wp * load_pair(p + 2 * u);
}

// Splits a row into its k phases in double: phase r holds cells r, k + r, 2k + r, ... (K: k known
// when compiling, so that the strided reads vectorise; 0: any k).
template <int K>
void split_phases(const float* row, int nx, int k_any, int per_phase, double* phases) {
  const int k = K > 0 ? K : k_any;
  const int whole = nx / k;  // rows of k cells with every phase present
  for (int m = 0; m < whole; ++m) {
    for (int r = 0; r < k; ++r) {
      phases[static_cast<std::size_t>(r) * per_phase + m] = row[k * m + r];
    }
  }
  for (int r = 0; whole * k + r < nx; ++r) {
    phases[static_cast<std::size_t>(r) * per_phase + whole] = row[whole * k + r];
  }
}

// The interior samples [lo, hi) of one all-finite row, whose taps are the middle block's weights
// uw at first = first_lo + (bi - lo) k. The row is first split into its k phases, so that tap q
// of kLanes neighbouring outputs reads kLanes consecutive doubles of one phase; each output's sum
// takes the taps in order, from 0, as the direct loop does (the same results).
// tap_base[q]: where output lo's tap q sits in `phases` (its phase's start plus its index).
void interior_row_sums(const float* row, int nx, int k, const std::vector<double>& uw, int lo,
                       int hi, int first_lo, const std::vector<std::size_t>& tap_base,
                       std::vector<double>& phases, float* sum_row) {
  const int per_phase = (nx + k - 1) / k;
  phases.resize(static_cast<std::size_t>(k) * per_phase);
  switch (k) {
    case 2: split_phases<2>(row, nx, k, per_phase, phases.data()); break;
    case 3: split_phases<3>(row, nx, k, per_phase, phases.data()); break;
    case 4: split_phases<4>(row, nx, k, per_phase, phases.data()); break;
    default: split_phases<0>(row, nx, k, per_phase, phases.data()); break;
  }
  const int taps = static_cast<int>(uw.size());
  int bi = lo;
  for (; bi + kLanes <= hi; bi += kLanes) {
    Pair acc[kPairs] = {};
    for (int q = 0; q < taps; ++q) add_lanes(acc, uw[q], phases.data() + tap_base[q] + (bi - lo));
    for (int u = 0; u < kLanes; ++u) sum_row[bi + u] = static_cast<float>(acc[u / 2][u % 2]);
  }
  for (; bi < hi; ++bi) {
    const float* v = row + first_lo + (bi - lo) * k;
    double s = 0.0;
    for (int q = 0; q < taps; ++q) s += uw[q] * v[q];
    sum_row[bi] = static_cast<float>(s);
  }
}

// Where output lo's taps sit in the phases of a row of nx cells: cell first_lo + q is
// k m + r, phase r's start is r ceil(nx / k).
std::vector<std::size_t> interior_tap_base(int nx, int k, int taps, int first_lo) {
  const int per_phase = (nx + k - 1) / k;
  std::vector<std::size_t> base(static_cast<std::size_t>(taps));
  for (int q = 0; q < taps; ++q) {
    const int cell = first_lo + q;
    base[static_cast<std::size_t>(q)] =
        static_cast<std::size_t>(cell % k) * per_phase + static_cast<std::size_t>(cell / k);
  }
  return base;
}

// One output row's weighted sums over the taps' rows (rows[q]: tap q's row of n floats),
// kLanes outputs at a time in registers; each output takes the taps in order, from 0.
void column_sums(const float* const* rows, const Taps& t, int n, std::vector<double>& out) {
  const int taps = static_cast<int>(t.w.size());
  int bi = 0;
  for (; bi + kLanes <= n; bi += kLanes) {
    Pair acc[kPairs] = {};
    for (int q = 0; q < taps; ++q) add_lanes(acc, t.w[q], rows[q] + bi);
    for (int u = 0; u < kLanes; ++u) out[bi + u] = acc[u / 2][u % 2];
  }
  for (; bi < n; ++bi) {
    double s = 0.0;
    for (int q = 0; q < taps; ++q) s += t.w[q] * rows[q][bi];
    out[bi] = s;
  }
}

// Separable Gaussian-weighted mean over the finite cells: rows first into (ny x out_nx) weighted
// sums and weights, then columns. Separable because the weight of cell (j, i) is wy(j) wx(i) and
// NaN cells drop out of both the sum and the weight.
HeightGrid anti_alias_reduce(const HeightGrid& z, int k) {
  const int ny = static_cast<int>(z.rows()), nx = static_cast<int>(z.cols());
  const std::vector<Taps> tx = gaussian_taps(nx, k), ty = gaussian_taps(ny, k);
  const int out_nx = static_cast<int>(tx.size()), out_ny = static_cast<int>(ty.size());
  // Float intermediates (each sum formed in double), held only for the rows the current output
  // row's taps reach: row j in slot j % ring of two ring x out_nx grids. The taps' first row
  // never falls as the output row rises, so a row is made once and dropped when passed.
  int ring = 1;
  for (const Taps& t : ty) ring = std::max(ring, static_cast<int>(t.w.size()));
  HeightGrid sum(ring, out_nx), weight(ring, out_nx);
  // Whether block (j / k, bi) has a finite cell: the same "not reached" rule as the other modes.
  std::vector<std::uint8_t> reached(static_cast<std::size_t>(out_ny) * out_nx, 0);
  // Whether every cell of row j is finite (its weights are then the full ones).
  std::vector<std::uint8_t> row_finite(static_cast<std::size_t>(ny), 0);
  // Each block's total weight when every cell is finite (summed in the same order as below).
  std::vector<double> full_weight(static_cast<std::size_t>(out_nx), 0.0);
  for (int bi = 0; bi < out_nx; ++bi) {
    for (double w : tx[bi].w) full_weight[bi] += w;
  }
  // Interior blocks have the same weights (the same offsets from their centres) and start k
  // cells apart: [uniform_lo, uniform_hi) is that run around the middle block.
  const int mid = out_nx / 2;
  const auto uniform = [&](int bi) {
    return tx[bi].w == tx[mid].w && tx[bi].first == tx[mid].first + (bi - mid) * k;
  };
  int uniform_lo = mid, uniform_hi = mid + 1;
  while (uniform_lo > 0 && uniform(uniform_lo - 1)) --uniform_lo;
  while (uniform_hi < out_nx && uniform(uniform_hi)) ++uniform_hi;
  std::vector<double> phases;
  const std::vector<std::size_t> tap_base = interior_tap_base(
      nx, k, static_cast<int>(tx[mid].w.size()), tx[uniform_lo].first);
  // Rows of the input: weighted sums along the row into the ring, marks of reached blocks.
  const auto row_pass = [&](int j) {
    const float* row = &z(j, 0);
    const bool all_finite = row_all_finite(row, nx);
    row_finite[static_cast<std::size_t>(j)] = all_finite ? 1 : 0;
    float* sum_row = &sum(j % ring, 0);
    float* weight_row = &weight(j % ring, 0);
    for (int bi = 0; bi < out_nx; ++bi) {
      if (all_finite && bi == uniform_lo) {
        interior_row_sums(row, nx, k, tx[mid].w, uniform_lo, uniform_hi, tx[uniform_lo].first,
                          tap_base, phases, sum_row);
        for (; bi < uniform_hi; ++bi) weight_row[bi] = static_cast<float>(full_weight[bi]);
        if (bi >= out_nx) break;
      }
      const Taps& t = tx[bi];
      const float* v = row + t.first;
      const int taps = static_cast<int>(t.w.size());
      double s = 0.0, w = 0.0;
      if (all_finite) {
        // The common case, without a test per tap: the same sums in the same order.
        for (int q = 0; q < taps; ++q) s += t.w[q] * v[q];
        w = full_weight[bi];
      } else {
        for (int q = 0; q < taps; ++q) {
          if (!std::isfinite(v[q])) continue;
          s += t.w[q] * v[q];
          w += t.w[q];
        }
      }
      sum_row[bi] = static_cast<float>(s);
      weight_row[bi] = static_cast<float>(w);
    }
    std::uint8_t* mark = &reached[static_cast<std::size_t>(j / k) * out_nx];
    if (all_finite) {
      std::fill(mark, mark + out_nx, std::uint8_t{1});
    } else {
      for (int i = 0; i < nx; ++i) {
        if (std::isfinite(row[i])) mark[i / k] = 1;
      }
    }
  };
  HeightGrid out(out_ny, out_nx);
  // Columns: each output's sums take the taps in order. Where every row under the taps is all
  // finite, the weight row holds full_weight in each of them, so the weight sums depend on the
  // taps' weights alone: made once for each such set of weights and reused (the same doubles).
  std::vector<double> s(static_cast<std::size_t>(out_nx)), w(static_cast<std::size_t>(out_nx));
  std::vector<double> cached_w(static_cast<std::size_t>(out_nx));
  const std::vector<double>* cached_key = nullptr;
  std::vector<const float*> sum_rows(static_cast<std::size_t>(ring));
  std::vector<const float*> weight_rows(static_cast<std::size_t>(ring));
  int rows_done = 0;
  for (int bj = 0; bj < out_ny; ++bj) {
    const Taps& t = ty[bj];
    const int taps = static_cast<int>(t.w.size());
    // The taps' rows (and with them every row of block row bj, whose reached marks are read
    // below: the taps reach past the block on both sides).
    for (; rows_done < t.first + taps; ++rows_done) row_pass(rows_done);
    assert(rows_done >= std::min(ny, (bj + 1) * k) && "the taps cover their own block");
    bool full = true;
    for (int q = 0; q < taps; ++q) {
      const int j = t.first + q;
      full &= row_finite[static_cast<std::size_t>(j)] != 0;
      sum_rows[static_cast<std::size_t>(q)] = &sum(j % ring, 0);
      weight_rows[static_cast<std::size_t>(q)] = &weight(j % ring, 0);
    }
    column_sums(sum_rows.data(), t, out_nx, s);
    const std::vector<double>* wj = &w;
    if (full && cached_key != nullptr && *cached_key == t.w) {
      wj = &cached_w;
    } else {
      column_sums(weight_rows.data(), t, out_nx, w);
      if (full) {
        cached_w = w;
        cached_key = &t.w;
      }
    }
    for (int bi = 0; bi < out_nx; ++bi) {
      const bool any = reached[static_cast<std::size_t>(bj) * out_nx + bi] != 0;
      const double wb = (*wj)[bi];
      out(bj, bi) = any && wb > 0.0 ? static_cast<float>(s[bi] / wb) : kUnreached;
    }
  }
  return out;
}

}  // namespace

int cells_per_pixel_for(int nx, int ny, int max_pixels) {
  const int limit = std::max(max_pixels, 1);
  const int longest = std::max(nx, ny);
  return std::max(1, (longest + limit - 1) / limit);
}

HeightGrid reduce_blocks(const HeightGrid& z, int k, BlockReduce mode) {
  const int block = std::max(k, 1);
  const int ny = static_cast<int>(z.rows()), nx = static_cast<int>(z.cols());
  const int out_ny = (ny + block - 1) / block, out_nx = (nx + block - 1) / block;
  if (block == 1) return z;
  if (mode == BlockReduce::AntiAlias) return anti_alias_reduce(z, block);
  HeightGrid out(out_ny, out_nx);
  // One pass over the input rows, accumulating into per-output-column sums and counts.
  std::vector<double> acc(static_cast<std::size_t>(out_nx));
  std::vector<int> count(static_cast<std::size_t>(out_nx));
  for (int bj = 0; bj < out_ny; ++bj) {
    std::fill(acc.begin(), acc.end(),
              mode == BlockReduce::Mean ? 0.0 : std::numeric_limits<double>::infinity());
    std::fill(count.begin(), count.end(), 0);
    for (int j = bj * block; j < std::min(ny, (bj + 1) * block); ++j) {
      for (int i = 0; i < nx; ++i) {
        const float v = z(j, i);
        if (!std::isfinite(v)) continue;
        const int bi = i / block;
        acc[bi] = mode == BlockReduce::Mean ? acc[bi] + v : std::min(acc[bi], double{v});
        ++count[bi];
      }
    }
    for (int bi = 0; bi < out_nx; ++bi) {
      if (count[bi] == 0) {
        out(bj, bi) = kUnreached;
      } else {
        out(bj, bi) = static_cast<float>(mode == BlockReduce::Mean ? acc[bi] / count[bi] : acc[bi]);
      }
    }
  }
  return out;
}

}  // namespace cuspmap

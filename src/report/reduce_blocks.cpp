// NaN-aware k x k block mean / minimum / anti-aliased mean of a float grid.
// Inputs: grid, block side k; output: the reduced grid (same row convention).
// Method: box-filter decimation (Gonzalez & Woods 2008, sec. 2.4); separable Gaussian pre-filter
// sampled at the block centres (ibid., 4.5-4.6); sums in double.
#include "report/reduce_blocks.h"

#include <algorithm>
#include <cstdint>
#include <cmath>
#include <limits>
#include <vector>

#include "core/large_buffer.h"

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

// Separable Gaussian-weighted mean over the finite cells: rows first into (ny x out_nx) weighted
// sums and weights, then columns. Separable because the weight of cell (j, i) is wy(j) wx(i) and
// NaN cells drop out of both the sum and the weight.
HeightGrid anti_alias_reduce(const HeightGrid& z, int k) {
  const int ny = static_cast<int>(z.rows()), nx = static_cast<int>(z.cols());
  const std::vector<Taps> tx = gaussian_taps(nx, k), ty = gaussian_taps(ny, k);
  const int out_nx = static_cast<int>(tx.size()), out_ny = static_cast<int>(ty.size());
  // Float intermediates keep memory at 2 x ny x out_nx x 4 bytes; each sum is formed in double.
  HeightGrid sum(ny, out_nx), weight(ny, out_nx);
  advise_huge_pages(sum.data(), static_cast<std::size_t>(sum.size()) * sizeof(float));
  advise_huge_pages(weight.data(), static_cast<std::size_t>(weight.size()) * sizeof(float));
  // Whether block (j / k, bi) has a finite cell: the same "not reached" rule as the other modes.
  std::vector<std::uint8_t> reached(static_cast<std::size_t>(out_ny) * out_nx, 0);
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
  for (int j = 0; j < ny; ++j) {
    const float* row = &z(j, 0);
    bool all_finite = true;
    for (int i = 0; i < nx; ++i) all_finite &= std::isfinite(row[i]);
    for (int bi = 0; bi < out_nx; ++bi) {
      if (all_finite && bi == uniform_lo) {
        // Four interior samples at once: independent sums, each in the same order as alone
        // (the same results; the four chains of additions overlap instead of waiting).
        const std::vector<double>& uw = tx[mid].w;
        const int taps = static_cast<int>(uw.size());
        for (; bi + 4 <= uniform_hi; bi += 4) {
          const float* v = row + tx[bi].first;
          double s0 = 0.0, s1 = 0.0, s2 = 0.0, s3 = 0.0;
          for (int q = 0; q < taps; ++q) {
            const double wq = uw[q];
            s0 += wq * v[q];
            s1 += wq * v[k + q];
            s2 += wq * v[2 * k + q];
            s3 += wq * v[3 * k + q];
          }
          const double group[4] = {s0, s1, s2, s3};
          for (int u = 0; u < 4; ++u) {
            sum(j, bi + u) = static_cast<float>(group[u]);
            weight(j, bi + u) = static_cast<float>(full_weight[bi + u]);
          }
        }
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
      sum(j, bi) = static_cast<float>(s);
      weight(j, bi) = static_cast<float>(w);
    }
    std::uint8_t* mark = &reached[static_cast<std::size_t>(j / k) * out_nx];
    if (all_finite) {
      std::fill(mark, mark + out_nx, std::uint8_t{1});
    } else {
      for (int i = 0; i < nx; ++i) {
        if (std::isfinite(row[i])) mark[i / k] = 1;
      }
    }
  }
  HeightGrid out(out_ny, out_nx);
  // Columns: each output's sums take the taps in order, accumulated a whole output row at a time
  // (contiguous, so the loop over bi vectorises).
  std::vector<double> s(static_cast<std::size_t>(out_nx)), w(static_cast<std::size_t>(out_nx));
  for (int bj = 0; bj < out_ny; ++bj) {
    const Taps& t = ty[bj];
    std::fill(s.begin(), s.end(), 0.0);
    std::fill(w.begin(), w.end(), 0.0);
    for (std::size_t q = 0; q < t.w.size(); ++q) {
      const int j = t.first + static_cast<int>(q);
      const double tw = t.w[q];
      const float* sr = &sum(j, 0);
      const float* wr = &weight(j, 0);
      for (int bi = 0; bi < out_nx; ++bi) {
        s[bi] += tw * sr[bi];
        w[bi] += tw * wr[bi];
      }
    }
    for (int bi = 0; bi < out_nx; ++bi) {
      const bool any = reached[static_cast<std::size_t>(bj) * out_nx + bi] != 0;
      out(bj, bi) = any && w[bi] > 0.0 ? static_cast<float>(s[bi] / w[bi]) : kUnreached;
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

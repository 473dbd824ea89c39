// NaN-aware k x k block mean / minimum of a float grid.
// Inputs: grid, block side k; output: the reduced grid (same row convention).
// Method: box-filter decimation (Gonzalez & Woods 2008, sec. 2.4); sums in double.
#include "report/reduce_blocks.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <vector>

namespace cuspmap {

int cells_per_pixel_for(int nx, int ny, int max_pixels) {
  const int limit = std::max(max_pixels, 1);
  const int longest = std::max(nx, ny);
  return std::max(1, (longest + limit - 1) / limit);
}

HeightGrid reduce_blocks(const HeightGrid& z, int k, BlockReduce mode) {
  const int block = std::max(k, 1);
  const int ny = static_cast<int>(z.rows()), nx = static_cast<int>(z.cols());
  const int out_ny = (ny + block - 1) / block, out_nx = (nx + block - 1) / block;
  HeightGrid out(out_ny, out_nx);
  if (block == 1) return z;
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

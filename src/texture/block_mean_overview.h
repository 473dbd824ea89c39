// Overview of a heightfield that arrives in bands: the NaN-aware mean of each k x k block of
// cells (partial blocks at the high-index edges), summed in double in row order, so the result
// equals io/reduce_blocks' block mean of the whole grid. Inputs: bands (um); output: the reduced
// Heightfield (cell k times larger). Cost O(cells); memory O(cells / k^2).
// Method: box-filter decimation (Gonzalez & Woods, Digital Image Processing, 3rd ed., 2.4).
#pragma once

#include <vector>

#include "core/heightfield.h"

namespace cuspmap {

/// Longest side of the overview in blocks (the pictures' default longest side, io/height_image).
inline constexpr int kOverviewMaxPixels = 1024;

/// Block-mean accumulator over a grid fed band by band (bands in any row order, each row once).
class BlockMeanOverview {
 public:
  /// For a grid of nx x ny cells; k = max(1, ceil(max(nx, ny) / max_pixels)).
  BlockMeanOverview(int nx, int ny, double cell_mm, double origin_x_mm, double origin_y_mm,
                    int max_pixels = kOverviewMaxPixels);
  /// Adds the rows of a band whose first row is grid row j0; block columns in parallel.
  void add_band(const Heightfield& band, int j0, int threads);
  /// Adds block columns [b_lo, b_hi) of one grid row (nx heights, um). Calls for different block
  /// rows or disjoint block columns may run at the same time; each block's rows in order.
  void add_row(const float* row, int grid_row, int b_lo, int b_hi);
  /// Block columns of the overview.
  int blocks_x() const { return out_nx_; }
  /// Cells per block side.
  int cells_per_block() const { return k_; }
  /// The overview: ceil(ny / k) x ceil(nx / k) block means, NaN where a block has no finite cell.
  Heightfield result() const;

 private:
  int nx_, k_, out_nx_, out_ny_;
  double cell_mm_, origin_x_mm_, origin_y_mm_;
  std::vector<double> sum_;  // out_ny x out_nx
  std::vector<int> count_;   // out_ny x out_nx
};

}  // namespace cuspmap

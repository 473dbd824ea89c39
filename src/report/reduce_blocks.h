// Block reduction of a float grid for pictures of large heightfields: each output value is the
// mean or minimum of k x k input cells (partial blocks at the high-index edges), NaN ignored.
// Cost: O(cells).
// Method: box-filter decimation (Gonzalez & Woods, Digital Image Processing, 3rd ed., 2.4).
#pragma once

#include "core/heightfield.h"

namespace cuspmap {

/// How a block of cells becomes one pixel.
enum class BlockReduce {
  Mean,  ///< mean of the block's finite cells: the average height the pixel shows
  Min,   ///< lowest finite cell: keeps the deepest valleys (what sanding must reach) visible
};

/// Cells per pixel side so that neither side of an nx x ny grid exceeds max_pixels:
/// k = max(1, ceil(max(nx, ny) / max_pixels)).
/// @param[in] max_pixels  >= 1 (smaller values are treated as 1)
int cells_per_pixel_for(int nx, int ny, int max_pixels);

/// Reduces blocks of k x k cells.
/// @param[in] z     ny x nx grid (row-major; any row convention, kept as is)
/// @param[in] k     block side in cells, >= 1 (k = 1 copies)
/// @param[in] mode  mean or minimum of the finite cells
/// @return ceil(ny / k) x ceil(nx / k); block (bj, bi) covers rows bj k .. bj k + k - 1 and
///         columns bi k .. bi k + k - 1 (clipped at the edge); NaN when none of them is finite.
HeightGrid reduce_blocks(const HeightGrid& z, int k, BlockReduce mode);

}  // namespace cuspmap

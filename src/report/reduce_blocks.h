// Block reduction of a float grid for pictures of large heightfields: each output value stands
// for k x k input cells (partial blocks at the high-index edges): their mean, their minimum, or
// an anti-aliased (Gaussian-weighted) area mean around the block's centre; NaN ignored.
// Cost: O(cells) (anti-aliased: O(cells x 4)).
// Method: box-filter decimation (Gonzalez & Woods, Digital Image Processing, 3rd ed., 2.4);
// Gaussian pre-filter before decimation (ibid., 4.5-4.6, sampling and aliasing).
#pragma once

#include "core/heightfield.h"

namespace cuspmap {

/// How a block of cells becomes one pixel.
enum class BlockReduce {
  Mean,  ///< mean of the block's finite cells: the average height the pixel shows
  Min,   ///< lowest finite cell: keeps the deepest valleys (what sanding must reach) visible
  /// Gaussian-weighted mean of the finite cells around the block's centre (sigma =
  /// kAntiAliasSigmaPx pixels): marks finer than about 1.3 pixels (tooth marks on a large
  /// floor) average to their mean gray instead of folding into moire, as a plain block mean
  /// lets them (its sinc response passes ~22% of such a pattern at a false, coarser period).
  AntiAlias,
};

/// Standard deviation of the anti-aliasing Gaussian, in output pixels. Derived: its response
/// exp(-2 pi^2 sigma^2 f^2) is <= 2% for f >= 0.75 cycles/pixel (periods <= 1.33 px, 1.5 x the
/// Nyquist frequency) with sigma >= 0.593, while a period of 8 px keeps ~90% of its contrast.
inline constexpr double kAntiAliasSigmaPx = 0.6;
/// The Gaussian is cut off at this many sigma (weights below 1.1% of the peak are dropped).
inline constexpr double kAntiAliasCutoffSigmas = 3.0;

/// Cells per pixel side so that neither side of an nx x ny grid exceeds max_pixels:
/// k = max(1, ceil(max(nx, ny) / max_pixels)).
/// @param[in] max_pixels  >= 1 (smaller values are treated as 1)
int cells_per_pixel_for(int nx, int ny, int max_pixels);

/// Reduces blocks of k x k cells.
/// @param[in] z     ny x nx grid (row-major; any row convention, kept as is)
/// @param[in] k     block side in cells, >= 1 (k = 1 copies)
/// @param[in] mode  mean or minimum of the block's finite cells, or the anti-aliased mean
///                  (Gaussian weights centred on the block, sigma = kAntiAliasSigmaPx k cells,
///                  reaching into neighbouring blocks; renormalised over the finite cells)
/// @return ceil(ny / k) x ceil(nx / k); block (bj, bi) covers rows bj k .. bj k + k - 1 and
///         columns bi k .. bi k + k - 1 (clipped at the edge); NaN when none of them is finite
///         (in every mode, so "not reached" pixels are the same).
HeightGrid reduce_blocks(const HeightGrid& z, int k, BlockReduce mode);

}  // namespace cuspmap

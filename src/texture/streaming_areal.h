// Exact ISO 25178-2 height parameters of a heightfield that arrives in bands of rows and is never
// held whole: pass 1 accumulates the least-squares plane's normal-equation sums (and the raw
// extremes), pass 2 (the bands again) the moments of the residuals about that plane.
// Inputs: bands (um over mm cells, NaN = unreached); output: Plane, ArealMoments.
// Cost O(cells) per pass, SIMD row kernels (band_row_sums), rows in parallel; per-row sums
// merged in row order, so the result does not depend on the thread count. Method: ISO 25178-2:2012 §3.1.8 (F-operator, least-squares
// plane) and §4.1 (Sa, Sq, Sp, Sv, Ssk, Sku); two passes because Sa, Sp and Sv need the plane.
#pragma once

#include <cstdint>
#include <functional>

#include "core/heightfield.h"
#include "texture/areal_moments.h"
#include "texture/block_mean_overview.h"
#include "texture/fit_plane.h"

namespace cuspmap {

/// Runs body(k) for k in [0, count) on `threads` threads (k interleaved), on the caller when
/// threads <= 1. body must only write data owned by its k.
void parallel_rows(int count, int threads, const std::function<void(int)>& body);

/// Pass 1: plane sums and raw extremes of a whole grid fed band by band.
struct StreamingPlane {
  PlaneSums sums;                 ///< about the grid's centre (as fit_plane takes it)
  std::int64_t reached = 0;       ///< finite cells
  double min_um = 0.0;            ///< lowest finite height (valid when reached > 0)
  double max_um = 0.0;            ///< highest finite height

  /// Starts for a grid of nx x ny cells with this origin and cell.
  StreamingPlane(int nx, int ny, double cell_mm, double origin_x_mm, double origin_y_mm);
  /// Adds a band (any number of rows; band.y_mm(j) are the grid rows' centres) whose first row
  /// is grid row j0, and, when `overview` is given, its cells to the overview in the same read.
  void add_band(const Heightfield& band, int j0, int threads,
                BlockMeanOverview* overview = nullptr);
};

/// Pass 2: adds the residuals z - plane(x, y) of a band, rounded to float as remove_plane does,
/// to `moments`.
void add_residual_band(const Heightfield& band, const Plane& plane, int threads,
                       ArealMoments& moments);

}  // namespace cuspmap

// Row kernels of the streamed height statistics: the least-squares plane's sums and the raw
// extremes of one row of float heights (pass 1), the block sums of the overview, and the moments
// of the row's residuals about a plane (pass 2); NaN (unreached) cells are skipped.
// Inputs: cells [first, first + count) of a row of heights in um, cell i's centre at
// x = origin_mm + (i + 0.5) cell_mm (as Heightfield::x_mm); outputs: double sums added to the
// caller's. Cost O(count), SIMD lanes of 8 doubles.
// Method: ISO 25178-2:2012 §3.1.8 (plane sums), §4.1 (moments); lane-wise summation in a fixed
// order (Higham, Accuracy and Stability of Numerical Algorithms, 2nd ed., §4.6), so the sums do
// not depend on the thread count or the CPU the kernels run on.
#pragma once

#include <limits>

#include "texture/areal_moments.h"

namespace cuspmap {

/// The cells' X positions along a row: x(i) = origin_mm + (i + 0.5) cell_mm - centre_mm, the same
/// arithmetic as Heightfield::x_mm(i) - centre_mm.
struct RowAxis {
  double origin_mm = 0.0;  ///< X of the grid's lower-left corner
  double cell_mm = 1.0;    ///< cell size
  double centre_mm = 0.0;  ///< the plane's centre X the positions are taken about
};

/// Fills x_mm[0 .. count) with the positions of cells 0 .. count - 1 (once per band: the kernels
/// read them instead of recomputing them per cell).
void positions_about(const RowAxis& axis, int count, double* x_mm);

/// Sums of 1, x, x^2 over a run of cells, all finite (a row's common case, computed once).
struct AxisSums {
  double n = 0.0;    ///< cells
  double sx = 0.0;   ///< sum x, mm
  double sxx = 0.0;  ///< sum x^2, mm^2
};

/// The AxisSums of positions x_mm[0 .. count).
AxisSums axis_sums(const double* x_mm, int count);

/// Plane-fit sums and raw extremes of a run of cells (x about the plane's centre, mm; z um).
struct RowPlaneSums {
  double n = 0.0;                                        ///< finite cells
  double sx = 0.0;                                       ///< sum x
  double sxx = 0.0;                                      ///< sum x^2
  double sz = 0.0;                                       ///< sum z
  double sxz = 0.0;                                      ///< sum x z
  double lo = std::numeric_limits<double>::infinity();   ///< lowest finite z
  double hi = -std::numeric_limits<double>::infinity();  ///< highest finite z
};

/// Adds the plane sums and extremes of z[0 .. count) to `sums` (NaN cells skipped).
/// @param[in] z           heights, um (NaN = unreached)
/// @param[in] x_mm        the cells' positions about the plane's centre (positions_about)
/// @param[in] count       cells
/// @param[in] all_finite  axis_sums(x_mm, count): used when no cell of the run is NaN
/// @param[in,out] sums    accumulated
void row_plane_sums(const float* z, const double* x_mm, int count, const AxisSums& all_finite,
                    RowPlaneSums& sums);

/// Adds each block of k consecutive cells of z[0 .. count) to its running sum, cell by cell in
/// order (the same additions as a sequential loop, so the result is bit-identical to one);
/// non-finite cells are skipped. The last block may be partial.
/// @param[in] z        heights, um
/// @param[in] count    cells (blocks = ceil(count / k))
/// @param[in] k        cells per block, >= 1
/// @param[in,out] sums  per block: running sum of finite heights
/// @param[in,out] counts  per block: running count of finite heights
void row_block_sums(const float* z, int count, int k, double* sums, int* counts);

/// Adds the residuals r = float(z - (plane_x_um[i] + y_part_um)) of the finite cells of a row to
/// `moments` (|r|, r .. r^4, extremes). With plane_x_um[i] = z0 + gx (x_i - x0) and
/// y_part_um = gy (y - y0) this is Plane::at's arithmetic, rounded to float as remove_plane
/// rounds it, so each residual equals remove_plane's bit for bit.
/// @param[in] z           the row's heights, um
/// @param[in] plane_x_um  the plane's height less its Y term at each cell, um
/// @param[in] count       cells
/// @param[in] y_part_um   the plane's Y term on this row, um
/// @param[in,out] moments  accumulated
void row_residual_moments(const float* z, const double* plane_x_um, int count, double y_part_um,
                          ArealMoments& moments);

}  // namespace cuspmap

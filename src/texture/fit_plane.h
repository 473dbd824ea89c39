// Least-squares mean plane of a heightfield (the F-operator of ISO 25178-2 for a nominally flat
// floor) and its removal. Inputs: Heightfield (um over mm cells), NaN cells skipped.
// Cost O(cells), streamable over tiles through PlaneSums::merge.
// Method: ordinary least squares, normal equations in centred coordinates (ISO 25178-2:2012
// §3.1.8).
#pragma once

#include <vector>

#include "core/heightfield.h"

namespace cuspmap {

/// A plane z = z0 + gx (x - x0) + gy (y - y0), heights in um, positions in mm.
struct Plane {
  double x0_mm = 0.0;         ///< centre X the slopes are taken about
  double y0_mm = 0.0;         ///< centre Y
  double z0_um = 0.0;         ///< height at (x0, y0)
  double gx_um_per_mm = 0.0;  ///< slope along X
  double gy_um_per_mm = 0.0;  ///< slope along Y
  /// Height of the plane at (x, y) mm, um.
  double at(double x_mm, double y_mm) const {
    return z0_um + gx_um_per_mm * (x_mm - x0_mm) + gy_um_per_mm * (y_mm - y0_mm);
  }
};

/// Sums for the normal equations of a plane fit, taken about a fixed centre so that tiles of one
/// field can be summed separately and merged.
struct PlaneSums {
  double x0_mm = 0.0, y0_mm = 0.0;  ///< centre the coordinates are taken about
  double n = 0.0, sx = 0.0, sy = 0.0, sxx = 0.0, sxy = 0.0, syy = 0.0;  ///< sums of 1, x, y, ...
  double sz = 0.0, sxz = 0.0, syz = 0.0;  ///< sums of z, xz, yz (x, y relative to the centre)
  /// Adds one row's sums at y_mm: count, sums of x, x^2, z and x z over its finite cells (x
  /// relative to the centre); y enters once (sum y = y n, sum x y = y sum x, ...).
  void add_row(double y_mm, double count, double sum_x, double sum_xx, double sum_z,
               double sum_xz);
  /// Adds another accumulator's sums (same centre asserted).
  void merge(const PlaneSums& other);
  /// Solves for the plane. With fewer than 3 non-collinear points the least-norm solution is
  /// returned (a line or the mean height). @return Plane about (x0, y0); all zero when n = 0.
  Plane solve() const;
};

/// Least-squares plane through the finite cells of `hf`.
/// @param[in] hf  heightfield; may contain NaN cells
/// @return the plane (z0 = mean height when the field is a single point or a line)
Plane fit_plane(const Heightfield& hf);

/// Rows of `hf` less `plane`, NaN cells staying NaN: the arithmetic of remove_plane, for
/// callers that make residual rows as they go instead of holding a whole residual. The plane's
/// X term is taken once per column (z0 + gx (x - x0), then + gy (y - y0) per row: Plane::at's
/// operations in its order, so the same floats as evaluating Plane::at per cell).
class ResidualRows {
 public:
  /// Keeps references to `hf` (which must outlive this) and a copy of `plane`.
  ResidualRows(const Heightfield& hf, const Plane& plane);
  /// Row j's residual into out[0, hf.nx). Thread-safe (reads only).
  void row(int j, float* out) const;

 private:
  const Heightfield& hf_;
  Plane plane_;
  std::vector<double> x_term_um_;  ///< z0 + gx (x_i - x0) per column
};

/// Residual heights after subtracting `plane` from every finite cell; NaN cells stay NaN.
/// @param[in] hf     heightfield
/// @param[in] plane  plane to subtract (um)
/// @return a heightfield with the same grid
Heightfield remove_plane(const Heightfield& hf, const Plane& plane);

}  // namespace cuspmap

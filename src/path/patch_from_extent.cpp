// Patch from the XY extent of the feed moves that run on the floor (see patch_from_extent.h).
// Inputs mm; output Patch (mm). Cost O(moves).
// Method: bounding boxes of lines and arcs; Z linear in the move parameter (lines, helices).
#include "path/patch_from_extent.h"

#include <algorithm>
#include <cassert>
#include <limits>

#include "core/input_error.h"
#include "core/units.h"
#include "path/move_bounds.h"

namespace cuspmap {

Patch patch_from_extent(const Toolpath& path, double cell_mm, double floor_z_mm,
                        double radius_mm) {
  assert(cell_mm > 0.0 && radius_mm > 0.0 && "validated cell and cutter");
  const double z_limit = floor_z_mm + kFloorContactBandMm;
  constexpr double kInf = std::numeric_limits<double>::infinity();
  Eigen::Vector2d lo(kInf, kInf), hi(-kInf, -kInf);
  for (const Move& m : path.moves) {
    if (m.rapid) continue;
    const double z0 = m.start_mm.z(), z1 = m.end_mm.z();
    // Parameter interval [t0, t1] where z(t) = z0 + t (z1 - z0) <= z_limit.
    double t0 = 0.0, t1 = 1.0;
    if (z0 > z_limit && z1 > z_limit) continue;
    if (z0 > z_limit) t0 = (z0 - z_limit) / (z0 - z1);
    if (z1 > z_limit) t1 = (z_limit - z0) / (z1 - z0);
    const BoxXY box = move_bounds_xy(m, t0, t1);
    lo = lo.cwiseMin(box.lo_mm);
    hi = hi.cwiseMax(box.hi_mm);
  }
  if (!(lo.x() <= hi.x())) {
    throw InputError("no feed move of the program reaches the floor Z=" +
                     format_number(floor_z_mm) + " mm (within " +
                     format_number(kFloorContactBandMm) +
                     " mm): give [patch] size and origin, or check patch.floor_z");
  }
  Patch patch;
  patch.cell_mm = cell_mm;
  patch.floor_z_mm = floor_z_mm;
  for (int axis = 0; axis < 2; ++axis) {
    double a = lo[axis], b = hi[axis];
    if (b - a < cell_mm) {  // a single straight pass: the cutter's whole cut across it
      a -= radius_mm;
      b += radius_mm;
    }
    (axis == 0 ? patch.origin_x_mm : patch.origin_y_mm) = a;
    (axis == 0 ? patch.size_x_mm : patch.size_y_mm) = b - a;
  }
  return patch;
}

}  // namespace cuspmap

// Whether a move's cutter comes within its reach of the floor over the patch (see floor_reach.h).
// Inputs mm; output bool. Cost O(1) per move.
// Method: unimodal p(r) (DESIGN.md "Geometry"); Liang & Barsky (1984) parametric line clipping.
#include "path/floor_reach.h"

#include "core/clip_segment.h"

#include <algorithm>
#include <cmath>
#include <numbers>

#include "path/move_bounds.h"

namespace cuspmap {

double cutter_reach_mm(const Cutter& cutter) {
  const double r = cutter.radius_mm();
  const double tilt = std::abs(cutter.tilt_deg) * std::numbers::pi / 180.0;
  return std::max(profile_height_mm(cutter, 0.0), profile_height_mm(cutter, r)) +
         r * std::tan(tilt);
}

bool move_reaches_floor(const Move& move, const Patch& patch, const Cutter& cutter) {
  const double grow = cutter.radius_mm() + cutter.runout_mm;
  const double x_lo = patch.origin_x_mm - grow, x_hi = patch.origin_x_mm + patch.size_x_mm + grow;
  const double y_lo = patch.origin_y_mm - grow, y_hi = patch.origin_y_mm + patch.size_y_mm + grow;
  const double z_limit = patch.floor_z_mm + cutter_reach_mm(cutter);
  if (move.kind == MoveKind::Arc) {
    const BoxXY box = move_bounds_xy(move);
    const bool over = box.hi_mm.x() >= x_lo && box.lo_mm.x() <= x_hi && box.hi_mm.y() >= y_lo &&
                      box.lo_mm.y() <= y_hi;
    return over && std::min(move.start_mm.z(), move.end_mm.z()) < z_limit;
  }
  // The parameter interval [t0, t1] where the segment lies in the grown box.
  const Eigen::Vector3d d = move.end_mm - move.start_mm;
  double t0 = 0.0, t1 = 1.0;
  if (!clip_segment(move.start_mm.x(), move.start_mm.y(), move.end_mm.x(), move.end_mm.y(), x_lo,
                    x_hi, y_lo, y_hi, t0, t1)) {
    return false;
  }
  const double z0 = move.start_mm.z() + t0 * d.z(), z1 = move.start_mm.z() + t1 * d.z();
  return std::min(z0, z1) < z_limit;
}

}  // namespace cuspmap

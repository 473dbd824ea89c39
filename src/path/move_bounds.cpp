// XY bounding box of a move or part of it (see move_bounds.h). Cost O(1) per move.
// Inputs mm; output mm.
// Method: circle geometry: extremes of an arc are at its ends or at the quadrant angles.
#include "path/move_bounds.h"

#include <cassert>
#include <cmath>
#include <numbers>

namespace cuspmap {

BoxXY move_bounds_xy(const Move& move, double t0, double t1) {
  assert(t0 <= t1 && "parameters in order");
  const Eigen::Vector2d a = move_point_mm(move, t0).head<2>();
  const Eigen::Vector2d b = move_point_mm(move, t1).head<2>();
  BoxXY box{a.cwiseMin(b), a.cwiseMax(b)};
  if (move.kind == MoveKind::Line) return box;
  const Eigen::Vector2d rel = move.start_mm.head<2>() - move.centre_mm;
  const double r = rel.norm();
  const double start_angle = std::atan2(rel.y(), rel.x());
  const double sweep = arc_sweep_rad(move);
  const double half_pi = 0.5 * std::numbers::pi;
  // Angles swept for t in [t0, t1], as an increasing interval [lo, hi].
  const double a0 = start_angle + t0 * sweep, a1 = start_angle + t1 * sweep;
  const double lo = std::min(a0, a1), hi = std::max(a0, a1);
  // At most four quadrant points matter: a fifth repeats the first a turn later.
  double q = std::ceil(lo / half_pi);
  for (int k = 0; k < 4 && q * half_pi <= hi; ++k, q += 1.0) {
    const double angle = q * half_pi;
    const Eigen::Vector2d p = move.centre_mm + r * Eigen::Vector2d(std::cos(angle), std::sin(angle));
    box.lo_mm = box.lo_mm.cwiseMin(p);
    box.hi_mm = box.hi_mm.cwiseMax(p);
  }
  return box;
}

}  // namespace cuspmap

// Arc angle, lengths, points and cycle time of lines and arcs (helices).
// Inputs: Move/Toolpath (mm, mm/min); outputs mm, rad, s.
// Method: circle and helix geometry; arc angle convention of RS274NGC v3 (Kramer et al. 2000).
#include "path/move.h"

#include <cassert>
#include <cmath>
#include <numbers>

namespace cuspmap {
namespace {

constexpr double kTwoPi = 2.0 * std::numbers::pi;

}  // namespace

double arc_radius_mm(const Move& arc) {
  return (arc.start_mm.head<2>() - arc.centre_mm).norm();
}

double arc_sweep_rad(const Move& arc) {
  const Eigen::Vector2d a = arc.start_mm.head<2>() - arc.centre_mm;
  const Eigen::Vector2d b = arc.end_mm.head<2>() - arc.centre_mm;
  double sweep = std::atan2(a.x() * b.y() - a.y() * b.x(), a.dot(b));  // (-pi, pi]
  if (arc.ccw) {
    if (sweep <= 0.0) sweep += kTwoPi;
  } else {
    if (sweep >= 0.0) sweep -= kTwoPi;
  }
  // Coincident ends give atan2 = 0, which the lines above turn into a full circle.
  return sweep + (arc.ccw ? kTwoPi : -kTwoPi) * arc.extra_turns;
}

double move_length_mm(const Move& move) {
  if (move.kind == MoveKind::Line) return (move.end_mm - move.start_mm).norm();
  const double planar = std::abs(arc_sweep_rad(move)) * arc_radius_mm(move);
  const double dz = move.end_mm.z() - move.start_mm.z();
  return std::hypot(planar, dz);
}

Eigen::Vector3d move_point_mm(const Move& move, double t) {
  if (move.kind == MoveKind::Line) return move.start_mm + t * (move.end_mm - move.start_mm);
  const Eigen::Vector2d a = move.start_mm.head<2>() - move.centre_mm;
  const double angle = std::atan2(a.y(), a.x()) + t * arc_sweep_rad(move);
  const double r = a.norm();
  return {move.centre_mm.x() + r * std::cos(angle), move.centre_mm.y() + r * std::sin(angle),
          move.start_mm.z() + t * (move.end_mm.z() - move.start_mm.z())};
}

double path_length_mm(const Toolpath& path, bool include_rapids) {
  double total = 0.0;
  for (const Move& m : path.moves) {
    if (m.rapid && !include_rapids) continue;
    total += move_length_mm(m);
  }
  return total;
}

double cycle_time_s(const Toolpath& path) {
  double total = 0.0;
  for (const Move& m : path.moves) {
    assert(m.feed_mm_per_min > 0.0 && "every move carries its feed or rapid rate");
    total += move_length_mm(m) / m.feed_mm_per_min * 60.0;
  }
  return total;
}

}  // namespace cuspmap

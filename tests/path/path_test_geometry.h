// Test helpers for toolpath geometry: XY distance from a point to the cutting moves of a path
// (lines and arcs), tangent directions at move ends, a default patch and cutter, and the
// message of an expected InputError.
// Method: point-to-segment and point-to-arc distance (plane geometry).
#pragma once

#include <Eigen/Core>
#include <algorithm>
#include <cmath>
#include <limits>
#include <numbers>
#include <string>

#include "core/heightfield.h"
#include "core/input_error.h"
#include "path/move.h"
#include "path/path_spec.h"
#include "tool/cutter.h"

namespace cuspmap::test {

/// Distance in XY from q to the segment ab.
inline double distance_to_segment(const Eigen::Vector2d& q, const Eigen::Vector2d& a,
                                  const Eigen::Vector2d& b) {
  const Eigen::Vector2d ab = b - a;
  const double len2 = ab.squaredNorm();
  const double t = len2 > 0.0 ? std::clamp((q - a).dot(ab) / len2, 0.0, 1.0) : 0.0;
  return (a + t * ab - q).norm();
}

/// Distance in XY from q to the arc of a move: to the circle where q's direction from the
/// centre falls inside the swept angle, else to the nearer end.
inline double distance_to_arc(const Eigen::Vector2d& q, const Move& m) {
  const Eigen::Vector2d c = m.centre_mm;
  const double r = arc_radius_mm(m);
  const double sweep = arc_sweep_rad(m);
  const double ends = std::min((q - m.start_mm.head<2>()).norm(), (q - m.end_mm.head<2>()).norm());
  if (std::abs(sweep) >= 2.0 * std::numbers::pi) return std::abs((q - c).norm() - r);
  const Eigen::Vector2d a = m.start_mm.head<2>() - c, p = q - c;
  double phi = std::atan2(a.x() * p.y() - a.y() * p.x(), a.dot(p));  // (-pi, pi]
  if (sweep > 0.0 && phi < 0.0) phi += 2.0 * std::numbers::pi;
  if (sweep < 0.0 && phi > 0.0) phi -= 2.0 * std::numbers::pi;
  if (std::abs(phi) <= std::abs(sweep)) return std::min(ends, std::abs(p.norm() - r));
  return ends;
}

/// Distance in XY from q to the nearest feed move whose tip runs at cut_z (within 1 nm).
inline double distance_to_cuts(const Eigen::Vector2d& q, const Toolpath& path, double cut_z) {
  double best = std::numeric_limits<double>::infinity();
  for (const Move& m : path.moves) {
    if (m.rapid || std::abs(m.start_mm.z() - cut_z) > 1e-6 || std::abs(m.end_mm.z() - cut_z) > 1e-6) {
      continue;
    }
    const double d = m.kind == MoveKind::Line
                         ? distance_to_segment(q, m.start_mm.head<2>(), m.end_mm.head<2>())
                         : distance_to_arc(q, m);
    best = std::min(best, d);
  }
  return best;
}

/// Unit tangent of a move's XY path at its start (t = 0) or end (t = 1).
inline Eigen::Vector2d tangent_xy(const Move& m, bool at_end) {
  if (m.kind == MoveKind::Line) return (m.end_mm - m.start_mm).head<2>().normalized();
  const Eigen::Vector2d p = (at_end ? m.end_mm : m.start_mm).head<2>() - m.centre_mm;
  const Eigen::Vector2d t = m.ccw ? Eigen::Vector2d(-p.y(), p.x()) : Eigen::Vector2d(p.y(), -p.x());
  return t.normalized();
}

/// The message of the InputError that f() throws, or "(no error)".
template <class F>
std::string input_error_of(F f) {
  try {
    f();
  } catch (const InputError& e) {
    return e.what();
  }
  return "(no error)";
}

/// A 10 x 10 mm patch at the origin, floor at Z 0, 0.05 mm cells.
inline Patch test_patch() {
  Patch p;
  p.size_x_mm = 10.0;
  p.size_y_mm = 10.0;
  p.cell_mm = 0.05;
  return p;
}

/// A 6 mm ball end mill.
inline Cutter test_ball() {
  Cutter c;
  c.shape = CutterShape::Ball;
  c.diameter_mm = 6.0;
  return c;
}

}  // namespace cuspmap::test

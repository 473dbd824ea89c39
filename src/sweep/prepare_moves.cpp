// Prepares moves for the sweep: local frame, time, spindle phase, boxes; drops moves that cannot
// reach the patch. Inputs: Toolpath (program mm), CutSpec, Patch; output: PreparedMove list.
// Method: constant-feed timing (NIST RS274NGC v3); box and height tests against the cutter reach.
#include "sweep/prepare_moves.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <numbers>

namespace cuspmap {
namespace {

constexpr double kTwoPi = 2.0 * std::numbers::pi;
// XY travel below this (mm) is a vertical move: far below a cell, far above rounding of mm.
constexpr double kVerticalMm = 1e-9;

double point_box_distance(const Eigen::Vector2d& p, double x_lo, double x_hi, double y_lo,
                          double y_hi) {
  const double dx = std::max({x_lo - p.x(), 0.0, p.x() - x_hi});
  const double dy = std::max({y_lo - p.y(), 0.0, p.y() - y_hi});
  return std::sqrt(dx * dx + dy * dy);  // mm-sized values: hypot's overflow guard not needed
}

double point_segment_distance(const Eigen::Vector2d& p, const Eigen::Vector2d& a,
                              const Eigen::Vector2d& b) {
  const Eigen::Vector2d ab = b - a;
  const double len2 = ab.squaredNorm();
  const double t = len2 > 0.0 ? std::clamp((p - a).dot(ab) / len2, 0.0, 1.0) : 0.0;
  return (p - (a + t * ab)).norm();
}

// Liang-Barsky: does the segment a-b meet the box?
bool segment_meets_box(const Eigen::Vector2d& a, const Eigen::Vector2d& b, double x_lo, double x_hi,
                       double y_lo, double y_hi) {
  double t0 = 0.0, t1 = 1.0;
  const double d[2] = {b.x() - a.x(), b.y() - a.y()};
  const double lo[2] = {x_lo - a.x(), y_lo - a.y()};
  const double hi[2] = {x_hi - a.x(), y_hi - a.y()};
  for (int k = 0; k < 2; ++k) {
    if (d[k] == 0.0) {
      if (lo[k] > 0.0 || hi[k] < 0.0) return false;
      continue;
    }
    double ta = lo[k] / d[k], tb = hi[k] / d[k];
    if (ta > tb) std::swap(ta, tb);
    t0 = std::max(t0, ta);
    t1 = std::min(t1, tb);
    if (t0 > t1) return false;
  }
  return true;
}

}  // namespace

Eigen::Vector2d PreparedMove::point_at(double t) const {
  if (kind == MoveKind::Line) return a_mm + t * (b_mm - a_mm);
  const double angle = start_angle_rad + t * sweep_rad;
  return centre_mm + arc_radius_mm * Eigen::Vector2d(std::cos(angle), std::sin(angle));
}

double PreparedMove::distance_to_box(double x_lo, double x_hi, double y_lo, double y_hi) const {
  if (kind == MoveKind::Arc) {
    const double dx = std::max({x_lo - x_max_mm, 0.0, x_min_mm - x_hi});
    const double dy = std::max({y_lo - y_max_mm, 0.0, y_min_mm - y_hi});
    return std::sqrt(dx * dx + dy * dy);
  }
  // Box corners in the move's frame: when all lie beside the segment (0 <= u <= L), the nearest
  // point is straight across, so the distance is that of the w range from 0 (exact, no search).
  double u_lo = std::numeric_limits<double>::infinity(), u_hi = -u_lo, w_lo = u_lo, w_hi = -u_lo;
  for (const double cx : {x_lo, x_hi}) {
    for (const double cy : {y_lo, y_hi}) {
      const Eigen::Vector2d rel(cx - a_mm.x(), cy - a_mm.y());
      const double u = rel.dot(dir), w = rel.dot(perp);
      u_lo = std::min(u_lo, u);
      u_hi = std::max(u_hi, u);
      w_lo = std::min(w_lo, w);
      w_hi = std::max(w_hi, w);
    }
  }
  if (length_xy_mm > 0.0 && u_lo >= 0.0 && u_hi <= length_xy_mm) {
    return w_lo > 0.0 ? w_lo : (w_hi < 0.0 ? -w_hi : 0.0);
  }
  if (segment_meets_box(a_mm, b_mm, x_lo, x_hi, y_lo, y_hi)) return 0.0;
  double d = std::min(point_box_distance(a_mm, x_lo, x_hi, y_lo, y_hi),
                      point_box_distance(b_mm, x_lo, x_hi, y_lo, y_hi));
  for (const Eigen::Vector2d& c : {Eigen::Vector2d(x_lo, y_lo), Eigen::Vector2d(x_hi, y_lo),
                                   Eigen::Vector2d(x_lo, y_hi), Eigen::Vector2d(x_hi, y_hi)}) {
    d = std::min(d, point_segment_distance(c, a_mm, b_mm));
  }
  return d;
}

std::vector<PreparedMove> prepare_moves(const Toolpath& path, const CutSpec& cut,
                                        const Patch& patch, double reach_mm, double top_mm,
                                        PreparedCounts& counts) {
  std::int64_t nx = 0, ny = 0;
  grid_dimensions(patch, nx, ny);
  const double grid_x = static_cast<double>(nx) * patch.cell_mm;
  const double grid_y = static_cast<double>(ny) * patch.cell_mm;
  const Eigen::Vector2d origin(patch.origin_x_mm, patch.origin_y_mm);
  const double revs_per_s = cut.rpm / 60.0;
  const double spin_sign = cut.spindle == SpindleDirection::Cw ? -1.0 : 1.0;

  std::vector<PreparedMove> out;
  double clock_s = 0.0;
  for (std::size_t i = 0; i < path.moves.size(); ++i) {
    const Move& m = path.moves[i];
    const double length = move_length_mm(m);
    if (!(length > 0.0) || !(m.feed_mm_per_min > 0.0)) {
      ++counts.skipped;  // nothing moves, nothing new is cut
      continue;
    }
    PreparedMove pm;
    pm.index = static_cast<int>(i);
    pm.t_start_s = clock_s;
    pm.duration_s = length / m.feed_mm_per_min * 60.0;
    clock_s += pm.duration_s;
    // Spindle angle of tooth 0 at the start: whole turns dropped before scaling to radians.
    const double turns = revs_per_s * pm.t_start_s;
    double phase = spin_sign * kTwoPi * (turns - std::floor(turns));
    if (phase < 0.0) phase += kTwoPi;
    pm.spindle_phase_rad = phase >= kTwoPi ? 0.0 : phase;

    pm.a_mm = m.start_mm.head<2>() - origin;
    pm.b_mm = m.end_mm.head<2>() - origin;
    pm.z0_mm = m.start_mm.z() - patch.floor_z_mm;
    pm.z1_mm = m.end_mm.z() - patch.floor_z_mm;
    pm.z_min_mm = std::min(pm.z0_mm, pm.z1_mm);
    const bool degenerate_arc = m.kind == MoveKind::Arc && arc_radius_mm(m) <= kVerticalMm;
    if (m.kind == MoveKind::Line || degenerate_arc) {
      pm.kind = MoveKind::Line;
      if (degenerate_arc) pm.a_mm = pm.b_mm = m.centre_mm - origin;
      const Eigen::Vector2d ab = pm.b_mm - pm.a_mm;
      pm.length_xy_mm = ab.norm();
      if (pm.length_xy_mm <= kVerticalMm) {
        pm.length_xy_mm = 0.0;
        pm.b_mm = pm.a_mm;
      } else {
        pm.dir = ab / pm.length_xy_mm;
        pm.perp = Eigen::Vector2d(-pm.dir.y(), pm.dir.x());
      }
      pm.x_min_mm = std::min(pm.a_mm.x(), pm.b_mm.x());
      pm.x_max_mm = std::max(pm.a_mm.x(), pm.b_mm.x());
      pm.y_min_mm = std::min(pm.a_mm.y(), pm.b_mm.y());
      pm.y_max_mm = std::max(pm.a_mm.y(), pm.b_mm.y());
    } else {
      pm.kind = MoveKind::Arc;
      pm.centre_mm = m.centre_mm - origin;
      pm.arc_radius_mm = arc_radius_mm(m);
      const Eigen::Vector2d rel = pm.a_mm - pm.centre_mm;
      pm.start_angle_rad = std::atan2(rel.y(), rel.x());
      pm.sweep_rad = arc_sweep_rad(m);
      pm.length_xy_mm = std::abs(pm.sweep_rad) * pm.arc_radius_mm;
      // Box: the end points plus every axis-extreme angle the arc passes
      pm.x_min_mm = std::min(pm.a_mm.x(), pm.b_mm.x());
      pm.x_max_mm = std::max(pm.a_mm.x(), pm.b_mm.x());
      pm.y_min_mm = std::min(pm.a_mm.y(), pm.b_mm.y());
      pm.y_max_mm = std::max(pm.a_mm.y(), pm.b_mm.y());
      // (a sweep of a full turn or more passes all four).
      const double quarter = 0.5 * std::numbers::pi;
      const double lo = std::min(pm.start_angle_rad, pm.start_angle_rad + pm.sweep_rad);
      const double hi = std::max(pm.start_angle_rad, pm.start_angle_rad + pm.sweep_rad);
      const int q_lo = static_cast<int>(std::ceil(lo / quarter));
      const int q_hi = std::min(static_cast<int>(std::floor(hi / quarter)), q_lo + 3);
      for (int q = q_lo; q <= q_hi; ++q) {
        const Eigen::Vector2d p =
            pm.centre_mm +
            pm.arc_radius_mm * Eigen::Vector2d(std::cos(q * quarter), std::sin(q * quarter));
        pm.x_min_mm = std::min(pm.x_min_mm, p.x());
        pm.x_max_mm = std::max(pm.x_max_mm, p.x());
        pm.y_min_mm = std::min(pm.y_min_mm, p.y());
        pm.y_max_mm = std::max(pm.y_max_mm, p.y());
      }
    }
    const bool outside = pm.x_max_mm + reach_mm < 0.0 || pm.x_min_mm - reach_mm > grid_x ||
                         pm.y_max_mm + reach_mm < 0.0 || pm.y_min_mm - reach_mm > grid_y;
    if (outside || pm.z_min_mm > top_mm) {
      ++counts.skipped;
      continue;
    }
    ++counts.swept;
    out.push_back(pm);
  }
  return out;
}

}  // namespace cuspmap

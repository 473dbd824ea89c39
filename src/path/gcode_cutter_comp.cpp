// Cutter radius compensation G41/G42/G40 of the RS-274 reader (see gcode_cutter_comp.h): offset
// lines and arcs, the entry move, corner arcs at outside corners, intersections at inside
// corners. Inputs and outputs mm. Cost O(1) per move.
// Method: RS274NGC v3 (Kramer, Proctor & Messina 2000) §3.5.10 and its compensation chapter;
// line/circle intersections of plane geometry for inside corners (derived).
#include "path/gcode_cutter_comp.h"

#include <algorithm>
#include <array>
#include <cmath>
#include <numbers>

#include "core/units.h"
#include "path/gcode_lexer.h"

namespace cuspmap {
namespace {

constexpr double kTwoPi = 2.0 * std::numbers::pi;

double cross2(const Eigen::Vector2d& a, const Eigen::Vector2d& b) {
  return a.x() * b.y() - a.y() * b.x();
}
Eigen::Vector2d left_of(const Eigen::Vector2d& t) { return {-t.y(), t.x()}; }
// Unit normal towards the tool's side of a path running along t.
Eigen::Vector2d side_normal(const Eigen::Vector2d& t, CompSide side) {
  return side == CompSide::Left ? left_of(t) : Eigen::Vector2d(-left_of(t));
}
// Unit tangent of a circle traversed ccw or cw at the point whose radial unit vector is u.
Eigen::Vector2d arc_tangent(const Eigen::Vector2d& u, bool ccw) {
  return ccw ? left_of(u) : Eigen::Vector2d(-left_of(u));
}
double angle_of(const Eigen::Vector2d& v) { return std::atan2(v.y(), v.x()); }
double wrap_2pi(double a) {
  a = std::fmod(a, kTwoPi);
  return a < 0.0 ? a + kTwoPi : a;
}
// Tool radius offset of an arc: the tool runs inside (-1) when it is on the left of a ccw arc or
// on the right of a cw one, outside (+1) otherwise.
double arc_side_sign(CompSide side, bool ccw) { return (side == CompSide::Left) == ccw ? -1.0 : 1.0; }
std::string xy_text(const Eigen::Vector2d& p) {
  std::string out = "X";  // appended, not "X" + string: GCC 12's -Wrestrict false positive
  out += format_number(p.x());
  out += " Y";
  out += format_number(p.y());
  return out;
}

double dir_of(const CompElement& el) { return el.proto.ccw ? 1.0 : -1.0; }

Eigen::Vector2d point_at(const CompElement& el, double u) {
  if (u <= 0.0) return el.s;
  if (u >= el.total) return el.e;
  if (!el.arc) return el.s + (el.e - el.s) * (u / el.total);
  const double a = angle_of(el.s - el.c) + dir_of(el) * u;
  return el.c + el.rho * Eigen::Vector2d(std::cos(a), std::sin(a));
}
double z_at(const CompElement& el, double u) { return el.z0 + (el.z1 - el.z0) * (u / el.total); }
// Tolerance on u equivalent to kCompPointToleranceMm along the element.
double u_tolerance(const CompElement& el) {
  return el.arc ? kCompPointToleranceMm / el.rho : kCompPointToleranceMm;
}

// Parameter of a point q on the element's line or circle: counted from the end backwards within
// the last turn (from_end), or from the start forwards within the first turn.
double param_of(const CompElement& el, const Eigen::Vector2d& q, bool from_end) {
  if (!el.arc) return (q - el.s).dot((el.e - el.s) / el.total);
  const double tol = u_tolerance(el);
  double d = from_end ? wrap_2pi(dir_of(el) * (angle_of(el.e - el.c) - angle_of(q - el.c)))
                      : wrap_2pi(dir_of(el) * (angle_of(q - el.c) - angle_of(el.s - el.c)));
  if (d > kTwoPi - tol) d -= kTwoPi;  // just past the point: a tiny negative distance
  return from_end ? el.total - d : d;
}

// Points where the lines/circles of two elements meet (0, 1 or 2).
int meet(const CompElement& a, const CompElement& b, std::array<Eigen::Vector2d, 2>& q) {
  constexpr double kTol = kCompPointToleranceMm;
  if (!a.arc && !b.arc) {
    const Eigen::Vector2d da = (a.e - a.s) / a.total, db = (b.e - b.s) / b.total;
    const double det = cross2(da, db);
    if (std::abs(det) < 1e-15) return 0;
    q[0] = a.s + da * (cross2(b.s - a.s, db) / det);
    return 1;
  }
  if (a.arc && b.arc) {
    const Eigen::Vector2d d = b.c - a.c;
    const double dist = d.norm();
    if (dist < kTol) return 0;  // concentric circles meet nowhere (or everywhere)
    const double along = (a.rho * a.rho - b.rho * b.rho + dist * dist) / (2.0 * dist);
    double h2 = a.rho * a.rho - along * along;
    if (h2 < 0.0) {
      if (h2 < -2.0 * a.rho * kTol) return 0;
      h2 = 0.0;  // touching within the tolerance
    }
    const Eigen::Vector2d mid = a.c + d * (along / dist), off = left_of(d / dist) * std::sqrt(h2);
    q[0] = mid + off;
    q[1] = mid - off;
    return 2;
  }
  const CompElement& l = a.arc ? b : a;
  const CompElement& c = a.arc ? a : b;
  const Eigen::Vector2d dl = (l.e - l.s) / l.total, f = l.s - c.c;
  const double half_b = f.dot(dl);
  double disc = half_b * half_b - (f.squaredNorm() - c.rho * c.rho);
  if (disc < 0.0) {
    if (disc < -2.0 * c.rho * kTol) return 0;
    disc = 0.0;
  }
  const double root = std::sqrt(disc);
  q[0] = l.s + dl * (-half_b - root);
  q[1] = l.s + dl * (-half_b + root);
  return 2;
}

}  // namespace

void GcodeCutterComp::fail(const CompElement& el, const std::string& why) const {
  throw_gcode_error(file_, el.proto.source_line, el.word, why);
}

void GcodeCutterComp::start(CompSide side, double radius_mm, const Eigen::Vector3d& tool_mm,
                            std::vector<Move>& out) {
  if (active_) {
    flush(out);
  } else {
    tool_mm_ = tool_mm;
  }
  active_ = true;
  entry_ = true;
  side_ = side;
  radius_mm_ = radius_mm;
}

void GcodeCutterComp::stop(std::vector<Move>& out) {
  flush(out);
  active_ = false;
}

void GcodeCutterComp::restart_at(const Eigen::Vector3d& tool_mm, std::vector<Move>& out) {
  flush(out);
  tool_mm_ = tool_mm;
  entry_ = true;
}

void GcodeCutterComp::flush(std::vector<Move>& out) {
  if (!held_) return;
  emit_element(*held_, out);
  held_.reset();
  for (const Move& z : held_z_) z_move(z, out);
  held_z_.clear();
}

void GcodeCutterComp::z_move(const Move& programmed, std::vector<Move>& out) {
  Move m = programmed;
  m.kind = MoveKind::Line;
  m.start_mm = tool_mm_;
  m.end_mm = {tool_mm_.x(), tool_mm_.y(), programmed.end_mm.z()};
  tool_mm_ = m.end_mm;
  if (m.end_mm != m.start_mm) out.push_back(m);
}

void GcodeCutterComp::emit_element(const CompElement& el, std::vector<Move>& out) {
  const Eigen::Vector2d a = point_at(el, el.u0), b = point_at(el, el.u1);
  Move m = el.proto;
  m.start_mm = {a.x(), a.y(), z_at(el, el.u0)};
  m.end_mm = {b.x(), b.y(), z_at(el, el.u1)};
  m.extra_turns = 0;
  const double span = el.u1 - el.u0;
  const double length = el.arc ? el.rho * span : span;
  tool_mm_ = m.end_mm;
  if (length <= kCompPointToleranceMm) {  // trimmed away at inside corners: a point
    if (m.end_mm.z() != m.start_mm.z()) {
      m.kind = MoveKind::Line;
      m.end_mm.head<2>() = m.start_mm.head<2>();
      tool_mm_ = m.end_mm;
      out.push_back(m);
    }
    return;
  }
  if (el.arc) {
    m.kind = MoveKind::Arc;
    m.centre_mm = el.c;
    // Whole turns: the ends coincide exactly, so arc_sweep_rad reads a full circle per turn.
    const double turns = std::round(span / kTwoPi);
    if (turns >= 1.0 && el.rho * std::abs(span - turns * kTwoPi) <= kCompPointToleranceMm) {
      m.end_mm.head<2>() = m.start_mm.head<2>();
      m.extra_turns = static_cast<int>(turns) - 1;
    } else {
      m.extra_turns = static_cast<int>(std::floor(span / kTwoPi));
    }
  } else {
    m.kind = MoveKind::Line;
  }
  tool_mm_ = m.end_mm;
  out.push_back(m);
}

CompElement GcodeCutterComp::offset_element(const Move& m, const std::string& word) const {
  CompElement el;
  el.proto = m;
  el.word = word;
  el.z0 = m.start_mm.z();
  el.z1 = m.end_mm.z();
  const Eigen::Vector2d a = m.start_mm.head<2>(), b = m.end_mm.head<2>();
  el.corner = b;
  const double r = radius_mm_;
  if (m.kind == MoveKind::Line) {
    el.total = (b - a).norm();
    el.t0 = el.t1 = (b - a) / el.total;
    const Eigen::Vector2d n = side_normal(el.t0, side_);
    el.s = a + r * n;
    el.e = b + r * n;
  } else {
    el.arc = true;
    el.c = m.centre_mm;
    const double radius = (a - el.c).norm();
    el.rho = radius + arc_side_sign(side_, m.ccw) * r;
    if (el.rho <= kCompPointToleranceMm) {
      fail(el, "the arc's radius " + format_number(radius) + " mm is not larger than the tool "
                   "radius " + format_number(r) + " mm on its inside: the tool cannot follow it; "
                   "use a smaller D or a larger arc");
    }
    const Eigen::Vector2d ua = (a - el.c) / radius;
    const double rb = (b - el.c).norm();
    const Eigen::Vector2d ub = rb > 0.0 ? Eigen::Vector2d((b - el.c) / rb) : ua;
    el.s = el.c + el.rho * ua;
    el.e = el.c + el.rho * ub;
    el.total = std::abs(arc_sweep_rad(m));
    el.t0 = arc_tangent(ua, m.ccw);
    el.t1 = arc_tangent(ub, m.ccw);
  }
  el.u1 = el.total;
  return el;
}

// RS274NGC v3 entry moves: a line runs from where the tool stands along the tangent to the
// circle of the tool radius about the programmed end point, ending on the tool's side of it; an
// arc keeps the programmed centre and must start one tool radius from the programmed circle.
CompElement GcodeCutterComp::entry_element(const Move& m, const std::string& word,
                                           double arc_tolerance_mm) const {
  CompElement el;
  el.proto = m;
  el.word = word;
  el.z0 = tool_mm_.z();
  el.z1 = m.end_mm.z();
  const Eigen::Vector2d tool = tool_mm_.head<2>(), p = m.end_mm.head<2>();
  const double r = radius_mm_;
  const std::string g = side_ == CompSide::Left ? "G41" : "G42";
  el.corner = p;
  if (m.kind == MoveKind::Line) {
    const double d = (p - tool).norm();
    // d > r + tolerance keeps acos defined and the entry longer than sqrt(2 r tolerance) > 0.
    if (!(d > r + kCompPointToleranceMm)) {
      fail(el, "the first move after " + g + " ends " + format_number(d) + " mm from where the "
                   "tool stands, within the tool radius " + format_number(r) + " mm: the tool "
                   "cannot reach its offset; make the entry move longer than the tool radius");
    }
    const double theta = std::acos(r / d);
    const double alpha = angle_of(tool - p) + (side_ == CompSide::Left ? -theta : theta);
    el.s = tool;
    el.e = p + r * Eigen::Vector2d(std::cos(alpha), std::sin(alpha));
    el.total = std::max((el.e - el.s).norm(), kCompPointToleranceMm);
    el.t0 = el.t1 = (el.e - el.s).normalized();
  } else {
    el.arc = true;
    el.c = m.centre_mm;
    const double programmed = (p - el.c).norm();
    const double expected = programmed + arc_side_sign(side_, m.ccw) * r;
    el.rho = (tool - el.c).norm();
    if (expected <= kCompPointToleranceMm) {
      fail(el, "the arc's radius " + format_number(programmed) + " mm is not larger than the "
                   "tool radius " + format_number(r) + " mm on its inside: the tool cannot follow "
                   "it; use a smaller D or a larger arc");
    }
    if (!(std::abs(el.rho - expected) <= arc_tolerance_mm) ||
        el.rho <= kCompPointToleranceMm || programmed <= kCompPointToleranceMm) {
      fail(el, "the first move after " + g + " is an arc whose start lies " +
                   format_number(el.rho) + " mm from its centre; entering on the arc needs " +
                   format_number(expected) + " mm (the programmed radius " +
                   format_number(programmed) + " mm " + (expected > programmed ? "+" : "-") +
                   " the tool radius); enter with a straight move");
    }
    el.s = tool;
    el.e = el.c + el.rho * (p - el.c) / programmed;
    Move tool_arc = m;
    tool_arc.start_mm.head<2>() = el.s;
    tool_arc.end_mm.head<2>() = el.e;
    el.total = std::abs(arc_sweep_rad(tool_arc));
    el.t0 = arc_tangent((el.s - el.c) / el.rho, m.ccw);
    el.t1 = arc_tangent((el.e - el.c) / el.rho, m.ccw);
  }
  el.u1 = el.total;
  return el;
}

// The corner at held.corner between two offset moves: nothing (tangent), a short link (nearly
// tangent), an arc of the tool radius about the corner (outside: RS274NGC v3), or both moves
// cut back to where they meet (inside).
void GcodeCutterComp::join(CompElement& held, CompElement& next, std::vector<Move>& corner) const {
  const Eigen::Vector2d p = held.corner, e1 = held.e, s2 = next.s;
  const double gap = (e1 - s2).norm();
  if (gap <= kCompPointToleranceMm) return;
  const double turn = std::atan2(cross2(held.t1, next.t0), held.t1.dot(next.t0));
  Move link = next.proto;
  link.kind = MoveKind::Line;
  link.extra_turns = 0;
  link.start_mm = {e1.x(), e1.y(), next.z0};
  link.end_mm = {s2.x(), s2.y(), next.z0};
  if (std::abs(turn) < kCompTangentRad) {
    corner.push_back(link);
    return;
  }
  const double toward_tool = side_ == CompSide::Left ? turn : -turn;
  const bool reversal = std::abs(std::abs(turn) - std::numbers::pi) < kCompTangentRad;
  if (toward_tool < 0.0 || reversal) {  // outside corner: around the programmed point
    link.kind = MoveKind::Arc;
    link.centre_mm = p;
    link.ccw = side_ == CompSide::Right;
    corner.push_back(link);
    return;
  }
  std::array<Eigen::Vector2d, 2> q;
  const int n = meet(held, next, q);
  const double th = u_tolerance(held), tn = u_tolerance(next);
  double best = -1.0, uh = 0.0, un = 0.0;
  for (int k = 0; k < n; ++k) {
    const double a = param_of(held, q[k], true), b = param_of(next, q[k], false);
    if (a < held.u0 - th || a > held.total + th || b < -tn || b > next.total + tn) continue;
    const double d = (q[k] - p).norm();
    if (best < 0.0 || d < best) {
      best = d;
      uh = a;
      un = b;
    }
  }
  if (best < 0.0) {
    fail(next, "inside corner at " + xy_text(p) + " (after line " +
                   std::to_string(held.proto.source_line) + "): the tool radius " +
                   format_number(radius_mm_) + " mm does not fit, its offset moves do not meet "
                   "(the tool would gouge); use a smaller D or longer moves beside the corner");
  }
  held.u1 = std::clamp(uh, held.u0, held.total);
  next.u0 = std::clamp(un, 0.0, next.total);
}

void GcodeCutterComp::add(const Move& programmed, const std::string& word,
                          double arc_tolerance_mm, std::vector<Move>& out) {
  const Eigen::Vector2d a = programmed.start_mm.head<2>(), b = programmed.end_mm.head<2>();
  const bool planar = programmed.kind == MoveKind::Arc || (b - a).norm() > kCompPointToleranceMm;
  if (!planar) {  // Z only: at the tool's X/Y, after the held move
    if (held_) {
      if (held_z_.size() >= kMaxCompHeldMoves) {
        throw_gcode_error(file_, programmed.source_line, word,
                          "more than " + std::to_string(kMaxCompHeldMoves) + " moves without X/Y "
                          "motion in a row under G41/G42; program G40 before them");
      }
      held_z_.push_back(programmed);
    } else {
      z_move(programmed, out);
    }
    return;
  }
  CompElement next;
  std::vector<Move> corner;
  if (entry_) {
    next = entry_element(programmed, word, arc_tolerance_mm);
    entry_ = false;
  } else {
    next = offset_element(programmed, word);
    if (held_) join(*held_, next, corner);
  }
  flush(out);
  for (Move& m : corner) {
    m.start_mm = tool_mm_;  // after any moves without X/Y motion, at their Z
    m.end_mm.z() = tool_mm_.z();
    out.push_back(m);
    tool_mm_ = m.end_mm;
  }
  held_ = next;
}

}  // namespace cuspmap

// Row spans of lines (capsule), vertical moves (disc) and arcs (outer disc within the grown box).
// Inputs: PreparedMove, row Y, reach, cell (mm); output: column range.
// Method: interval arithmetic on the capsule's two discs and its band (half-plane pairs).
#include "sweep/row_span.h"

#include <algorithm>
#include <cmath>
#include <limits>

namespace cuspmap {
namespace {

constexpr double kInf = std::numeric_limits<double>::infinity();

struct Span {
  double lo = kInf;
  double hi = -kInf;
  void add(double a, double b) {
    if (a > b) return;
    lo = std::min(lo, a);
    hi = std::max(hi, b);
  }
};

// Chord of the disc (centre c, radius r) along the row y.
void add_disc(Span& s, const Eigen::Vector2d& c, double r, double y) {
  const double dy = y - c.y();
  const double h2 = r * r - dy * dy;
  if (h2 < 0.0) return;
  const double h = std::sqrt(h2);
  s.add(c.x() - h, c.x() + h);
}

// x with lo <= a x + b <= hi, intersected into [x_lo, x_hi].
void clip_linear(double a, double b, double lo, double hi, double& x_lo, double& x_hi) {
  if (a == 0.0) {
    if (b < lo || b > hi) x_lo = kInf;
    return;
  }
  double p = (lo - b) / a, q = (hi - b) / a;
  if (p > q) std::swap(p, q);
  x_lo = std::max(x_lo, p);
  x_hi = std::min(x_hi, q);
}

}  // namespace

bool row_span(const PreparedMove& move, double y_mm, double reach_mm, double cell_mm, int i_min,
              int i_max, int& i_lo, int& i_hi) {
  Span s;
  if (move.kind == MoveKind::Line) {
    add_disc(s, move.a_mm, reach_mm, y_mm);
    if (!move.vertical()) {
      add_disc(s, move.b_mm, reach_mm, y_mm);
      // Band: 0 <= (P - A).dir <= L and |(P - A).perp| <= reach, each linear in x on the row.
      const double dy = y_mm - move.a_mm.y();
      double x_lo = -kInf, x_hi = kInf;
      clip_linear(move.dir.x(), -move.a_mm.x() * move.dir.x() + dy * move.dir.y(), 0.0,
                  move.length_xy_mm, x_lo, x_hi);
      clip_linear(move.perp.x(), -move.a_mm.x() * move.perp.x() + dy * move.perp.y(), -reach_mm,
                  reach_mm, x_lo, x_hi);
      s.add(x_lo, x_hi);
    }
  } else {
    if (y_mm < move.y_min_mm - reach_mm || y_mm > move.y_max_mm + reach_mm) return false;
    Span outer;
    add_disc(outer, move.centre_mm, move.arc_radius_mm + reach_mm, y_mm);
    s.add(std::max(outer.lo, move.x_min_mm - reach_mm),
          std::min(outer.hi, move.x_max_mm + reach_mm));
  }
  if (!(s.lo <= s.hi)) return false;
  // Cell i's centre is at (i + 0.5) cell.
  const double a = std::ceil(s.lo / cell_mm - 0.5), b = std::floor(s.hi / cell_mm - 0.5);
  i_lo = static_cast<int>(std::max(a, static_cast<double>(i_min)));
  i_hi = static_cast<int>(std::min(b, static_cast<double>(i_max)));
  return i_lo <= i_hi;
}

}  // namespace cuspmap

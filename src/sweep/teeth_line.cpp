// Tooth crossings along a straight move: bearing equation per tooth family, walked outwards from
// each local minimum of the envelope to the nearest crossing on either side; heights there.
// Inputs: SweepSetup, PreparedMove (Line), cell (u, w) mm; output: height mm.
// Method: see teeth_line.h; safeguarded Newton (Numerical Recipes 3rd ed., §9.4, rtsafe).
#include "sweep/teeth_line.h"

#include <algorithm>
#include <array>
#include <cmath>
#include <limits>
#include <numbers>

#include "tool/chord_min.h"

namespace cuspmap {
namespace {

constexpr double kInf = std::numeric_limits<double>::infinity();
constexpr double kTwoPi = 2.0 * std::numbers::pi;
// Crossing position tolerance (mm): heights move by slope x 1e-10 mm, far below a nanometre.
constexpr double kRootTolMm = 1e-10;
constexpr int kRootMaxIter = 60;
// A cell exactly on the move's line has no side; this offset (mm) puts it on the side where the
// bearing equation stays monotone, with no effect on any height.
constexpr double kOnLineOffsetMm = 1e-12;
// How far to walk from a minimum for the nearest crossing: two revolutions of travel. Over one
// revolution the tooth turns 2 pi while the bearing of the cell turns at most pi, so two always
// hold a crossing of every tooth if the cell stays in reach.
constexpr double kWalkRevolutions = 2.0;
// Plain Newton from a minimum converges in 2-4 steps on a monotone bearing; more means trouble.
constexpr int kNewtonSteps = 8;
// Newton steps shorter than this (mm) are in the quadratic regime, where the error estimate
// |F''| h^2 / |F'| holds: a hundredth of the shortest crossing spacing of practical feeds.
constexpr double kAsymptoticStepMm = 1e-4;
// Largest angle step (rad, as its tangent) summed by series instead of a library call.
constexpr double kSeriesMaxArg = 0.1;
constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

// Outcome of a Newton search: settled with a root (x) or with none (x = NaN), or not settled.
struct Settled {
  bool settled = false;
  double x = kNaN;
};

// One set of crossings with a common bearing offset: all teeth at once when they are alike
// (lattice step 2 pi / Z), else one tooth (step 2 pi).
struct Family {
  double target = 0.0;  // F(x) = target (mod period) at a crossing, rad
  double period = kTwoPi;
  double inv_period = 1.0 / kTwoPi;
  double e_sin = 0.0;  // runout across the tooth (mm): bearing offset asin(e_sin / d)
  double e_cos = 0.0;  // runout along the tooth (mm): the edge radius is d cos(offset) - e_cos
  double axial_mm = 0.0;
};

struct Crossings {
  const SweepSetup& s;
  double w, w2, kappa, c, k, lo, hi;
  double walk_mm;  // kWalkRevolutions of travel
  double turn_mm;  // |x| of the turning points of atan2(w, x) + kappa x; 0 when there are none

  double offset(const Family& f, double d) const {
    return f.e_sin == 0.0 ? 0.0 : std::asin(std::clamp(f.e_sin / d, -1.0, 1.0));
  }
  // Bearing of the cell from the axis minus the tooth angle, up to the family's target, given
  // the cell's bearing atan2(w, x) from the axis.
  double bearing_at(const Family& f, double x, double angle) const {
    if (f.e_sin == 0.0) return angle + kappa * x;
    return angle + kappa * x - offset(f, std::sqrt(w2 + x * x));
  }
  double bearing(const Family& f, double x) const { return bearing_at(f, x, std::atan2(w, x)); }
  // atan2(w, x) from a known atan2(w, x_ref) = angle_ref: the difference is the angle between
  // (x_ref, w) and (x, w), atan(w (x_ref - x) / (x x_ref + w^2)); Newton steps are short, so a
  // few series terms replace the library call.
  double angle_from(double x, double x_ref, double angle_ref) const {
    const double den = x * x_ref + w2;
    if (den <= 0.0) return std::atan2(w, x);
    const double z = w * (x_ref - x) / den;
    if (std::abs(z) > kSeriesMaxArg) return angle_ref + std::atan(z);
    const double z2 = z * z;
    // atan z = z - z^3/3 + z^5/5 - ... ; |z| <= 0.1 leaves < 1e-15 after the z^13 term.
    return angle_ref +
           z * (1.0 +
                z2 * (-1.0 / 3 +
                      z2 * (1.0 / 5 + z2 * (-1.0 / 7 +
                                            z2 * (1.0 / 9 + z2 * (-1.0 / 11 + z2 * (1.0 / 13)))))));
  }
  double bearing_slope(const Family& f, double x) const {
    const double d2 = w2 + x * x;
    double slope = kappa - w / d2;
    if (f.e_sin != 0.0) {
      const double d = std::sqrt(d2), ratio = f.e_sin / d;
      if (std::abs(ratio) < 1.0) slope += ratio * (x / d2) / std::sqrt(1.0 - ratio * ratio);
    }
    return slope;
  }
  // Second derivative of the bearing without the runout term, 2 w x / d^4 (the runout adds
  // under e / d^3, far smaller): only used to start Newton.
  double curvature(const Family&, double x) const {
    const double d2 = w2 + x * x;
    return 2.0 * w * x / (d2 * d2);
  }
  // An upper bound of |F''| near x, runout included (|d^2/dx^2 asin(e/d)| <= 2 e / d^3 for
  // e << d, derived), for the convergence test.
  double curvature_bound(const Family& f, double x) const {
    const double d2 = w2 + x * x;
    return std::abs(2.0 * w * x) / (d2 * d2) + 2.0 * std::abs(f.e_sin) / (d2 * std::sqrt(d2));
  }
  // Root of bearing = target between a and b (bearing - target changes sign over [a, b]).
  double solve(const Family& f, double a, double b, double target) const {
    double ga = bearing(f, a) - target, gb = bearing(f, b) - target;
    if (ga == 0.0) return a;
    if (gb == 0.0) return b;
    if (ga > 0.0) {
      std::swap(a, b);
      std::swap(ga, gb);
    }
    double neg = a, pos = b;  // bearing - target < 0 at neg, > 0 at pos
    double x = a - ga * (b - a) / (gb - ga);
    for (int it = 0; it < kRootMaxIter; ++it) {
      const double g = bearing(f, x) - target;
      if (g == 0.0) return x;
      if (g < 0.0) {
        neg = x;
      } else {
        pos = x;
      }
      const double slope = bearing_slope(f, x);
      const double b_lo = std::min(neg, pos), b_hi = std::max(neg, pos);
      double xn = slope != 0.0 ? x - g / slope : 0.5 * (b_lo + b_hi);
      if (std::abs(xn - x) < kRootTolMm) return std::clamp(xn, b_lo, b_hi);
      if (!(xn > b_lo && xn < b_hi)) xn = 0.5 * (b_lo + b_hi);
      if (b_hi - b_lo < kRootTolMm) return xn;
      x = xn;
    }
    return x;
  }
  // Height the family's tooth leaves when it passes at x; +infinity outside the edge.
  double height(const Family& f, double x) const {
    const double d = std::sqrt(w2 + x * x);
    double r = d;
    if (f.e_sin != 0.0 || f.e_cos != 0.0) {
      const double sin_off = f.e_sin / d;
      if (std::abs(sin_off) > 1.0) return kInf;
      r = d * std::sqrt(1.0 - sin_off * sin_off) - f.e_cos;
    }
    if (r < 0.0 || r > s.tooth.radius_mm) return kInf;
    return c - k * x + s.tooth.height_mm(r) + f.axial_mm;
  }
  // Nearest crossing from x0 (cell bearing a0 = atan2(w, x0), f0 = bearing_at there) walking in
  // direction `dir` (+1/-1); NaN when none within reach.
  double walk(const Family& f, double x0, double a0, double f0, double s0,
              const BearingSeries& series, double dir) const {
    const double limit = std::clamp(x0 + dir * walk_mm, lo, hi);
    if ((limit - x0) * dir <= 0.0) return kNaN;
    std::array<double, 3> ends{};
    int n = 0;
    if (turn_mm > 0.0) {
      const double xc = turn_mm;
      for (double t : {dir * -xc, dir * xc}) {  // in walking order
        if ((t - x0) * dir > 0.0 && (limit - t) * dir > 0.0) ends[n++] = t;
      }
    }
    if (n == 0) {
      const Settled r = newton_from(f, x0, a0, f0, s0, series, dir, limit);
      if (r.settled) return r.x;  // the root, or NaN: none within reach
    }
    ends[n++] = limit;
    double cur = x0, f_cur = f0;
    for (int i = 0; i < n; ++i) {
      const double f_end = bearing(f, ends[i]);
      if (f_end > f_cur) {
        const double target = f.target + f.period * std::ceil((f_cur - f.target) / f.period);
        if (target <= f_end) return solve(f, cur, ends[i], target);
      } else if (f_end < f_cur) {
        const double target = f.target + f.period * std::floor((f_cur - f.target) / f.period);
        if (target >= f_end) return solve(f, cur, ends[i], target);
      }
      cur = ends[i];
      f_cur = f_end;
    }
    return kNaN;
  }
  // On a monotone stretch: the first lattice value in the direction the bearing moves, reached
  // by plain Newton from x0. Not settled when Newton wanders (the bracketed search takes over).
  Settled newton_from(const Family& f, double x0, double a0, double f0, double s0,
                      const BearingSeries& series, double dir, double limit) const {
    if (s0 == 0.0) return {};
    const bool rising = s0 * dir > 0.0;
    const double steps = (f0 - f.target) * f.inv_period;
    const double target = f.target + f.period * (rising ? std::ceil(steps) : std::floor(steps));
    // Closed form first: the series root with its error bound (no runout), settled when the
    // bound is met and the root is clearly inside or beyond the stretch.
    const double h = bearing_series_root(series, target - f0, kRootTolMm);
    if (h == h) {
      const double xs = x0 + h;
      if ((xs - limit) * dir > kRootTolMm) return {true, kNaN};
      if ((xs - x0) * dir >= 0.0 && (limit - xs) * dir > kRootTolMm) return {true, xs};
    }
    // Second-order start: F(x0 + h) ~ f0 + s0 h + F'' h^2 / 2 = target, solved by one fixed-point
    // step, so the first Newton step usually lands within the tolerance.
    const double delta = (target - f0) / s0;
    double x = x0 + delta - 0.5 * curvature(f, x0) / s0 * delta * delta;
    double x_ref = x0, angle_ref = a0;
    for (int it = 0; it < kNewtonSteps; ++it) {
      if ((x - x0) * dir < 0.0) return {};  // went backwards: not monotone enough here
      if ((x - limit) * dir > 0.0) {
        // Past the limit: settled (no crossing) once the bearing there falls short of the target.
        const double g_limit = bearing(f, limit) - target;
        if (rising ? g_limit < 0.0 : g_limit > 0.0) return {true, kNaN};
        return {};
      }
      const double angle = angle_from(x, x_ref, angle_ref);
      x_ref = x;
      angle_ref = angle;
      const double slope = bearing_slope(f, x);
      const double step = (bearing_at(f, x, angle) - target) / slope;
      x -= step;
      // Newton converges quadratically: after a step h the error is about |F''| h^2 / (2 |F'|)
      // (Numerical Recipes §9.4), so a short enough step needs no further evaluation.
      if (std::abs(step) < kRootTolMm ||
          (std::abs(step) < kAsymptoticStepMm &&
           std::abs(curvature_bound(f, x) / slope) * step * step < kRootTolMm)) {
        if ((x - x0) * dir < 0.0 || (x - limit) * dir > 0.0) return {};
        return {true, x};
      }
    }
    return {};
  }
};

}  // namespace

LineTeeth::LineTeeth(const SweepSetup& setup, const PreparedMove& move)
    : setup_(setup), move_(move) {
  const double length = move.length_xy_mm;
  rise_ = (move.z1_mm - move.z0_mm) / length;
  slope_ = rise_ + setup.tilt.dot(move.dir);
  tilt_across_ = setup.tilt.dot(move.perp);
  const double speed = length / move.duration_s;  // XY mm/s
  kappa_ = setup.omega_rad_per_s / speed;         // tooth angle per mm of travel
  phase0_ = move.spindle_phase_rad - std::atan2(move.dir.y(), move.dir.x());
  walk_mm_ = kWalkRevolutions * kTwoPi / std::abs(kappa_);
}

void LineTeeth::prepare_chord(double w_mm, double lo, double hi) {
  if (cached_ && w_mm == cache_w_ && lo == cache_lo_ && hi == cache_hi_) return;
  const std::vector<ToothFamily>& families = setup_.families;
  // A new chord: per family, the local minima of that tooth's heights along it. Each tooth
  // reaches its own radius (R plus its share of the runout), and its lowest crossing lies
  // next to its own minima, not the revolving envelope's (issue 13: near the reach limit the
  // envelope is flat and says nothing about where a given tooth is lowest). The cell's
  // bearing at each (atan2(w, -x) = +-pi - atan2(w, x), so the two rim ends of a dished face
  // share one library call).
  minima_.resize(families.size());
  angles_.resize(families.size());
  starts_.resize(families.size());
  low_mm_ = kInf;
  for (std::size_t f = 0; f < families.size(); ++f) {
    ChordMin& m = minima_[f];
    m = chord_min(families[f].reach, family_offset_mm(families[f], w_mm), slope_, lo, hi, true);
    if (m.count == 0 && m.value_mm < kInf) {  // rounding only: the global minimum qualifies
      m.candidates[0] = {m.x_mm, m.value_mm};
      m.count = 1;
    }
    low_mm_ = std::min(low_mm_, m.value_mm + families[f].axial_mm);
    for (int i = 0; i < m.count; ++i) {
      const double x0 = m.candidates[i].x_mm;
      angles_[f][i] = (i > 0 && x0 == -m.candidates[0].x_mm && x0 != 0.0)
                          ? std::copysign(std::numbers::pi, w_mm) - angles_[f][0]
                          : std::atan2(w_mm, x0);
      const ToothFamily& tf = families[f];
      Start& st = starts_[f][i];
      st.f0 = angles_[f][i] + kappa_ * x0;
      if (tf.e_sin_mm != 0.0) {
        const double d = std::sqrt(w_mm * w_mm + x0 * x0);
        st.f0 -= std::asin(std::clamp(tf.e_sin_mm / d, -1.0, 1.0));
        st.series = BearingSeries{};  // the runout offset is not in the series: Newton
      } else {
        st.series = bearing_series(w_mm, kappa_, x0, tf.period_rad);
      }
      Family fam;
      fam.e_sin = tf.e_sin_mm;
      const Crossings at{setup_, w_mm, w_mm * w_mm, kappa_, 0, 0, 0, 0, 0, 0};
      st.s0 = at.bearing_slope(fam, x0);
    }
  }
  // Turning points of atan2(w, x) + kappa x: w / (x^2 + w^2) = kappa.
  const double q = w_mm / kappa_ - w_mm * w_mm;
  turn_mm_ = (w_mm / kappa_ > 0.0 && q > 0.0) ? std::sqrt(q) : 0.0;
  cached_ = true;
  cache_w_ = w_mm;
  cache_lo_ = lo;
  cache_hi_ = hi;
}

double LineTeeth::row_low_mm(double w_mm) {
  // A ramp's chord carries the rise, which cells beyond the move's ends extrapolate: no bound.
  if (rise_ != 0.0) return -kInf;
  const double reach = setup_.envelope.reach_mm;
  if (w_mm == 0.0) w_mm = setup_.omega_rad_per_s > 0.0 ? -kOnLineOffsetMm : kOnLineOffsetMm;
  if (w_mm * w_mm > reach * reach) return kInf;
  // Every cell's chord lies within the whole chord [-half, half], whose minima are no higher.
  const double half = std::sqrt(reach * reach - w_mm * w_mm);
  prepare_chord(w_mm, -half, half);
  return move_.z0_mm - w_mm * tilt_across_ + low_mm_;
}

double LineTeeth::height_mm(double u_mm, double w_mm, double bound_mm) {
  const double length = move_.length_xy_mm;
  const double reach = setup_.envelope.reach_mm;
  if (w_mm == 0.0) w_mm = setup_.omega_rad_per_s > 0.0 ? -kOnLineOffsetMm : kOnLineOffsetMm;
  const double w2 = w_mm * w_mm;
  if (w2 > reach * reach) return kInf;
  if (!(w_mm == half_w_)) {  // the chord's half length, once per lateral offset (a row)
    half_w_ = w_mm;
    half_ = std::sqrt(reach * reach - w2);
  }
  const double half = half_;
  const double lo = std::max(u_mm - length, -half), hi = std::min(u_mm, half);
  if (!(lo <= hi)) return kInf;

  const double c = move_.z0_mm + rise_ * u_mm - w_mm * tilt_across_;
  prepare_chord(w_mm, lo, hi);
  if (!(c + low_mm_ < bound_mm)) return kInf;

  const std::vector<ToothFamily>& families = setup_.families;
  const Crossings cr{setup_, w_mm, w2, kappa_, c, slope_, lo, hi, walk_mm_, turn_mm_};
  // Tooth k passes when atan2(w, x) + kappa x - offset = theta_0 + kappa u + 2 pi k / Z - dir
  // angle (mod 2 pi), x = u - s the cell's lead over the axis.
  const double base = phase0_ + kappa_ * u_mm;
  double best = kInf;
  for (std::size_t t = 0; t < families.size(); ++t) {
    const ToothFamily& tf = families[t];
    const ChordMin& m = minima_[t];
    // A tooth whose lowest point along the chord cannot beat what is known adds nothing.
    if (!(c + m.value_mm + tf.axial_mm < std::min(best, bound_mm))) continue;
    Family f;
    f.target = base + tf.spacing_rad;
    f.period = tf.period_rad;
    f.inv_period = 1.0 / tf.period_rad;
    f.e_sin = tf.e_sin_mm;
    f.e_cos = tf.e_cos_mm;
    f.axial_mm = tf.axial_mm;
    for (int i = 0; i < m.count; ++i) {
      const double x0 = m.candidates[i].x_mm;
      const Start& st = starts_[t][i];
      for (double dir : {-1.0, 1.0}) {
        const double x = cr.walk(f, x0, angles_[t][i], st.f0, st.s0, st.series, dir);
        if (x == x) best = std::min(best, cr.height(f, x));
      }
    }
  }
  return best;
}

}  // namespace cuspmap

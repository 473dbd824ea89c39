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
  double e_sin = 0.0;  // runout across the tooth (mm): bearing offset asin(e_sin / d)
  double e_cos = 0.0;  // runout along the tooth (mm): the edge radius is d cos(offset) - e_cos
  double axial_mm = 0.0;
};

struct Crossings {
  const SweepSetup& s;
  double w, w2, kappa, c, k, lo, hi;

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
  double walk(const Family& f, double x0, double a0, double f0, double dir) const {
    const double limit = std::clamp(x0 + dir * kWalkRevolutions * kTwoPi / std::abs(kappa), lo, hi);
    if ((limit - x0) * dir <= 0.0) return kNaN;
    // Turning points of atan2(w, x) + kappa x: w / (x^2 + w^2) = kappa.
    std::array<double, 3> ends{};
    int n = 0;
    const double q = w / kappa - w2;
    if (w / kappa > 0.0 && q > 0.0) {
      const double xc = std::sqrt(q);
      for (double t : {dir * -xc, dir * xc}) {  // in walking order
        if ((t - x0) * dir > 0.0 && (limit - t) * dir > 0.0) ends[n++] = t;
      }
    }
    if (n == 0) {
      const Settled r = newton_from(f, x0, a0, f0, dir, limit);
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
  Settled newton_from(const Family& f, double x0, double a0, double f0, double dir,
                      double limit) const {
    const double s0 = bearing_slope(f, x0);
    if (s0 == 0.0) return {};
    const bool rising = s0 * dir > 0.0;
    const double target = rising ? f.target + f.period * std::ceil((f0 - f.target) / f.period)
                                 : f.target + f.period * std::floor((f0 - f.target) / f.period);
    double x = x0 + (target - f0) / s0;
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
      const double step = (bearing_at(f, x, angle) - target) / bearing_slope(f, x);
      x -= step;
      if (std::abs(step) < kRootTolMm) {
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
}

double LineTeeth::height_mm(double u_mm, double w_mm, double bound_mm) {
  const double length = move_.length_xy_mm;
  const double reach = setup_.envelope.reach_mm;
  if (w_mm == 0.0) w_mm = setup_.omega_rad_per_s > 0.0 ? -kOnLineOffsetMm : kOnLineOffsetMm;
  const double w2 = w_mm * w_mm;
  if (w2 > reach * reach) return kInf;
  const double half = std::sqrt(reach * reach - w2);
  const double lo = std::max(u_mm - length, -half), hi = std::min(u_mm, half);
  if (!(lo <= hi)) return kInf;

  const double c = move_.z0_mm + rise_ * u_mm - w_mm * tilt_across_;
  if (!(cached_ && w_mm == cache_w_ && lo == cache_lo_ && hi == cache_hi_)) {
    // A new chord: its local minima and the cell's bearing there (atan2(w, -x) = +-pi -
    // atan2(w, x), so the two rim ends of a dished face share one library call).
    minima_ = chord_min(setup_.envelope, w_mm, slope_, lo, hi, true);
    if (minima_.count == 0) {  // rounding only: the global minimum always qualifies
      minima_.candidates[0] = {minima_.x_mm, minima_.value_mm};
      minima_.count = 1;
    }
    for (int i = 0; i < minima_.count; ++i) {
      const double x0 = minima_.candidates[i].x_mm;
      angles_[i] = (i > 0 && x0 == -minima_.candidates[0].x_mm && x0 != 0.0)
                       ? std::copysign(std::numbers::pi, w_mm) - angles_[0]
                       : std::atan2(w_mm, x0);
    }
    cached_ = true;
    cache_w_ = w_mm;
    cache_lo_ = lo;
    cache_hi_ = hi;
  }
  if (!(c + minima_.value_mm + setup_.axial_min_mm < bound_mm)) return kInf;

  const Crossings cr{setup_, w_mm, w2, kappa_, c, slope_, lo, hi};
  // Tooth k passes when atan2(w, x) + kappa x - offset = theta_0 + kappa u + 2 pi k / Z - dir
  // angle (mod 2 pi), x = u - s the cell's lead over the axis.
  const double base = phase0_ + kappa_ * u_mm;
  const int families = setup_.teeth_alike ? 1 : setup_.teeth;
  double best = kInf;
  for (int t = 0; t < families; ++t) {
    Family f;
    if (setup_.teeth_alike) {
      f.target = base;
      f.period = kTwoPi / setup_.teeth;
      f.axial_mm = setup_.axial_mm[0];
    } else {
      const double spacing = kTwoPi * t / setup_.teeth;
      const double beta = setup_.runout_phase_rad - spacing;
      f.target = base + spacing;
      f.e_sin = setup_.runout_mm * std::sin(beta);
      f.e_cos = setup_.runout_mm * std::cos(beta);
      f.axial_mm = setup_.axial_mm[t];
    }
    for (int i = 0; i < minima_.count; ++i) {
      const double x0 = minima_.candidates[i].x_mm;
      const double f0 = cr.bearing_at(f, x0, angles_[i]);
      for (double dir : {-1.0, 1.0}) {
        const double x = cr.walk(f, x0, angles_[i], f0, dir);
        if (x == x) best = std::min(best, cr.height(f, x));
      }
    }
  }
  return best;
}

}  // namespace cuspmap

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

// One set of crossings with a common bearing offset: all teeth at once when they are alike
// (lattice step 2 pi / Z), else one tooth (step 2 pi).
struct Family {
  double target = 0.0;  // F(x) = target (mod period) at a crossing, rad
  double period = kTwoPi;
  double e_sin = 0.0;   // runout across the tooth (mm): bearing offset asin(e_sin / d)
  double e_cos = 0.0;   // runout along the tooth (mm): the edge radius is d cos(offset) - e_cos
  double axial_mm = 0.0;
};

struct Crossings {
  const SweepSetup& s;
  double w, w2, kappa, c, k, lo, hi;

  double offset(const Family& f, double d) const {
    return f.e_sin == 0.0 ? 0.0 : std::asin(std::clamp(f.e_sin / d, -1.0, 1.0));
  }
  // Bearing of the cell from the axis minus the tooth angle, up to the family's target.
  double bearing(const Family& f, double x) const {
    return std::atan2(w, x) + kappa * x - offset(f, std::sqrt(w2 + x * x));
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
  // Nearest crossing from x0 walking in direction `dir` (+1/-1); NaN when none in reach.
  double walk(const Family& f, double x0, double dir) const {
    const double limit = std::clamp(x0 + dir * kWalkRevolutions * kTwoPi / std::abs(kappa), lo, hi);
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
    ends[n++] = limit;
    double cur = x0, f_cur = bearing(f, x0);
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
    return std::numeric_limits<double>::quiet_NaN();
  }
};

}  // namespace

double teeth_line_mm(const SweepSetup& setup, const PreparedMove& move, double u_mm, double w_mm,
                     double bound_mm) {
  const double length = move.length_xy_mm;
  const double reach = setup.envelope.reach_mm;
  if (w_mm == 0.0) w_mm = setup.omega_rad_per_s > 0.0 ? -kOnLineOffsetMm : kOnLineOffsetMm;
  const double w2 = w_mm * w_mm;
  if (w2 > reach * reach) return kInf;
  const double half = std::sqrt(reach * reach - w2);
  const double lo = std::max(u_mm - length, -half), hi = std::min(u_mm, half);
  if (!(lo <= hi)) return kInf;

  const double rise = (move.z1_mm - move.z0_mm) / length;
  const double k = rise + setup.tilt.dot(move.dir);
  const double c = move.z0_mm + rise * u_mm - w_mm * setup.tilt.dot(move.perp);
  const ChordMin minima = chord_min(setup.envelope, w_mm, k, lo, hi, true);
  if (!(c + minima.value_mm + setup.axial_min_mm < bound_mm)) return kInf;

  const double speed = length / move.duration_s;  // XY mm/s
  const double kappa = setup.omega_rad_per_s / speed;  // tooth angle per mm of travel
  const Crossings cr{setup, w_mm, w2, kappa, c, k, lo, hi};
  // Tooth k passes when atan2(w, x) + kappa x - offset = theta_0 + kappa u + 2 pi k / Z - dir
  // angle (mod 2 pi), x = u - s the cell's lead over the axis.
  const double base = move.spindle_phase_rad + kappa * u_mm -
                      std::atan2(move.dir.y(), move.dir.x());
  const int families = setup.teeth_alike ? 1 : setup.teeth;
  double best = kInf;
  for (int t = 0; t < families; ++t) {
    Family f;
    if (setup.teeth_alike) {
      f.target = base;
      f.period = kTwoPi / setup.teeth;
      f.axial_mm = setup.axial_mm[0];
    } else {
      const double spacing = kTwoPi * t / setup.teeth;
      const double beta = setup.runout_phase_rad - spacing;
      f.target = base + spacing;
      f.e_sin = setup.runout_mm * std::sin(beta);
      f.e_cos = setup.runout_mm * std::cos(beta);
      f.axial_mm = setup.axial_mm[t];
    }
    for (int i = 0; i < std::max(1, minima.count); ++i) {
      // The global minimum always qualifies (local_minima_only never empties a finite result
      // in exact arithmetic; this guards against rounding).
      const double x0 = minima.count > 0 ? minima.candidates[i].x_mm : minima.x_mm;
      for (double dir : {-1.0, 1.0}) {
        const double x = cr.walk(f, x0, dir);
        if (x == x) best = std::min(best, cr.height(f, x));
      }
    }
  }
  return best;
}

}  // namespace cuspmap

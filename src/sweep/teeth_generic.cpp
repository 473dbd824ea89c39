// Tooth crossings for arcs, helices and vertical moves: closed-form turning points of the
// bearing lattice value, bracketed Newton per crossing. Inputs: SweepSetup, PreparedMove (Arc or
// vertical Line), cell (mm); output: height mm. Method: see teeth_generic.h.
#include "sweep/teeth_generic.h"

#include <algorithm>
#include <array>
#include <cmath>
#include <limits>
#include <numbers>

#include "sweep/envelope_arc.h"

namespace cuspmap {
namespace {

constexpr double kInf = std::numeric_limits<double>::infinity();
constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();
constexpr double kPi = std::numbers::pi;
constexpr double kTwoPi = 2.0 * kPi;
// Walk two revolutions from a minimum (see teeth_line.cpp: they always hold a crossing).
constexpr double kWalkRevolutions = 2.0;
// Root tolerance on the move parameter, as travel: 1e-10 mm moves a height far below a nanometre.
constexpr double kRootTolMm = 1e-10;
constexpr int kRootMaxIter = 60;
// Most turning points kept per walk: two per turn of the arc, and a walk of two spindle
// revolutions covers at most a few turns of any arc slower than the spindle.
constexpr int kMaxEnds = 32;

double wrap_pi(double a) { return a - kTwoPi * std::floor((a + kPi) / kTwoPi); }

// Lower bound of every tooth's height over the cell from the move: the lowest tip, the envelope
// at the least distance to the arc's whole circle (or the plunge's axis), less the most tilt drops.
double envelope_low_mm(const SweepSetup& s, const PreparedMove& m, const Eigen::Vector2d& p) {
  const double d = m.vertical() ? (p - m.a_mm).norm()
                                : std::abs((p - m.centre_mm).norm() - m.arc_radius_mm);
  return m.z_min_mm + s.envelope.min_over_mm(d, s.envelope.reach_mm) - s.tilt_drop_mm;
}

// Lattice value g(t) = unwrapped bearing of the cell from the axis - tooth angle - runout
// offset, and its derivative, along one move; a crossing is g = target (mod period).
struct Lattice {
  const SweepSetup& s;
  const PreparedMove& m;
  Eigen::Vector2d p;
  Eigen::Vector2d q;         // P - centre (arcs)
  double rho = 0.0;          // |q|
  double psi = 0.0;          // bearing of q
  bool inside = false;       // P within the arc's circle: the bearing runs with phi
  double spin = 0.0;         // tooth angle turned over the move, rad (signed)
  double e_sin = 0.0;        // runout across the tooth edge (mm)
  double fixed_bearing = 0;  // plunges: the bearing, constant
  double fixed_d = 0.0;      // plunges: the distance, constant

  double offset(double d) const {
    if (e_sin == 0.0) return 0.0;
    if (d <= std::abs(e_sin)) return std::copysign(0.5 * kPi, e_sin);
    return std::asin(e_sin / d);
  }
  // g at t; slope receives dg/dt.
  double value(double t, double& slope) const {
    if (m.vertical()) {
      slope = -spin;
      return fixed_bearing - spin * t - offset(fixed_d);
    }
    const double phi = m.start_angle_rad + t * m.sweep_rad;
    const double c = std::cos(phi), sn = std::sin(phi);
    const double ra = m.arc_radius_mm;
    const Eigen::Vector2d v(q.x() - ra * c, q.y() - ra * sn);
    const double d2 = v.squaredNorm();
    // The bearing stays within a quarter turn of psi (P outside the circle) or of phi + pi
    // (inside): wrap about that reference for a continuous bearing.
    const double ref = inside ? phi + kPi : psi;
    const double bearing = ref + wrap_pi(std::atan2(v.y(), v.x()) - ref);
    // v' = -ra S (-sin phi, cos phi); bearing' = (v x v') / d^2.
    const Eigen::Vector2d dv(ra * m.sweep_rad * sn, -ra * m.sweep_rad * c);
    slope = d2 > 0.0 ? (v.x() * dv.y() - v.y() * dv.x()) / d2 - spin : -spin;
    if (e_sin != 0.0 && d2 > e_sin * e_sin) {
      const double d = std::sqrt(d2), dd = v.dot(dv) / d;
      slope += e_sin / (d2 * std::sqrt(1.0 - e_sin * e_sin / d2)) * dd;
    }
    return bearing - spin * t - offset(std::sqrt(d2));
  }
  double value(double t) const {
    double unused = 0.0;
    return value(t, unused);
  }
  // Where bearing' = spin along an arc (runout offset neglected: its rate is e/d of the
  // bearing's), in walking order within (t0, limit): cos(phi - psi) =
  // (sigma (rho^2 + ra^2) - ra^2) / (ra rho (2 sigma - 1)), sigma = spin per radian of arc.
  int turning_points(double t0, double limit, double dir,
                     std::array<double, kMaxEnds>& ends) const {
    if (m.vertical() || rho == 0.0) return 0;
    const double ra = m.arc_radius_mm, sigma = spin / m.sweep_rad;
    const double den = ra * rho * (2.0 * sigma - 1.0);
    if (den == 0.0) return 0;
    const double cd = (sigma * (rho * rho + ra * ra) - ra * ra) / den;
    if (!(std::abs(cd) <= 1.0)) return 0;
    const double delta = std::acos(cd);
    const double a = std::min(t0, limit), b = std::max(t0, limit);
    const double phi_a = m.start_angle_rad + a * m.sweep_rad;
    const double phi_b = m.start_angle_rad + b * m.sweep_rad;
    const double lo = std::min(phi_a, phi_b), hi = std::max(phi_a, phi_b);
    int n = 0;
    for (double centre : {psi - delta, psi + delta}) {
      for (double k = std::ceil((lo - centre) / kTwoPi); n < kMaxEnds; k += 1.0) {
        const double phi = centre + kTwoPi * k;
        if (phi > hi) break;
        const double t = (phi - m.start_angle_rad) / m.sweep_rad;
        if ((t - t0) * dir > 0.0 && (limit - t) * dir > 0.0) ends[n++] = t;
      }
    }
    std::sort(ends.begin(), ends.begin() + n,
              [dir](double x, double y) { return x * dir < y * dir; });
    return n;
  }
  // Root of g = target on [a, b], g - target changing sign there: Newton kept in the bracket.
  double solve(double a, double b, double target, double t_tol) const {
    double ga = value(a) - target, gb = value(b) - target;
    if (ga == 0.0) return a;
    if (gb == 0.0) return b;
    if (ga > 0.0) {
      std::swap(a, b);
      std::swap(ga, gb);
    }
    double neg = a, pos = b;
    double t = a - ga * (b - a) / (gb - ga);
    for (int it = 0; it < kRootMaxIter; ++it) {
      double slope = 0.0;
      const double g = value(t, slope) - target;
      if (g == 0.0) return t;
      (g < 0.0 ? neg : pos) = t;
      const double lo = std::min(neg, pos), hi = std::max(neg, pos);
      double tn = slope != 0.0 ? t - g / slope : 0.5 * (lo + hi);
      if (std::abs(tn - t) < t_tol) return std::clamp(tn, lo, hi);
      if (!(tn > lo && tn < hi)) tn = 0.5 * (lo + hi);
      if (hi - lo < t_tol) return tn;
      t = tn;
    }
    return t;
  }
  // Nearest crossing of the lattice (target, period) from t0 in direction dir; NaN when none
  // within two revolutions and the move.
  double walk(double target0, double period, double t0, double dir, double t_tol) const {
    const double limit =
        std::clamp(t0 + dir * kWalkRevolutions * kTwoPi / std::abs(spin), 0.0, 1.0);
    if ((limit - t0) * dir <= 0.0) return kNaN;
    std::array<double, kMaxEnds> ends{};
    int n = turning_points(t0, limit, dir, ends);
    if (n == kMaxEnds) --n;
    ends[n++] = limit;
    double cur = t0, g_cur = value(t0);
    for (int i = 0; i < n; ++i) {
      const double g_end = value(ends[i]);
      if (g_end > g_cur) {
        const double target = target0 + period * std::ceil((g_cur - target0) / period);
        if (target <= g_end) return solve(cur, ends[i], target, t_tol);
      } else if (g_end < g_cur) {
        const double target = target0 + period * std::floor((g_cur - target0) / period);
        if (target >= g_end) return solve(cur, ends[i], target, t_tol);
      }
      cur = ends[i];
      g_cur = g_end;
    }
    return kNaN;
  }
};

// Height tooth family f leaves when it passes at t; +infinity outside its edge.
double crossing_height(const SweepSetup& s, const PreparedMove& m, const Eigen::Vector2d& p,
                       const ToothFamily& f, double t) {
  const Eigen::Vector2d v = p - m.point_at(t);
  const double d = v.norm();
  double r = d;
  if (f.e_sin_mm != 0.0 || f.e_cos_mm != 0.0) {
    if (d < std::abs(f.e_sin_mm) || d == 0.0) return kInf;
    const double sin_off = f.e_sin_mm / d;
    r = d * std::sqrt(1.0 - sin_off * sin_off) - f.e_cos_mm;
  }
  if (r < 0.0 || r > s.tooth.radius_mm) return kInf;
  return m.z_at(t) + s.tooth.height_mm(r) + f.axial_mm - s.tilt.dot(v);
}

}  // namespace

double teeth_generic_mm(const SweepSetup& setup, const PreparedMove& move,
                        const Eigen::Vector2d& p_mm, double bound_mm) {
  if (!(envelope_low_mm(setup, move, p_mm) + setup.axial_min_mm < bound_mm)) return kInf;
  Lattice lat{setup, move, p_mm, {0.0, 0.0}};
  lat.spin = setup.omega_rad_per_s * move.duration_s;
  if (move.vertical()) {
    const Eigen::Vector2d v = p_mm - move.a_mm;
    lat.fixed_bearing = std::atan2(v.y(), v.x());
    lat.fixed_d = v.norm();
  } else {
    lat.q = p_mm - move.centre_mm;
    lat.rho = lat.q.norm();
    lat.psi = std::atan2(lat.q.y(), lat.q.x());
    lat.inside = lat.rho <= move.arc_radius_mm;
  }
  // Root tolerance in t: kRootTolMm of travel (XY, or the plunge's depth).
  const double travel = move.vertical() ? std::abs(move.z1_mm - move.z0_mm) : move.length_xy_mm;
  const double t_tol = travel > 0.0 ? kRootTolMm / travel : kRootTolMm;
  double best = kInf;
  for (const ToothFamily& tf : setup.families) {
    // Each tooth's lowest crossings lie next to the minima of its own heights (its own reach,
    // runout included), not the revolving envelope's (issue 13).
    MoveMinima minima;
    if (move.vertical()) {
      const Eigen::Vector2d v = p_mm - move.a_mm;
      const double rho = std::sqrt(std::max(0.0, v.squaredNorm() - tf.e_sin_mm * tf.e_sin_mm));
      if (rho > tf.reach.reach_mm) continue;
      minima.value_mm = move.z_min_mm + tf.reach.height_mm(rho) - setup.tilt.dot(v);
      minima.count = 1;
      minima.t[0] = move.z0_mm <= move.z1_mm ? 0.0 : 1.0;
    } else {
      minima = arc_minima(setup, tf.reach, move, p_mm, tf.e_sin_mm);
    }
    if (!(minima.value_mm + tf.axial_mm < std::min(best, bound_mm))) continue;
    lat.e_sin = tf.e_sin_mm;
    // Tooth k passes when bearing - (phase + spin t) - offset = spacing (mod period).
    const double target = move.spindle_phase_rad + tf.spacing_rad;
    for (int i = 0; i < minima.count; ++i) {
      for (double dir : {-1.0, 1.0}) {
        const double t = lat.walk(target, tf.period_rad, minima.t[i], dir, t_tol);
        if (t == t) best = std::min(best, crossing_height(setup, move, p_mm, tf, t));
      }
    }
  }
  return best;
}

}  // namespace cuspmap

// Tooth crossings for arcs, helices and vertical moves by following the unwrapped bearing.
// Inputs: SweepSetup, PreparedMove (Arc or vertical Line), cell (mm); output: height mm.
// Method: see teeth_generic.h.
#include "sweep/teeth_generic.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <numbers>

#include "sweep/envelope_arc.h"

namespace cuspmap {
namespace {

constexpr double kInf = std::numeric_limits<double>::infinity();
constexpr double kPi = std::numbers::pi;
constexpr double kTwoPi = 2.0 * kPi;
// Walk two revolutions from a minimum (see teeth_line.cpp: they always hold a crossing).
constexpr double kWalkRevolutions = 2.0;
// A step turns the tooth lattice by at most a quarter period and the cell's bearing by about
// a quarter radian, so no crossing is stepped over and the unwrapping stays unambiguous.
constexpr double kSpinStepFraction = 0.25;
constexpr double kBearingStepRad = 0.25;
// Steps are never shorter than 1/64 of the spin step (cells almost on the axis trace), and a
// walk stops after this many.
constexpr double kMinStepDivisor = 64.0;
constexpr int kMaxSteps = 2048;
// Bisection steps on the move parameter: 2^-50 of a step is far below a nanometre of travel.
constexpr int kBisectIter = 50;

double wrap_pi(double a) { return a - kTwoPi * std::floor((a + kPi) / kTwoPi); }

struct Family {
  double target = 0.0, period = kTwoPi, e_sin = 0.0, e_cos = 0.0, axial_mm = 0.0;
};

struct Follow {
  const SweepSetup& s;
  const PreparedMove& m;
  Eigen::Vector2d p;
  double spin_per_t;   // tooth angle per unit of move parameter, rad
  double speed_per_t;  // XY travel per unit of move parameter, mm

  double offset(const Family& f, double d) const {
    if (f.e_sin == 0.0) return 0.0;
    if (d <= std::abs(f.e_sin)) return std::copysign(0.5 * kPi, f.e_sin);
    return std::asin(f.e_sin / d);
  }
  double bearing_raw(double t) const {
    const Eigen::Vector2d v = p - m.point_at(t);
    return std::atan2(v.y(), v.x());
  }
  // Unwrapped bearing minus tooth angle minus runout offset, continuing from `near` (rad).
  double lattice_value(const Family& f, double t, double near_bearing, double& bearing) const {
    bearing = near_bearing + wrap_pi(bearing_raw(t) - near_bearing);
    const double d = (p - m.point_at(t)).norm();
    return bearing - (m.spindle_phase_rad + spin_per_t * t) - offset(f, d);
  }
  double height(const Family& f, double t) const {
    const Eigen::Vector2d v = p - m.point_at(t);
    const double d = v.norm();
    double r = d;
    if (f.e_sin != 0.0 || f.e_cos != 0.0) {
      if (d < std::abs(f.e_sin) || d == 0.0) return kInf;
      const double sin_off = f.e_sin / d;
      r = d * std::sqrt(1.0 - sin_off * sin_off) - f.e_cos;
    }
    if (r < 0.0 || r > s.tooth.radius_mm) return kInf;
    return m.z_at(t) + s.tooth.height_mm(r) + f.axial_mm - s.tilt.dot(v);
  }
  // Nearest crossing from t0 in direction dir; NaN when none before the walk ends.
  double walk(const Family& f, double t0, double dir) const {
    const double turn = std::abs(spin_per_t);
    const double t_limit = std::clamp(t0 + dir * kWalkRevolutions * kTwoPi / turn, 0.0, 1.0);
    const double spin_step = kSpinStepFraction * f.period / turn;
    double t = t0, bearing = bearing_raw(t0);
    double g = lattice_value(f, t0, bearing, bearing);
    for (int step = 0; step < kMaxSteps && (t_limit - t) * dir > 0.0; ++step) {
      const double d = (p - m.point_at(t)).norm();
      const double geo_step = speed_per_t > 0.0 ? kBearingStepRad * d / speed_per_t : kInf;
      const double h = std::max(std::min(spin_step, geo_step), spin_step / kMinStepDivisor);
      const double tn = dir > 0.0 ? std::min(t + h, t_limit) : std::max(t - h, t_limit);
      double bearing_n = 0.0;
      const double gn = lattice_value(f, tn, bearing, bearing_n);
      double target = 0.0;
      bool hit = false;
      if (gn > g) {
        target = f.target + f.period * std::ceil((g - f.target) / f.period);
        hit = target <= gn;
      } else if (gn < g) {
        target = f.target + f.period * std::floor((g - f.target) / f.period);
        hit = target >= gn;
      }
      if (hit) {
        double a = t, b = tn;
        const bool rising = gn > g;
        for (int it = 0; it < kBisectIter; ++it) {
          const double mid = 0.5 * (a + b);
          double unused = 0.0;
          const double gm = lattice_value(f, mid, bearing, unused);
          if ((gm < target) == rising)
            a = mid;
          else
            b = mid;
        }
        return 0.5 * (a + b);
      }
      t = tn;
      g = gn;
      bearing = bearing_n;
    }
    return std::numeric_limits<double>::quiet_NaN();
  }
};

}  // namespace

double teeth_generic_mm(const SweepSetup& setup, const PreparedMove& move,
                        const Eigen::Vector2d& p_mm, double bound_mm) {
  MoveMinima minima;
  if (move.vertical()) {
    const Eigen::Vector2d v = p_mm - move.a_mm;
    const double d = v.norm();
    if (d > setup.envelope.reach_mm) return kInf;
    minima.value_mm = move.z_min_mm + setup.envelope.height_mm(d) - setup.tilt.dot(v);
    minima.count = 1;
    minima.t[0] = move.z0_mm <= move.z1_mm ? 0.0 : 1.0;
  } else {
    minima = arc_minima(setup, setup.envelope, move, p_mm);
  }
  if (!(minima.value_mm + setup.axial_min_mm < bound_mm)) return kInf;

  const Follow fw{setup, move, p_mm, setup.omega_rad_per_s * move.duration_s, move.length_xy_mm};
  const int families = setup.teeth_alike ? 1 : setup.teeth;
  double best = kInf;
  for (int k = 0; k < families; ++k) {
    Family f;
    if (setup.teeth_alike) {
      f.period = kTwoPi / setup.teeth;
      f.axial_mm = setup.axial_mm[0];
    } else {
      const double spacing = kTwoPi * k / setup.teeth;
      const double beta = setup.runout_phase_rad - spacing;
      f.target = spacing;
      f.e_sin = setup.runout_mm * std::sin(beta);
      f.e_cos = setup.runout_mm * std::cos(beta);
      f.axial_mm = setup.axial_mm[k];
    }
    for (int i = 0; i < minima.count; ++i) {
      for (double dir : {-1.0, 1.0}) {
        const double t = fw.walk(f, minima.t[i], dir);
        if (t == t) best = std::min(best, fw.height(f, t));
      }
    }
  }
  return best;
}

}  // namespace cuspmap

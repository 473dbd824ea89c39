// Inverse stepover: closed-form inverses where the forward form inverts, bisection otherwise.
// Inputs: CuspSetup or radius, target kind and value (um); output: StepoverSolution (mm).
// Method: inverses of the cusp closed forms; bisection on the increasing forward model.
#include "cusp/inverse_stepover.h"

#include <cassert>
#include <cmath>
#include <functional>
#include <numbers>

#include "core/units.h"
#include "cusp/cross_feed_cusp.h"
#include "cusp/feed_mark.h"
#include "cusp/scallop_ball.h"
#include "cusp/scallop_bullnose.h"
#include "cusp/scallop_curved.h"

namespace cuspmap {
namespace {

// Bisection stops when the stepover bracket is this fraction of the stepover (the issue's
// "1e-12 relative"); the forward model itself is accurate to about this level.
constexpr double kStepoverRelTol = 1e-12;
// The model's upper end (passes just touching) is excluded by this fraction: the largest
// reachable value is taken a hair inside it, where the geometry is still well posed.
constexpr double kEdgeRel = 1e-9;
// How far past the model's range the approximation's bracket may grow (by doubling): 2^40.
constexpr int kMaxBracketDoublings = 40;

double target_of(const CuspResult& r, FinishTarget target, bool approx) {
  const ProfileStats& st = approx ? r.stats_approx : r.stats;
  switch (target) {
    case FinishTarget::Scallop:
      return approx ? r.scallop_approx_um : r.scallop_um;
    case FinishTarget::Ra:
      return st.ra_um;
    case FinishTarget::Rz:
      return st.rz_um;
  }
  return 0.0;
}

// x in [lo, hi] with f(x) = target, f increasing, f(lo) <= target <= f(hi).
double solve_increasing(const std::function<double(double)>& f, double lo, double hi,
                        double target) {
  for (int iter = 0; iter < 400 && hi - lo > kStepoverRelTol * hi; ++iter) {
    const double mid = 0.5 * (lo + hi);
    if (f(mid) < target) {
      lo = mid;
    } else {
      hi = mid;
    }
  }
  return 0.5 * (lo + hi);
}

// Stepover the approximation needs, growing the bracket past the model's range if required.
double approx_stepover(const std::function<double(double)>& approx, double lo, double hi,
                       double target) {
  for (int k = 0; k < kMaxBracketDoublings && approx(hi) < target; ++k) hi *= 2.0;
  if (approx(hi) < target) return 0.0;
  return solve_increasing(approx, lo, hi, target);
}

// Closed-form exact stepover for a height target, or a negative value when none applies.
double closed_form_for_height(const CuspSetup& setup, double h_mm) {
  const Cutter& c = setup.cutter;
  const double big_r = c.radius_mm(), rc = c.effective_corner_mm();
  if (setup.surface != SurfaceKind::Plane) {
    return curved_stepover_for_scallop_mm(big_r, setup.surface_radius_mm,
                                          setup.surface == SurfaceKind::Convex, h_mm);
  }
  const double slope_rad = std::abs(setup.slope_deg) * std::numbers::pi / 180.0;
  if (c.shape == CutterShape::Ball) {
    const double s = ball_chord_for_scallop_mm(big_r, h_mm) * std::cos(slope_rad);
    return s <= ball_sphere_limit_mm(big_r, setup.slope_deg) ? s : -1.0;
  }
  if (slope_rad == 0.0 && rc > 0.0) return bullnose_stepover_for_scallop_mm(big_r, rc, h_mm);
  if (slope_rad > 0.0 && rc == 0.0) return h_mm / std::sin(slope_rad);  // saw-tooth s sin(a)
  return -1.0;
}

}  // namespace

StepoverSolution inverse_stepover(const CuspSetup& setup, FinishTarget target, double target_um) {
  assert(target_um > 0.0 && "target must be positive");
  StepoverSolution sol;
  const Cutter& c = setup.cutter;
  const double big_r = c.radius_mm();
  double s_lo = 0.0, s_hi = 2.0 * big_r;
  // A tilted face leaves a cusp at any stepover (scallop_tilted.h) and has no closed inverse.
  const bool tilted = c.tilt_deg != 0.0;
  if (setup.surface == SurfaceKind::Plane) {
    if (setup.slope_deg == 0.0 && c.shape != CutterShape::Ball && !tilted) {
      s_lo = 2.0 * c.flat_radius_mm();
    }
  } else {
    const bool convex = setup.surface == SurfaceKind::Convex;
    if (!convex && setup.surface_radius_mm <= big_r) return sol;  // the ball cannot follow it
    s_hi = curved_reach_mm(big_r, setup.surface_radius_mm, convex);
  }
  auto exact = [&](double s) { return target_of(cross_feed_cusp(setup, s), target, false); };
  auto approx = [&](double s) { return target_of(cross_feed_cusp(setup, s), target, true); };
  // The supremum is the value where neighbouring passes just touch; it is not attained.
  const double s_top = s_hi * (1.0 - kEdgeRel);
  sol.max_target_um = s_top > s_lo ? exact(s_hi) : 0.0;
  if (!(target_um < sol.max_target_um)) return sol;
  sol.reachable = true;
  double s = -1.0;
  if (target != FinishTarget::Ra && !tilted) {
    s = closed_form_for_height(setup, target_um / kUmPerMm);
  }
  if (!(s > 0.0)) s = solve_increasing(exact, s_lo, s_top, target_um);
  sol.stepover_mm = s;
  sol.cusp = cross_feed_cusp(setup, s);
  sol.stepover_approx_mm = approx_stepover(approx, s_lo, s_hi, target_um);
  return sol;
}

StepoverSolution inverse_feed_mark(double radius_mm, FinishTarget target, double target_um) {
  assert(radius_mm > 0.0 && target_um > 0.0 && "circle marks need r > 0 and a target > 0");
  StepoverSolution sol;
  const double f_top = 2.0 * radius_mm * (1.0 - kEdgeRel);
  auto exact = [&](double f) { return target_of(feed_mark(radius_mm, f), target, false); };
  sol.max_target_um = exact(2.0 * radius_mm);  // marks just touching: the supremum
  if (!(target_um < sol.max_target_um)) return sol;
  sol.reachable = true;
  const double h_mm = target_um / kUmPerMm;
  sol.stepover_mm = target == FinishTarget::Ra ? solve_increasing(exact, 0.0, f_top, target_um)
                                               : ball_chord_for_scallop_mm(radius_mm, h_mm);
  sol.cusp = feed_mark(radius_mm, sol.stepover_mm);
  // Rt = f^2/(8r) and Ra = f^2/(18 sqrt(3) r), solved for f.
  sol.stepover_approx_mm = target == FinishTarget::Ra
                               ? std::sqrt(18.0 * std::sqrt(3.0) * radius_mm * h_mm)
                               : std::sqrt(8.0 * radius_mm * h_mm);
  return sol;
}

}  // namespace cuspmap

// Profile likelihoods of the floor fit (see fit_profiles.h).
// Inputs: FitResidual at the optimum; outputs: sigmas, intervals. Cost: <= 13 x 30 + 9 x 2
// compass searches of sweeps. Method: Bates & Watts 1988 §6.1; Moré 1978 (MINPACK lmder).
#include "infer/fit_profiles.h"

#include <algorithm>
#include <cmath>
#include <numbers>
#include <Eigen/Dense>
#include <unsupported/Eigen/NonLinearOptimization>

#include "infer/compass_search.h"

namespace cuspmap {
namespace {

// Profile over the tilt direction: directions tried (every 15 deg from the lay, the along
// sign being folded), sweeps each, and the cost rise that bounds the interval (9 residual
// variances: 3 sigma of one parameter, Bates & Watts 1988 §6.1 likelihood intervals).
constexpr int kProfileDirections = 13;
constexpr int kProfileSweeps = 30;
// Relative stepover moves of the stepover profile, growing: the first one that leaves the
// floor's 3-sigma cost ends it (1e-5 relative is below every sigma the round trips report).
constexpr double kStepoverProfileSteps[] = {1e-5, 2e-5, 5e-5, 1e-4, 2e-4, 5e-4, 1e-3, 2e-3, 5e-3};

}  // namespace

// Profile likelihood over the tilt direction (Bates & Watts 1988 §6.1): the cost re-minimised
// over the magnitude and pass offset with the direction held at each of kProfileDirections;
// directions whose cost stays within kProfileSigmas^2 residual variances of the optimum are
// consistent with the floor, and so are their magnitudes. Where passes overlap so that a tilted
// rim leaves only shallow cusps, the cusp depends on tan(tilt) / cos^2(direction) alone
// (derived: the rim's curvature at its lowest point), and the linearised sigma at the optimum
// does not see that ridge; the profile does.
void profile_direction(const FitResidual& res, double best_cost, FloorFit& fit) {
  const Eigen::VectorXd& p = res.full;
  const double t_hat = std::hypot(p[kTiltAlongDeg], p[kTiltAcrossDeg]);
  if (t_hat <= 0.0) return;
  const double dir_hat = std::atan2(p[kTiltAcrossDeg], p[kTiltAlongDeg]);
  const double var = best_cost / std::max(1, res.samples() - res.inputs() - 3);
  const double limit = best_cost + kProfileSigmas * kProfileSigmas * var;
  double t_lo = t_hat, t_hi = t_hat, d_lo = dir_hat, d_hi = dir_hat;
  FitResidual all = res;
  all.free_index = {kTiltAlongDeg, kTiltAcrossDeg, kStepoverMm, kOffsetMm};
  for (int k = 0; k < kProfileDirections; ++k) {
    const double dir = (-90.0 + 180.0 * k / (kProfileDirections - 1)) * std::numbers::pi / 180.0;
    DirectionResidual dr;
    dr.base = &all;
    dr.dir_rad = dir;
    dr.stepover_mm = p[kStepoverMm];
    // Start on the ridge of equal cusp curvature, tan(t) / cos^2(direction) = const.
    const double c_hat = std::max(std::cos(dir_hat) * std::cos(dir_hat), 0.1);
    const double t0 = std::clamp(t_hat * std::cos(dir) * std::cos(dir) / c_hat, 0.1 * t_hat,
                                 3.0 * t_hat);
    // The cusps stay where the floor has them: the pass centres sit a sin(direction) (a = the
    // rim radius) to the side of the rim's lowest point (derived).
    const double a = 0.5 * res.model->cutter.diameter_mm;
    const double s = p[kStepoverMm];
    double off = p[kOffsetMm] - a * (std::sin(dir) - std::sin(dir_hat));
    off -= s * std::round(off / s);
    Eigen::VectorXd x(2);
    x << t0, off;
    Eigen::LevenbergMarquardt<DirectionResidual> lm(dr);
    lm.parameters.maxfev = kProfileSweeps;
    lm.parameters.xtol = kSolverTolerance;
    lm.parameters.ftol = kSolverTolerance;
    lm.minimize(x);
    Eigen::VectorXd f;
    dr(x, f);
    fit.evaluations += dr.sweeps;
    if (f.squaredNorm() > limit) continue;
    t_lo = std::min(t_lo, std::abs(x[0]));
    t_hi = std::max(t_hi, std::abs(x[0]));
    d_lo = std::min(d_lo, dir);
    d_hi = std::max(d_hi, dir);
  }
  // The interval spans +-kProfileSigmas sigma: its wider half over kProfileSigmas is one sigma.
  fit.tilt_profile_sigma_deg = std::max(t_hi - t_hat, t_hat - t_lo) / kProfileSigmas;
  fit.direction_profile_sigma_deg =
      std::max(d_hi - dir_hat, dir_hat - d_lo) * 180.0 / std::numbers::pi / kProfileSigmas;
  fit.tilt_interval_deg = {t_lo, t_hi};
}

// Profile of the cost over the stepover (Bates & Watts 1988 §6.1): the stepover moved by a
// ladder of relative steps either way, the pass offset re-minimised by compass search at each;
// the largest move whose cost stays within kProfileSigmas^2 variances of the optimum is
// kProfileSigmas sigma. Where the rim leaves steps between passes the cost is flat between
// sample rows and jumps across them, and the Jacobian's sigma follows whichever the
// difference happened to span (30x too small on a random round trip); the profile does not.
double stepover_profile_sigma_mm(const FitResidual& res, double best_cost, double var,
                                 int& evaluations) {
  const Eigen::VectorXd& p = res.full;
  const double s = p[kStepoverMm];
  const double limit = best_cost + kProfileSigmas * kProfileSigmas * var;
  FitResidual off = res;
  off.free_index = {kOffsetMm};
  double inside = 0.0;  // largest relative move still consistent with the floor
  for (const double rel : kStepoverProfileSteps) {
    bool consistent = false;
    for (const double sign : {1.0, -1.0}) {
      off.full = p;
      off.full[kStepoverMm] = s * (1.0 + sign * rel);
      Eigen::VectorXd x(1), step(1), final_step(1);
      x << p[kOffsetMm];
      step << rel * s;
      final_step << 0.05 * rel * s;
      const auto cost = [&off](const Eigen::VectorXd& xc) {
        Eigen::VectorXd fc;
        off(xc, fc);
        return fc.squaredNorm();
      };
      if (compass_search(cost, x, step, final_step, evaluations) <= limit) consistent = true;
    }
    if (!consistent) break;
    inside = rel;
  }
  return inside * s / kProfileSigmas;
}

}  // namespace cuspmap

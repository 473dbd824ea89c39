// Profile likelihoods of the floor fit (see fit_profiles.h).
// Inputs: FitResidual at the optimum; outputs: sigmas, intervals. Cost: <= (13 + 6) x 30 + 9 x 2
// compass searches of sweeps. Method: Bates & Watts 1988 §6.1; Moré 1978 (MINPACK lmder).
#include "infer/fit_profiles.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <numbers>
#include <utility>
#include <vector>
#include <Eigen/Dense>
#include <unsupported/Eigen/NonLinearOptimization>

#include "core/parallel_blocks.h"
#include "infer/compass_search.h"

namespace cuspmap {
namespace {

// Profile over the tilt direction: directions tried (every 15 deg from the lay, the along
// sign being folded), sweeps each, and the cost rise that bounds the interval (9 residual
// variances: 3 sigma of one parameter, Bates & Watts 1988 §6.1 likelihood intervals).
constexpr int kProfileDirections = 13;
constexpr int kProfileSweeps = 30;
// Halvings of the step between the outermost consistent direction and the next refused one, on
// either side: 15 deg / 2^3 = 1.9 deg, finer than a resolved direction's 10 deg tolerance.
constexpr int kProfileRefinements = 3;
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
void profile_direction(const FitResidual& res, double best_cost, double var, FloorFit& fit) {
  const Eigen::VectorXd& p = res.full;
  const double t_hat = std::hypot(p[kTiltAlongDeg], p[kTiltAcrossDeg]);
  if (t_hat <= 0.0) return;
  const double dir_hat = std::atan2(p[kTiltAcrossDeg], p[kTiltAlongDeg]);
  const double limit = best_cost + kProfileSigmas * kProfileSigmas * var;
  // One point of the profile: the cost re-minimised with the direction held at dir (rad).
  // Pure (its own copy of the residual), so the fan runs on parallel blocks.
  struct Point {
    bool inside = false;  // within the limit: consistent with the floor
    double tilt_deg = 0.0;
    int sweeps = 0;
  };
  const auto try_direction = [&](double dir) {
    FitResidual all = res;
    all.free_index = {kTiltAlongDeg, kTiltAcrossDeg, kStepoverMm, kOffsetMm};
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
    return Point{f.squaredNorm() <= limit, std::abs(x[0]), dr.sweeps};
  };
  double t_lo = t_hat, t_hi = t_hat, d_lo = dir_hat, d_hi = dir_hat;
  const auto record = [&](double dir, const Point& pt) {
    fit.evaluations += pt.sweeps;
    if (!pt.inside) return;
    t_lo = std::min(t_lo, pt.tilt_deg);
    t_hi = std::max(t_hi, pt.tilt_deg);
    d_lo = std::min(d_lo, dir);
    d_hi = std::max(d_hi, dir);
  };
  const double step = std::numbers::pi / (kProfileDirections - 1);
  std::vector<Point> fan(kProfileDirections);
  parallel_blocks(kProfileDirections, res.model->threads, [&](int k) {
    fan[static_cast<size_t>(k)] = try_direction(-0.5 * std::numbers::pi + step * k);
  });
  std::vector<double> rejected;
  for (int k = 0; k < kProfileDirections; ++k) {
    const double dir = -0.5 * std::numbers::pi + step * k;
    record(dir, fan[static_cast<size_t>(k)]);
    if (!fan[static_cast<size_t>(k)].inside) rejected.push_back(dir);
  }
  // The fan's step is coarser than the ridge can be narrow: the edge of the consistent
  // directions lies anywhere between the outermost one found and the next one refused, and
  // with it the magnitudes (a bull-nose round trip read 0.0693 +- 0.0014 deg for 0.0592, the
  // profile interval missing the truth). Bisect each edge (kProfileRefinements halvings; the
  // two edges on parallel blocks, their points recorded in order).
  std::vector<std::pair<double, Point>> edge[2];
  parallel_blocks(2, res.model->threads, [&](int e) {
    const double side = e == 0 ? 1.0 : -1.0;
    double in = side > 0.0 ? d_hi : d_lo, out = std::numeric_limits<double>::infinity();
    for (const double r : rejected) {
      if (side * (r - in) > 0.0 && std::abs(r - in) < std::abs(out - in)) out = r;
    }
    if (!std::isfinite(out)) return;
    for (int k = 0; k < kProfileRefinements; ++k) {
      const double mid = 0.5 * (in + out);
      const Point pt = try_direction(mid);
      edge[e].emplace_back(mid, pt);
      (pt.inside ? in : out) = mid;
    }
  });
  for (const auto& points : edge) {
    for (const auto& [dir, pt] : points) record(dir, pt);
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

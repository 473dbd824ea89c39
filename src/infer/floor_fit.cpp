// Inverse simulation: a coarse start search over the pass offset and tilt, Levenberg-Marquardt
// with the setup plane projected out of the residual, covariance sigma^2 (J^T J)^-1 at the
// optimum (window: fit_window, residuals: fit_residual, profiles: fit_profiles).
// Inputs: Heightfield, SurfaceEstimates, FloorFitOptions; output: FloorFit. Cost: see header.
// Method: Moré 1978 (MINPACK lmder, Eigen unsupported NonLinearOptimization); variable
// projection for the linear plane (Golub & Pereyra 1973); covariance as in Bates & Watts 1988.
#include "infer/floor_fit.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <numbers>
#include <utility>
#include <vector>
#include <Eigen/Dense>

#include <unsupported/Eigen/NonLinearOptimization>

#include "core/parallel_blocks.h"
#include "core/units.h"
#include "infer/band_means.h"
#include "infer/compass_search.h"
#include "infer/fit_profiles.h"
#include "infer/fit_residual.h"
#include "infer/fit_starts.h"
#include "infer/fit_uncertainty.h"
#include "infer/fit_window.h"
#include "infer/residual_correlation.h"

namespace cuspmap {
namespace {

// Start search: pass offsets tried per stepover, and tilt components (deg) tried (common
// practice, no source: tram errors of 0.005-0.1 deg are what a shop meets).
// Every pair of these (along >= 0, across of either sign) is a start (common practice, no
// source: tram errors of 0.005-0.2 deg are what a shop meets); roughly geometric steps.
constexpr double kStartTiltDeg[] = {0.0, 0.005, 0.01, 0.02, 0.035, 0.05, 0.075, 0.1, 0.15, 0.2};
// Solver limits: sweeps the solver may run (its tolerance: kSolverTolerance, fit_residual.h).
constexpr int kMaxSolverSweeps = 200;
// Solver evaluations (each with a Jacobian of up to 4 more sweeps) granted to each start before
// the best one is polished: enough to leave a wrong basin's start visibly worse (derived from
// the round trips), few enough to keep the command near a second.
constexpr int kStartSolverEvaluations = 12;
// Starts the solver runs from (the best of the start grid; derived: 4 covers the neighbouring
// offset and tilt basins on the round-trip floors of tests/infer/floor_fit_test.cpp).
constexpr size_t kSolverStarts = 4;
// Restarts of the solver from its best optimum, and the relative cost gain that earns another.
constexpr int kPolishRuns = 4;
constexpr double kPolishGain = 1e-3;
// Compass search after the solver: initial steps (0.002 deg: several times a resolved tilt's
// sigma; 1e-3 of the stepover) and final ones (1e-5 deg and 1e-6 of the stepover, well below
// the sigmas the round trips report; derived).
constexpr double kCompassTiltStepDeg = 2e-3;
constexpr double kCompassPeriodStep = 1e-3;
constexpr double kCompassFinalTiltDeg = 1e-5;
constexpr double kCompassFinalPeriod = 1e-6;
// The lay's: 0.02 deg (the surface estimate's error, derived from the round trips) to 1e-4 deg
// (a pass drifts 0.02 um across a 10 mm window).
constexpr double kCompassLayStepDeg = 0.02;
constexpr double kCompassFinalLayDeg = 1e-4;
// The model check's strip: this many times finer than the fit's (the interpolation error falls
// as the cell squared, so the shift to it is ~15/16 of the shift to the exact profile; derived).
constexpr double kModelCheckRefinement = 4.0;

// Start for the tilt across the feed, deg: inside each pass band the floor is the tilted end
// face, so the band means across the lay rise at -tan(across) (+ = toward lay + 90 deg, where
// the face is low; derived, first-order tilt) between the steps at the pass edges; the median
// of their differences skips the steps (one per stepover) and averages the noise.
double across_tilt_start_deg(const Heightfield& hf, const SurfaceEstimates& e) {
  const BandMeans b = band_means(remove_plane(hf, e.setup_plane), e.lay_deg);
  if (b.z_um.size() < 3) return 0.0;
  std::vector<double> d;
  for (size_t k = 1; k < b.z_um.size(); ++k) d.push_back(b.z_um[k] - b.z_um[k - 1]);
  std::nth_element(d.begin(), d.begin() + d.size() / 2, d.end());
  const double slope = d[d.size() / 2] / b.spacing_mm / 1000.0;  // um per mm -> mm per mm
  return -std::atan(slope) * 180.0 / std::numbers::pi;
}

}  // namespace

FloorFit fit_floor(const Heightfield& hf, const SurfaceEstimates& e, const FloorFitOptions& o) {
  const double stepover = e.stepover.period_mm;
  FitWindow w = make_fit_window(hf, stepover);
  FloorFit fit;
  fit.model.cutter = o.cutter;
  fit.model.cutter.tilt_deg = 0.0;
  fit.model.cutter.runout_mm = 0.0;
  fit.model.lay_deg = e.lay_deg;
  fit.model.direction = o.direction;
  fit.model.window = w.patch;
  fit.model.threads = o.threads;
  fit.model.stylus_tip_mm = o.stylus_tip_um / kUmPerMm;
  // The samples' across-lay coordinates for a lay (refined below).
  const auto set_lay = [&](double lay_deg) {
    fit.model.lay_deg = lay_deg;
    w.v.clear();
    double v_abs = 0.0;
    for (const int i : w.index) {
      const double v = across_lay_mm(fit.model, w.measured.x_mm(i % w.measured.nx),
                                     w.measured.y_mm(i / w.measured.nx));
      w.v.push_back(v);
      v_abs = std::max(v_abs, std::abs(v));
    }
    w.v_max_mm = v_abs + stepover;
  };
  set_lay(e.lay_deg);
  fit.sample_mm = w.measured.cell_mm;
  fit.samples = static_cast<int>(w.index.size());
  // A ball is tilt-invariant apart from the contact shift (DESIGN.md): tilt stays fixed at 0.
  const bool tilt_shows = o.cutter.shape != CutterShape::Ball;
  fit.free = {tilt_shows, tilt_shows, true, true};

  FitResidual res;
  res.model = &fit.model;
  res.window = &w;
  res.full = Eigen::VectorXd::Zero(kFitParams);
  res.full[kStepoverMm] = stepover;
  // The surface estimate of the stepover (autocorrelation, independent of the model) enters as
  // a prior: one residual (stepover - estimate) sigma_r / sigma_estimate, sigma_r taken as the
  // window's rms about its plane (an upper bound of the noise: the prior weighs at least as
  // much as it should). Without it a floor the model barely moves (faint tilt, strong tooth
  // marks) lets the stepover wander to fit the marks (Bates & Watts 1988, prior as data).
  res.stepover0_mm = stepover;
  {
    Eigen::VectorXd meas(static_cast<int>(w.index.size()));
    for (size_t k = 0; k < w.index.size(); ++k) {
      meas[static_cast<int>(k)] = w.measured.z_um(w.index[k] / w.measured.nx, w.index[k] % w.measured.nx);
    }
    const double scale = residual_rms(meas - w.q * (w.q.transpose() * meas));
    res.prior_weight = scale / std::max(e.stepover_prior_sigma_mm, 1e-6 * stepover);
  }
  for (int k = 0; k < kFitParams; ++k) {
    if (fit.free[static_cast<size_t>(k)]) res.free_index.push_back(k);
  }

  // Start search: the cost is periodic in the offset, has a fold at zero along-tilt (the
  // revolving envelope is the same with the lowest point ahead or behind) and narrow basins in
  // the offset where passes step, so LM starts from the best of a dense grid of tilts, each
  // with its best offset, scanned on strip sweeps (fit_starts) rather than window sweeps.
  std::vector<double> alongs{0.0}, acrosses{0.0};
  if (tilt_shows) {
    alongs.assign(std::begin(kStartTiltDeg), std::end(kStartTiltDeg));
    acrosses.clear();
    for (const double t : kStartTiltDeg) {
      acrosses.push_back(t);
      if (t > 0.0) acrosses.push_back(-t);
    }
    acrosses.push_back(across_tilt_start_deg(hf, e));
  }
  Eigen::MatrixXd xy(static_cast<Eigen::Index>(w.index.size()), 2);
  Eigen::VectorXd zs(static_cast<Eigen::Index>(w.index.size()));
  for (size_t k = 0; k < w.index.size(); ++k) {
    const int a = w.index[k] % w.measured.nx, b = w.index[k] / w.measured.nx;
    xy.row(static_cast<Eigen::Index>(k)) << w.measured.x_mm(a), w.measured.y_mm(b);
    zs[static_cast<Eigen::Index>(k)] = w.measured.z_um(b, a);
  }
  int strip_sweeps = 0;
  std::vector<std::pair<double, Eigen::VectorXd>> starts;
  for (const FitStart& s : fit_starts(fit.model, res.full, xy, zs, alongs, acrosses, strip_sweeps)) {
    starts.emplace_back(s.cost, s.params);
  }
  fit.evaluations += strip_sweeps;
  // The solver from the few best starts; the lowest optimum wins (the faint floors of small
  // tilts have neighbouring basins a single start can fall into).
  std::sort(starts.begin(), starts.end(),
            [](const auto& l, const auto& r) { return l.first < r.first; });
  const FitResidual base = res;
  double best_cost = std::numeric_limits<double>::infinity();
  Eigen::VectorXd best_x;
  // The starts' runs are independent (each its own residual copy): parallel blocks, compared in
  // order afterwards (the same result for any thread count).
  struct StartRun {
    double cost = 0.0;
    Eigen::VectorXd params;
    int status = 0;
    int sweeps = 0;
  };
  std::vector<StartRun> runs(std::min<size_t>(kSolverStarts, starts.size()));
  parallel_blocks(static_cast<int>(runs.size()), o.threads, [&](int k) {
    FitResidual trial = base;
    trial.full = starts[static_cast<size_t>(k)].second;
    Eigen::VectorXd xk(trial.inputs());
    for (int i = 0; i < trial.inputs(); ++i) {
      xk[i] = trial.full[trial.free_index[static_cast<size_t>(i)]];
    }
    Eigen::LevenbergMarquardt<FitResidual> lm(trial);
    lm.parameters.maxfev = kStartSolverEvaluations;
    lm.parameters.xtol = kSolverTolerance;
    lm.parameters.ftol = kSolverTolerance;
    StartRun& run = runs[static_cast<size_t>(k)];
    run.status = static_cast<int>(lm.minimize(xk));
    Eigen::VectorXd fk;
    trial(xk, fk);
    run.cost = fk.squaredNorm();
    run.params = trial.expand(xk);
    run.sweeps = trial.sweeps;
  });
  for (const StartRun& run : runs) {
    res.sweeps += run.sweeps;
    if (run.cost < best_cost) {
      best_cost = run.cost;
      best_x = run.params;
      fit.solver_status = run.status;
    }
  }
  // The start runs end where LM's damping has grown on the crests' kinks; a fresh run from the
  // best optimum (damping reset) continues along the stepover-offset valley until it gains
  // nothing (common practice for restarted trust-region solvers, Nocedal & Wright 2006 §4).
  // The prior is then weighed by the fit's own residual rms (the noise plus the model's error)
  // rather than the measured rms, which let it pull a well-fitted stepover by its full sigma.
  for (int polish = 0; polish < kPolishRuns; ++polish) {
    FitResidual trial = base;
    trial.full = best_x;
    if (polish == 0) {
      Eigen::VectorXd xb(trial.inputs()), fb;
      for (int i = 0; i < trial.inputs(); ++i) xb[i] = best_x[trial.free_index[static_cast<size_t>(i)]];
      trial(xb, fb);
      res.prior_weight = std::min(res.prior_weight, residual_rms(fb.head(trial.samples())) /
                                                        std::max(e.stepover_prior_sigma_mm, 1e-6 * stepover));
      trial.prior_weight = res.prior_weight;
      trial(xb, fb);
      best_cost = fb.squaredNorm();
    }
    Eigen::VectorXd xk(trial.inputs());
    for (int i = 0; i < trial.inputs(); ++i) xk[i] = best_x[trial.free_index[static_cast<size_t>(i)]];
    Eigen::LevenbergMarquardt<FitResidual> lm(trial);
    lm.parameters.maxfev = kMaxSolverSweeps;
    lm.parameters.xtol = kSolverTolerance;
    lm.parameters.ftol = kSolverTolerance;
    const int status = static_cast<int>(lm.minimize(xk));
    Eigen::VectorXd fk;
    trial(xk, fk);
    res.sweeps += trial.sweeps;
    if (fk.squaredNorm() >= best_cost * (1.0 - kPolishGain)) {
      if (fk.squaredNorm() < best_cost) best_cost = fk.squaredNorm(), best_x = trial.expand(xk);
      break;
    }
    best_cost = fk.squaredNorm();
    best_x = trial.expand(xk);
    fit.solver_status = status;
  }
  // The lay joins the fit here: the surface estimate is good to ~0.05 deg, and passes that
  // drift against the model's lines by that much across the window shift the passes near its
  // corners (their samples lie off the window's centre along the lay) and so bias the stepover
  // (a 5 mm flat at 1.455 mm stepover, lay 131.1 deg read as 131.05: stepover 0.02 % long at
  // 30 of its sigma). LM, in turn, stops where the crests' kinks and the rim's steps make its
  // difference quotients disagree with the cost. A compass search over the parameters and the
  // lay, which needs no derivative, finishes the descent (envelope model only: the tooth model
  // sweeps the whole window per evaluation).
  const int lay_k = res.inputs();
  if (!fit.model.tooth_marks) {
    FitResidual trial = base;
    trial.prior_weight = res.prior_weight;
    trial.full = best_x;
    Eigen::VectorXd xk(lay_k + 1), step(lay_k + 1), final_step(lay_k + 1);
    for (int i = 0; i < lay_k; ++i) {
      const int which = trial.free_index[static_cast<size_t>(i)];
      xk[i] = best_x[which];
      const bool tilt = which == kTiltAlongDeg || which == kTiltAcrossDeg;
      step[i] = tilt ? kCompassTiltStepDeg : kCompassPeriodStep * stepover;
      final_step[i] = tilt ? kCompassFinalTiltDeg : kCompassFinalPeriod * stepover;
    }
    xk[lay_k] = fit.model.lay_deg;
    step[lay_k] = kCompassLayStepDeg;
    final_step[lay_k] = kCompassFinalLayDeg;
    const auto cost = [&](const Eigen::VectorXd& xc) {
      if (xc[lay_k] != fit.model.lay_deg) set_lay(xc[lay_k]);
      Eigen::VectorXd fc;
      trial(xc.head(lay_k), fc);
      return fc.squaredNorm();
    };
    int compass_evaluations = 0;
    const double c = compass_search(cost, xk, step, final_step, compass_evaluations);
    res.sweeps += compass_evaluations;
    if (c < best_cost) {
      best_cost = c;
      best_x = trial.expand(xk.head(lay_k));
      set_lay(xk[lay_k]);
    } else {
      set_lay(e.lay_deg);
    }
  }
  res.full = best_x;
  // The envelope cannot tell the lowest point ahead from behind: report the fold >= 0.
  res.full[kTiltAlongDeg] = std::abs(res.full[kTiltAlongDeg]);
  Eigen::VectorXd x(res.inputs());
  for (int k = 0; k < res.inputs(); ++k) x[k] = res.full[res.free_index[static_cast<size_t>(k)]];
  fit.params = res.full;

  // Covariance at the optimum: sigma^2 (J^T J)^-1, sigma^2 = |r|^2 / (m - free - 3 plane).
  Eigen::VectorXd f;
  res(x, f);
  Eigen::MatrixXd jac;
  res.df(x, jac);
  const int dof = std::max(1, res.samples() - res.inputs() - 3);
  // Residuals that the model leaves with structure (feed marks, a model error repeating every
  // pass) are correlated: the variance is scaled by the residual's integrated autocorrelation
  // time along both axes (m / m_eff; Box & Jenkins, Time Series Analysis, §2.1.6), 1 for noise.
  fit.correlation_factor =
      correlation_factor(w.measured.nx, w.measured.ny, w.index, f.head(res.samples()));
  const double var = std::max(
      f.head(res.samples()).squaredNorm() / dof * fit.correlation_factor,
      line_mean_variance(w.v, w.measured.cell_mm, f.head(res.samples()), res.inputs()));
  // The direction profile's cost limit uses the same variance: a residual with structure (a
  // weak fit) moves the cost by more than plain noise would, and the limit of 9 noise variances
  // left the truth outside the profiled interval on a bull-nose in the ridge regime (oracle).
  if (tilt_shows && res.inputs() == kFitParams) {
    profile_direction(res, best_cost, var, fit);
  }
  const Eigen::MatrixXd jtj = jac.transpose() * jac;
  const Eigen::MatrixXd inv = jtj.completeOrthogonalDecomposition().pseudoInverse();
  fit.covariance = Eigen::MatrixXd::Zero(kFitParams, kFitParams);
  for (int a = 0; a < res.inputs(); ++a) {
    for (int b = 0; b < res.inputs(); ++b) {
      fit.covariance(res.free_index[a], res.free_index[b]) = var * inv(a, b);
    }
  }
  // The model's own discretisation error at the optimum: the profile swept on strip cells
  // kModelCheckRefinement times finer moves the optimum by one Gauss-Newton step, delta =
  // -(J^T J)^-1 J^T (r_fine - r) (derived: J^T r = 0 at the optimum), and delta delta^T joins
  // the covariance (a systematic error of the parameters, added in quadrature; GUM, JCGM
  // 100:2008 §5.1.2). Noise hides it on most floors; on noise-free ones the residual's own
  // variance goes to zero with the model's error while the parameters keep a part of it
  // (random round trips: a noise-free 3.1 mm dished flat read 0.02303 +- 0.00001 deg for
  // 0.023, tools/diagnose_campaign.py seed 2027 rs0). Envelope model only.
  if (!fit.model.tooth_marks) {
    FitModel fine_model = fit.model;
    fine_model.window.cell_mm /= kModelCheckRefinement;
    FitResidual fine = res;
    fine.model = &fine_model;
    Eigen::VectorXd f_fine;
    fine(x, f_fine);
    res.sweeps += 2;
    // Samples within a strip cell of a rim step take the side they fit (FitResidual::raw), a
    // band 4 times narrower on the finer strip: a sample matched on one strip and not on the
    // other (a stylus tip's closing lies between the sides) would count a step as model error
    // (seed 2029 rs10, 10 um tip: 0.0166 deg instead of 0.0002). They are left out of delta
    // (under a given stylus tip the band is the tip's radius on both strips, FitProfile).
    Eigen::VectorXd diff = f_fine - f;
    const FitProfile coarse = simulate_fit_profile(fit.model, fit.params);
    for (int k = 0; k < res.samples(); ++k) {
      double other = 0.0;
      coarse.at(w.v[static_cast<size_t>(k)], &other);
      if (std::isfinite(other)) diff[k] = 0.0;
    }
    const Eigen::VectorXd delta = -(inv * (jac.transpose() * diff));
    for (int a = 0; a < res.inputs(); ++a) {
      for (int b = 0; b < res.inputs(); ++b) {
        fit.covariance(res.free_index[a], res.free_index[b]) += delta[a] * delta[b];
      }
      // The compass search stops when no move of its final step lowers the cost: the optimum
      // is placed only to within that step in each parameter (Kolda, Lewis & Torczon 2003,
      // §3.6: stationarity bounded by the step), its square added. Below every noisy floor's
      // sigma; on a noise-free floor in the ridge regime, where the cost barely changes along
      // the ridge, it is the sigma (seed 2028 rs0: 0.08768 for 0.0877 at a residual of 1e-5 um).
      const int which = res.free_index[static_cast<size_t>(a)];
      const double step = which == kTiltAlongDeg || which == kTiltAcrossDeg
                              ? kCompassFinalTiltDeg
                              : kCompassFinalPeriod * fit.params[kStepoverMm];
      fit.covariance(which, which) += step * step;
    }
  }
  if (!fit.model.tooth_marks) {
    int profile_evaluations = 0;
    fit.stepover_profile_sigma_mm = stepover_profile_sigma_mm(
        res, f.squaredNorm(), var, profile_evaluations);
    fit.evaluations += profile_evaluations;
    // The profile model's own error: linear interpolation between strip cells h apart moved a
    // sharp feature (a rim's step) by up to h / 2, a uniform error of sd h / sqrt(12) on every
    // pass position, which the stepover (a slope through N passes) sees as that over
    // sqrt(N (N^2 - 1) / 12) (derived; least-squares slope). A 5 mm flat at 1.455 mm stepover
    // read 0.02 % long at 3 profile sigmas; with 32 strip cells per sample, 0.012 %. The model
    // now places crests and rim steps where they are (fit_model: the lowest of one pass's
    // profile), so this bounds rather than estimates its error; kept, as the campaigns that
    // validated the stepover's sigma ran with it (docs/diagnose.md, issue 17).
    const double h = fit.model.window.cell_mm / kProfileCellsPerSample;
    const double passes = std::max(2.0, 2.0 * (w.v_max_mm - stepover) / fit.params[kStepoverMm]);
    const double model_sigma =
        h / std::sqrt(12.0) / std::sqrt(passes * (passes * passes - 1.0) / 12.0);
    fit.stepover_profile_sigma_mm = std::hypot(fit.stepover_profile_sigma_mm, model_sigma);
    const double sp = fit.stepover_profile_sigma_mm;
    double& c_ss = fit.covariance(kStepoverMm, kStepoverMm);
    if (sp * sp > c_ss && c_ss > 0.0 && std::isfinite(c_ss)) {
      // Keep the correlations: scale the stepover's row and column.
      const double k = sp / std::sqrt(c_ss);
      fit.covariance.row(kStepoverMm) *= k;
      fit.covariance.col(kStepoverMm) *= k;
    }
  }
  // A column the floor does not move (a parameter it does not show) has no inverse: give it an
  // infinite sigma rather than the pseudo-inverse's zero.
  for (int a = 0; a < res.inputs(); ++a) {
    if (jtj(a, a) <= 0.0) {
      fit.covariance(res.free_index[a], res.free_index[a]) =
          std::numeric_limits<double>::infinity();
    }
  }
  fit.residual_rms_um = residual_rms(f.head(res.samples()));
  fit.evaluations += res.sweeps;  // plus the direction profile's

  // The plane of measured minus simulated, with its standard errors sigma^2 (A^T A)^-1.
  const Eigen::VectorXd r = res.raw(fit.params);
  const Eigen::Vector3d c = w.basis.colPivHouseholderQr().solve(r);
  const Eigen::Matrix3d ata_inv = (w.basis.transpose() * w.basis).inverse();
  fit.setup_plane.x0_mm = w.x0_mm;
  fit.setup_plane.y0_mm = w.y0_mm;
  fit.setup_plane.z0_um = c[0];
  fit.setup_plane.gx_um_per_mm = c[1];
  fit.setup_plane.gy_um_per_mm = c[2];
  fit.plane_sigma_gx_um_per_mm = std::sqrt(var * ata_inv(1, 1));
  fit.plane_sigma_gy_um_per_mm = std::sqrt(var * ata_inv(2, 2));

  // Window pictures: measured and simulated on one datum (measured minus the fitted plane).
  fit.measured = w.measured;
  fit.simulated = simulate_fit_window(fit.model, fit.params);
  ++fit.evaluations;
  fit.residual = w.measured;
  Eigen::VectorXd meas(res.samples());
  for (int k = 0; k < res.samples(); ++k) {
    const int i = w.index[static_cast<size_t>(k)];
    const int a = i % w.measured.nx, b = i / w.measured.nx;
    const float plane = static_cast<float>(fit.setup_plane.at(w.measured.x_mm(a), w.measured.y_mm(b)));
    fit.measured.z_um(b, a) -= plane;
    fit.residual.z_um(b, a) = fit.measured.z_um(b, a) - fit.simulated.z_um(b, a);
    meas[k] = w.measured.z_um(b, a);
  }
  const Eigen::VectorXd detrended = meas - w.q * (w.q.transpose() * meas);
  fit.measured_rms_um = residual_rms(detrended);
  // The profile took one magnitude per direction; each carries its own sigma, so the interval
  // is widened by kProfileSigmas of it (derived: the magnitude's interval at a fixed
  // direction): the linearised one, or on a weak fit the along-feed tilt whose whole effect is
  // the residual rms (fit_uncertainty). With the linearised sigma alone, a bull-nose in the
  // ridge regime (19 % explained) reported 0.050 +- 0.037 deg but an interval of [0.032,
  // 0.054] that missed the true 0.03 (oracle).
  if (tilt_shows && std::hypot(fit.params[kTiltAlongDeg], fit.params[kTiltAcrossDeg]) > 0.0) {
    FloorFit linearised = fit;
    linearised.tilt_profile_sigma_deg = 0.0;
    const double sigma = fitted_errors(linearised).tilt_deg.sigma;
    if (std::isfinite(sigma) && sigma > 0.0) {
      const double widen = kProfileSigmas * sigma;
      fit.tilt_interval_deg.first = std::max(0.0, fit.tilt_interval_deg.first - widen);
      fit.tilt_interval_deg.second += widen;
    }
  }
  return fit;
}

}  // namespace cuspmap

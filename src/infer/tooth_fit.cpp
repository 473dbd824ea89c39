// Tooth-resolved stage: window, start values, the search over the pass pattern's unknowns (the
// along-feed sign, a zigzag's parity), per-pass shifts, the runout scan, the valley walk, the
// phase profile search, the solver and the covariance propagated to runout magnitude and phase.
// Inputs: Heightfield, ToothFitStart, ToothFitOptions; output: ToothFit. Cost: ~6 000 sweeps.
// Method: Kline & DeVor 1983 (runout: tooth k cuts at R + e cos(psi - 2 pi k / Z)); Bates &
// Watts 1988 (covariance, likelihood comparison); GUM §5.1.2 (propagation).
#include "infer/tooth_fit.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <memory>
#include <numbers>
#include <Eigen/Dense>

#include "infer/residual_correlation.h"
#include "infer/tooth_fit_problem.h"
#include "infer/tooth_pass_offset.h"
#include "infer/tooth_phase_search.h"
#include "infer/tooth_runout_scan.h"

namespace cuspmap {
namespace {

constexpr double kDegToRad = std::numbers::pi / 180.0;
// Trials per tooth pitch in the shift search: the marks' arcs are fz long, so an eighth of it
// puts every pass within the solver's reach (derived: the cost is smooth within ~fz/4).
constexpr int kShiftTrials = 8;
// Solver iterations (Jacobians) per stage; the round trips converge within 4-8 (measured).
constexpr int kStageIterations = 10;
// Cells per tooth pitch below which the marks are not resolved by the grid (derived: an arc
// needs a few samples between its ends to show its depth).
constexpr double kMinCellsPerTooth = 4.0;
// Rms of an ideal cusp profile over its peak-to-valley height (DESIGN.md: Rq = 2h / (3 sqrt 5)).
constexpr double kCuspRmsPerDepth = 0.298;
// The valley walk's dish factor per step (runout divided by the same) and its most steps: 1.3
// and 1.6 in turn recovered 0.84 deg from a stall at 0.36 deg (measured); 1.4 per step covers a
// stall at a tenth of the dish in 7 steps (derived).
constexpr double kValleyFactor = 1.4;
constexpr int kValleySteps = 8, kValleyMisses = 2;
// Cap of the along-feed tilt start, deg (a heel that recuts bounds it by the marks' depth:
// 0.01-0.05 deg on the round trips; derived from the heel lift 2 R tan(tilt)).
constexpr double kAlongStartMaxDeg = 0.02;
// Dish start bounds, deg (typical end-face dish 0.5-3 deg, from memory).
constexpr double kDishStartMin = 0.1, kDishStartMax = 3.0;
// Least relative standard error of the dish: the spread of the solver's stops from different
// starts on the round trips (0.84-1.16 deg for 1 deg; measured), 3 sigma covering it.
constexpr double kDishModelSigma = 0.06;
// The variance of a value the floor does not bound.
constexpr double kUnbounded = std::numeric_limits<double>::infinity();
// Least standard errors of the runout (relative) and its phase (deg): the spread of the
// solver's stops on the round trips (measured, docs/diagnose.md), as kDishModelSigma.
constexpr double kRunoutModelSigma = 0.05, kPhaseModelSigmaDeg = 5.0;
// The envelope's pass centre is kept when the marks' pass axis lies within this many stepovers
// of it (the marks' estimate was 14-24 um off on the campaign floors, the envelope's is finer
// where it holds; measured); beyond it the marks' axis is the start.
constexpr double kMarksOffsetAgree = 1.0 / 16.0;
// Starts the runout scan hands to the solver (distinct phases, best first).
constexpr int kScanStarts = 3;
// Stops whose phase differs from the best by more than this (modulo 360 / Z) lie in another
// basin: the phase tolerance of issue 17 (the solver's stops from one basin came within 3 deg
// of each other on the round trips, measured).
constexpr double kBasinDeg = 15.0;

// The dish a marks rms gives (no model, no runout): between two rim arcs fz apart
// the floor rises to (fz / 2) tan(dish) (derived), the rms of what repeats each revolution
// (infer/tooth_marks: noise and the setup plane not counted) ~0.298 of it. Measured 1.025 deg
// for 1 deg on the noise-free round trip (runout 5 um).
double marks_dish_deg(double marks_rms_um, double fz_mm) {
  const double depth_mm = marks_rms_um / kCuspRmsPerDepth * 1e-3;
  return std::atan(depth_mm / (0.5 * fz_mm)) / kDegToRad;
}

// Dish start from the marks' depth: between two rim arcs fz apart the floor rises to
// (fz / 2) tan(dish) (derived), and the along-lay rms of each window line is ~0.298 of it.
double dish_start_deg(const ToothWindow& w, double lay_deg, double fz_mm) {
  const Heightfield& m = w.measured;
  const bool along_x = std::abs(std::cos(lay_deg * kDegToRad)) >= std::sqrt(0.5);
  const int lines = along_x ? m.ny : m.nx, len = along_x ? m.nx : m.ny;
  double ss = 0.0;
  long n = 0;
  for (int l = 0; l < lines; ++l) {
    double sum = 0.0, sq = 0.0;
    int k = 0;
    for (int i = 0; i < len; ++i) {
      const double z = along_x ? m.z_um(l, i) : m.z_um(i, l);
      if (std::isfinite(z)) sum += z, sq += z * z, ++k;
    }
    if (k > 1) ss += sq - sum * sum / k, n += k;
  }
  const double rms_um = n > 0 ? std::sqrt(ss / static_cast<double>(n)) : 0.0;
  return std::clamp(marks_dish_deg(rms_um, fz_mm), kDishStartMin, kDishStartMax);
}

// One candidate of the pass pattern, fitted without runout: shifts searched, then solved.
std::unique_ptr<ToothProblem> stage_one(const ToothWindow& w, ToothModel model, int parity,
                                        RasterDirection dir, const ToothState& start,
                                        double fz_mm) {
  place_passes(model, dir, parity);
  auto p = std::make_unique<ToothProblem>(w, model);
  ToothState s = start;
  s.shift_mm.assign(model.pass_index.size(), 0.0);
  p->set(s);
  p->update_active();
  p->search_shifts(fz_mm, kShiftTrials, 2);
  p->solve(kStageIterations / 2);
  p->update_active();
  p->search_shifts(fz_mm, kShiftTrials, 1);
  p->solve(kStageIterations / 2);
  p->refine_shifts(fz_mm / kShiftTrials / 2);
  p->solve(kStageIterations / 2);
  return p;
}

// One scan start solved: runout free with the dish held (measured: with the dish free the
// solver slid down the dish-runout valley from the scan's points, to 0.5 deg and 8.3 um for 1 deg
// and 5 um), labels searched again, then the dish freed.
void solve_start(ToothProblem& p, const ToothState& start, int teeth, double fz_mm) {
  p.set(start);
  p.free[kDish] = false;
  p.solve(kStageIterations / 2);
  search_labels(p, teeth, fz_mm);
  p.update_active();
  p.solve(kStageIterations / 2);
  p.free[kDish] = true;
  p.refine_shifts(fz_mm / kShiftTrials / 4);
  p.solve(kStageIterations / 2);
}

// Runout free: the scan's best starts (runout vector and labels) solved (the first `solved` of
// them; the rest kept for later), the problem left at the best stop.
struct RunoutStops {
  std::vector<RunoutStart> starts;  // the scan's, best first
  std::vector<ToothState> states;   // stops of the solved starts
  std::vector<double> costs;
};
void keep_best(ToothProblem& p, const RunoutStops& stops) {
  const size_t best = static_cast<size_t>(
      std::min_element(stops.costs.begin(), stops.costs.end()) - stops.costs.begin());
  p.set(stops.states[best]);
}
// The scan's starts after those already solved, up to the first `upto`, solved; the problem is
// left at the best stop so far.
void solve_starts(ToothProblem& p, RunoutStops& stops, size_t upto, int teeth, double fz_mm) {
  for (size_t k = stops.states.size(); k < std::min(upto, stops.starts.size()); ++k) {
    solve_start(p, stops.starts[k].state, teeth, fz_mm);
    stops.states.push_back(p.state());
    stops.costs.push_back(p.residual().squaredNorm());
  }
  keep_best(p, stops);
}
RunoutStops stage_two(ToothProblem& p, int teeth, double fz_mm, int solved) {
  p.free[kRunoutCos] = true;
  p.free[kRunoutSin] = teeth >= 3;
  RunoutStops stops;
  stops.starts = scan_runout(p, teeth, fz_mm, kScanStarts);
  solve_starts(p, stops, static_cast<size_t>(std::max(solved, 0)), teeth, fz_mm);
  return stops;
}

// Walk along the dish-runout valley (deeper dish, less runout): the solver stops short of the
// optimum there (measured: 0.36 deg and 10 um for 1 deg and 5 um on the damaged round trip,
// 0.09 deg and 17 um noise-free: the runout-free stage leaves the dish low and the smoothed cost
// is rough along the valley, so the walk goes on past one step that does not improve, and stops
// after kValleyMisses in a row). The problem is left at the best stop. Returns the walk's stops
// next to the best one (their spread widens the sigmas; the stall it started from is not one of
// them: its cost is hundreds of residual variances above).
std::vector<ToothState> restart_dish(ToothProblem& p, double fz_mm) {
  std::vector<ToothState> walk{p.state()};
  std::vector<double> cost{p.residual().squaredNorm()};
  size_t best = 0;
  for (int step = 0, misses = 0; step < kValleySteps && misses < kValleyMisses; ++step) {
    ToothState s = p.state();
    s.g[kDish] *= kValleyFactor;
    s.g[kRunoutCos] /= kValleyFactor;
    s.g[kRunoutSin] /= kValleyFactor;
    p.set(s);
    p.solve(kStageIterations / 2);
    p.refine_shifts(fz_mm / kShiftTrials / 4);
    p.solve(kStageIterations / 2);
    walk.push_back(p.state());
    cost.push_back(p.residual().squaredNorm());
    if (cost.back() < cost[best]) {
      best = walk.size() - 1;
      misses = 0;
    } else {
      ++misses;
    }
  }
  p.set(walk[best]);
  std::vector<ToothState> stops;
  if (best > 1) stops.push_back(walk[best - 1]);
  if (best + 1 < walk.size()) stops.push_back(walk[best + 1]);
  return stops;
}

}  // namespace

ToothFitStart tooth_fit_start(const FloorFit& fit) {
  ToothFitStart s;
  const Patch& w = fit.model.window;
  s.lay_deg = fit.model.lay_deg;
  s.stepover_mm = fit.params[kStepoverMm];
  const Eigen::Vector2d n(-std::sin(s.lay_deg * kDegToRad), std::cos(s.lay_deg * kDegToRad));
  const Eigen::Vector2d centre(w.origin_x_mm + 0.5 * w.size_x_mm,
                               w.origin_y_mm + 0.5 * w.size_y_mm);
  s.pass_centre_mm = centre.dot(n) + fit.params[kOffsetMm];
  // The envelope's tilt is pulled by the tooth marks it lacks (measured: 0.0048 and 0.33 deg
  // along for 0.025): the along start is capped, both signs are tried from it.
  s.tilt_along_deg = std::min(std::abs(fit.params[kTiltAlongDeg]), kAlongStartMaxDeg);
  s.envelope_along_deg = std::abs(fit.params[kTiltAlongDeg]);
  s.tilt_across_deg = std::clamp(fit.params[kTiltAcrossDeg], -kAlongStartMaxDeg * 4.0,
                                 kAlongStartMaxDeg * 4.0);
  return s;
}

ToothFit fit_teeth(const Heightfield& hf, const ToothFitStart& st, const ToothFitOptions& o) {
  ToothFit f;
  const Cutter& c = o.cutter;
  f.teeth = c.teeth;
  f.feed_per_tooth_mm = o.feed_per_tooth_mm;
  if (c.shape == CutterShape::Ball) {
    f.skipped = "a ball end mill has no flat end face: its feed marks carry no dish and its "
                "runout only moves the marks' spacing";
    return f;
  }
  if (!(o.feed_per_tooth_mm > 0.0) || c.teeth < 1) {
    f.skipped = "the teeth and feed per tooth are not known (give --job, or --teeth and "
                "--feed-per-tooth)";
    return f;
  }
  if (o.feed_per_tooth_mm < kMinCellsPerTooth * hf.cell_mm) {
    f.skipped = "the grid is too coarse for the feed marks (fewer than 4 cells per tooth)";
    return f;
  }
  const double rev = c.teeth * o.feed_per_tooth_mm;
  const ToothWindow w =
      tooth_window(hf, st.lay_deg, st.stepover_mm, rev, kToothFitRevolutions, kToothFitCells);
  f.samples = static_cast<int>(w.index.size());
  f.runout_phase_period_deg = 360.0 / c.teeth;
  // No marks, nothing to fit: the teeth cut alike whatever the runout (an undished, untilted
  // flat). Decided before any sweep; the dish is bounded by the marks the window would show.
  f.marks = tooth_marks(w, st.lay_deg, rev);
  if (!f.marks.seen) {
    const double dish_bound_deg = marks_dish_deg(f.marks.detection_rms_um, o.feed_per_tooth_mm);
    f.dish_deg = fitted_value(0.0, std::pow(dish_bound_deg / kBoundSigmas, 2), true);
    f.runout_um = fitted_value(0.0, kUnbounded, true);
    f.runout_phase_deg = fitted_value(0.0, kUnbounded, true);
    f.runout_projection_only = c.teeth <= 2;
    f.runout_not_read = true;
    f.tilt_along_deg = fitted_value(st.tilt_along_deg, kUnbounded, true);
    f.tilt_across_deg = fitted_value(st.tilt_across_deg, kUnbounded, true);
    f.measured_rms_um = std::sqrt((w.values - w.q * (w.q.transpose() * w.values)).squaredNorm() /
                                  std::max<double>(1.0, static_cast<double>(f.samples)));
    f.ran = true;
    return f;
  }
  ToothModel model;
  model.cutter = c;
  model.cutter.tilt_deg = 0.0;
  model.cutter.runout_mm = 0.0;
  model.lay_deg = st.lay_deg;
  model.stepover_mm = st.stepover_mm;
  model.feed_per_tooth_mm = o.feed_per_tooth_mm;
  model.spindle = o.spindle;
  model.window = w.patch;
  model.threads = o.threads;
  // The envelope's pass centre can lie a fraction of a stepover off on a floor whose tooth
  // marks it lacks (random tooth round trips, seed 2030 tc4-tc6: 0.21-0.40 stepover, one of
  // them "resolved" at 5 sigma; docs/diagnose.md), beyond the solver's reach (from 0.21
  // stepover off it moved 0.04 mm and stopped at 0.99 of the marks unexplained): the marks'
  // own pass axis replaces it when the two differ by more than kMarksOffsetAgree stepovers.
  double pass_centre = st.pass_centre_mm;
  f.marks_offset = marks_pass_offset(hf, st.lay_deg, st.stepover_mm, c.flat_radius_mm(),
                                     o.feed_per_tooth_mm, c.teeth);
  if (f.marks_offset.contrast >= kMarksOffsetMinContrast &&
      std::abs(std::remainder(f.marks_offset.axis_mm - pass_centre, st.stepover_mm)) >
          kMarksOffsetAgree * st.stepover_mm) {
    pass_centre = f.marks_offset.axis_mm;
    f.offset_from_marks = true;
  }
  // The pass centre in the window's frame, wrapped to within half a stepover of its centre.
  const Eigen::Vector2d n(-std::sin(st.lay_deg * kDegToRad), std::cos(st.lay_deg * kDegToRad));
  const Eigen::Vector2d centre(w.patch.origin_x_mm + 0.5 * w.patch.size_x_mm,
                               w.patch.origin_y_mm + 0.5 * w.patch.size_y_mm);
  double off = pass_centre - centre.dot(n);
  off -= std::round(off / st.stepover_mm) * st.stepover_mm;
  model.offset_mm = off;

  ToothState start;
  start.g[kDish] = dish_start_deg(w, st.lay_deg, o.feed_per_tooth_mm);
  start.g[kTiltAcross] = st.tilt_across_deg;
  start.g[kOffset] = off;
  // Candidates: both along-feed signs (the envelope folds it), both parities of a zigzag.
  const bool zigzag = o.direction == RasterDirection::Zigzag;
  std::unique_ptr<ToothProblem> best[2];
  double best_cost[2] = {std::numeric_limits<double>::infinity(),
                         std::numeric_limits<double>::infinity()};
  for (int sign = 0; sign < 2; ++sign) {
    for (int parity = 0; parity < (zigzag ? 2 : 1); ++parity) {
      ToothState s = start;
      s.g[kTiltAlong] = (sign == 0 ? 1.0 : -1.0) * std::abs(st.tilt_along_deg);
      auto p = stage_one(w, model, parity, o.direction, s, o.feed_per_tooth_mm);
      f.sweeps += p->sweeps();
      const double cost = p->residual().squaredNorm();
      if (cost < best_cost[sign]) best_cost[sign] = cost, best[sign] = std::move(p);
    }
  }
  // Both signs get the runout scan (without runout the two fit about alike: measured, 0.1
  // residual variances apart); the restarts only the better one.
  RunoutStops runout_stops[2];
  for (int sign = 0; sign < 2; ++sign) {
    const int before = best[sign]->sweeps();
    runout_stops[sign] = stage_two(*best[sign], c.teeth, o.feed_per_tooth_mm, 1);
    f.sweeps += best[sign]->sweeps() - before;
    best_cost[sign] = best[sign]->residual().squaredNorm();
  }
  const int win = best_cost[0] <= best_cost[1] ? 0 : 1;
  ToothProblem& p = *best[win];
  const int before = p.sweeps();
  // The scan's other starts too (the likelihood ratio of the runout's phase basin).
  solve_starts(p, runout_stops[win], runout_stops[win].starts.size(), c.teeth,
               o.feed_per_tooth_mm);
  best_cost[win] = p.residual().squaredNorm();
  const std::vector<ToothState> stops = restart_dish(p, o.feed_per_tooth_mm);
  // The solver moves the phase only a few degrees from where it starts (the smoothed cost is
  // rough along it): a profile search along the phase, then the runout freed again.
  const PhaseProfile profile = search_phase(p, c.teeth, o.feed_per_tooth_mm);
  p.solve(kStageIterations / 2);
  f.sweeps += p.sweeps() - before;
  best_cost[win] = std::min(best_cost[win], p.residual().squaredNorm());

  // Covariance at the optimum: sigma^2 (J^T J)^-1 scaled by m / m_eff.
  std::vector<int> cols;
  const Eigen::MatrixXd jac = p.jacobian(cols);
  f.sweeps += static_cast<int>(cols.size());
  const Eigen::VectorXd& r = p.residual();
  const int m = static_cast<int>(r.size());
  const int dof = std::max(1, m - static_cast<int>(cols.size()) - 3);
  f.correlation_factor =
      correlation_factor(w.measured.nx, w.measured.ny, w.index, r);
  const double var = r.squaredNorm() / dof * f.correlation_factor;
  const Eigen::MatrixXd jtj = jac.transpose() * jac;
  Eigen::MatrixXd cov = Eigen::MatrixXd::Constant(jtj.rows(), jtj.cols(),
                                                  std::numeric_limits<double>::infinity());
  const Eigen::CompleteOrthogonalDecomposition<Eigen::MatrixXd> cod(jtj);
  if (cod.rank() == jtj.rows()) cov = cod.pseudoInverse() * var;
  auto col_of = [&](int g) {
    const auto it = std::find(cols.begin(), cols.end(), g);
    return it == cols.end() ? -1 : static_cast<int>(it - cols.begin());
  };
  const auto& g = p.state().g;
  const int is = col_of(kRunoutSin), id = col_of(kDish);
  const int ia = col_of(kTiltAlong), ix = col_of(kTiltAcross);
  // Half the spread of the solver's stops, squared, is added to each variance.
  auto spread = [&](auto&& value) {
    double d = 0.0;
    for (const ToothState& t : stops) d = std::max(d, std::abs(value(t) - value(p.state())));
    return 0.25 * d * d;
  };
  auto global = [&](int k) { return spread([k](const ToothState& t) { return t.g[k]; }); };
  f.dish_deg = fitted_value(g[kDish], cov(id, id) + global(kDish), true);
  f.tilt_along_deg = fitted_value(g[kTiltAlong], cov(ia, ia) + global(kTiltAlong), true);
  f.tilt_across_deg = fitted_value(g[kTiltAcross], cov(ix, ix) + global(kTiltAcross), true);
  const double period = f.runout_phase_period_deg;
  const double ec = g[kRunoutCos], es = g[kRunoutSin], e = std::hypot(ec, es);
  const double marks_dish = marks_dish_deg(f.marks.marks_rms_um, o.feed_per_tooth_mm);
  const double psi = std::atan2(es, ec) / kDegToRad;
  // Phase difference modulo the period, deg (the nearest image).
  auto phase_off = [&](const ToothState& t) {
    const double a = std::atan2(t.g[kRunoutSin], t.g[kRunoutCos]) / kDegToRad - psi;
    return a - std::round(a / period) * period;
  };
  // The runout's basin is known when the best stop of the scan's other phases fits worse by
  // kSignSigmas^2 residual variances (likelihood ratio, Bates & Watts 1988 §6.1).
  double other_basin = kUnbounded;
  const RunoutStops& rs = runout_stops[win];
  for (size_t k = 0; k < rs.states.size(); ++k) {
    if (std::abs(phase_off(rs.states[k])) > kBasinDeg) other_basin = std::min(other_basin, rs.costs[k]);
  }
  f.runout_basin_sigmas = (other_basin - best_cost[win]) / var;
  const int ic = col_of(kRunoutCos);
  Eigen::Matrix2d c2 = Eigen::Matrix2d::Constant(kUnbounded);
  if (is >= 0) c2 << cov(ic, ic), cov(ic, is), cov(is, ic), cov(is, is);
  // Tested element by element: Eigen's allFinite() computes x - x, itself invalid for inf.
  const bool bounded = std::all_of(c2.data(), c2.data() + c2.size(),
                                   [](double v) { return std::isfinite(v); });
  if (is < 0) {
    // Z <= 2: only |e cos psi| shows (Kline & DeVor 1983; derived); not measured: not read.
    f.runout_projection_only = true;
    f.runout_not_read = true;
    f.runout_um = fitted_value(std::abs(g[kRunoutCos]), kUnbounded, true);
  } else {
    const Eigen::Vector2d de = e > 0.0 ? Eigen::Vector2d(ec / e, es / e) : Eigen::Vector2d(1, 0);
    const Eigen::Vector2d dpsi =
        e > 0.0 ? Eigen::Vector2d(-es, ec) / (e * e) / kDegToRad : Eigen::Vector2d(0, 0);
    double e_var =
        bounded ? de.dot(c2 * de) + spread([](const ToothState& t) {
          return std::hypot(t.g[kRunoutCos], t.g[kRunoutSin]);
        })
                : kUnbounded;
    double psi_var =
        bounded && e > 0.0 ? dpsi.dot(c2 * dpsi) + spread([&](const ToothState& t) {
          return psi + phase_off(t);
        })
                           : kUnbounded;
    e_var = std::max(e_var, std::pow(kRunoutModelSigma * e, 2));
    // Along the dish-runout valley e tan(dish) is kept (a tooth e further out deepens its mark
    // by ~(e / 2) tan(dish), derived): at the marks' dish the runout would be e tan(dish) /
    // tan(marks' dish); the difference is in its sigma (see the dish below).
    e_var = std::max(e_var, std::pow(e * (1.0 - std::tan(g[kDish] * kDegToRad) /
                                                    std::tan(marks_dish * kDegToRad)),
                                     2));
    psi_var = std::max({psi_var, kPhaseModelSigmaDeg * kPhaseModelSigmaDeg,
                        phase_profile_variance(profile, var)});
    // Every solved start stopped in one basin: no other phase was compared, and the phase is
    // known only to the basin's width (measured: the zigzag round trip, 1.5 deg, 8 um at 75
    // deg, stopped 26 deg off with its sigma at the 5 deg floor; docs/diagnose.md).
    if (!std::isfinite(other_basin)) psi_var = std::max(psi_var, kBasinDeg * kBasinDeg);
    f.runout_not_read = !bounded || !(f.runout_basin_sigmas > kSignSigmas * kSignSigmas);
    f.runout_um = fitted_value(e, f.runout_not_read ? kUnbounded : e_var, true);
    f.runout_phase_deg = fitted_value(psi - std::floor(psi / period) * period,
                                      f.runout_not_read ? kUnbounded : psi_var, true);
    // A phase is resolved when its sigma is bounded (a value near 0 deg is as good as any).
    f.runout_phase_deg.resolved = !f.runout_not_read;
  }
  // Two estimators of the dish, the fit's and the marks' depth: where the fit stopped away from
  // the marks' dish along the valley (noise-free round trip: 0.45 deg against 1.03, truth 1),
  // their difference is its sigma: a wide sigma, never a confident wrong dish.
  f.dish_deg = fitted_value(f.dish_deg.value,
                            std::max({f.dish_deg.sigma * f.dish_deg.sigma,
                                      std::pow(kDishModelSigma * f.dish_deg.value, 2),
                                      std::pow(f.dish_deg.value - marks_dish, 2)}),
                            true);
  // Two estimators of the along-feed magnitude, this stage's (started at most kAlongStartMaxDeg)
  // and the envelope's: their difference is in its sigma, as the dish's (the random tooth round
  // trips read 0.28-0.65 of the truth at 6-10 of the Jacobian's sigmas; docs/diagnose.md).
  if (st.envelope_along_deg >= 0.0) {
    const double d = std::abs(f.tilt_along_deg.value) - st.envelope_along_deg;
    f.tilt_along_deg = fitted_value(
        f.tilt_along_deg.value,
        std::max(f.tilt_along_deg.sigma * f.tilt_along_deg.sigma, d * d), true);
  }
  const double other = best_cost[1 - win], mine = best_cost[win];
  f.along_sign_cost_sigmas = (other - mine) / var;
  f.along_sign_known = f.along_sign_cost_sigmas > kSignSigmas * kSignSigmas;
  f.residual_rms_um = std::sqrt(w.residual(p.floor()).squaredNorm() / std::max(m, 1));
  const Eigen::VectorXd mv = w.values - w.q * (w.q.transpose() * w.values);
  f.measured_rms_um = std::sqrt(mv.squaredNorm() / std::max(m, 1));
  // A fit that sees marks but leaves most of them unexplained stopped in a wrong basin: none of
  // its tooth values is reported as resolved (never a confident wrong number).
  f.smoothed_residual_ratio = std::sqrt(r.squaredNorm() / std::max(p.measured_norm2(), 1e-30));
  // Whether or not the fit claims a dish or runout: a random round trip (tools/tooth_campaign.py,
  // seed 2030 tc4) left 0.99 of the marks unexplained with neither resolved, and its phase and
  // along-feed sign were still reported. (Marks were seen: the stage stopped above otherwise.)
  f.marks_misfit = !(f.smoothed_residual_ratio <= kToothFitMaxResidualRatio);
  if (f.marks_misfit) {
    for (FittedValue* v : {&f.runout_um, &f.runout_phase_deg, &f.dish_deg, &f.tilt_along_deg}) {
      *v = fitted_value(v->value, kUnbounded, true);
    }
    f.along_sign_known = false;
  }
  f.passes = p.active_passes();
  f.ran = true;
  return f;
}

}  // namespace cuspmap

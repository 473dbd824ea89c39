// Inverse simulation: window and decimation of the measured floor, a coarse start search over
// the pass offset and tilt, Levenberg-Marquardt with the setup plane projected out of the
// residual, covariance sigma^2 (J^T J)^-1 at the optimum.
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

#include "infer/band_means.h"
#include "infer/compass_search.h"
#include "infer/fit_starts.h"
#include "infer/residual_correlation.h"
#include <unsupported/Eigen/NonLinearOptimization>

namespace cuspmap {
namespace {

// Finite-difference steps of the Jacobian, one per parameter. A tilt of 0.0005 deg moves a rim
// 3 mm out by 0.026 um (above float rounding of um heights); stepover and offset steps are a
// small fraction of the period (derived). The sweep is piecewise smooth (minimum over passes),
// so a step that spans a crest averages the two slopes. For the stepover and the offset both
// one-sided differences are taken and the shorter column kept: the rim of a tilted flat leaves
// a step in the floor at its lateral extreme (derived: the envelope at offset w is the rim's
// height at x = +-sqrt(a^2 - w^2), which ends at |w| = a), at a pass centre +- a, so the
// residual jumps where a change of stepover or offset carries a step across a row of samples
// (a tilt changes the step's height, not its place). A difference spanning a jump is no
// derivative (it made the solver stall beside one, with a stepover sigma 20x too small); the
// smooth slope is the same on both sides to O(h), and the side without the jump has the
// shorter column.
constexpr double kTiltStepDeg = 0.0005;
constexpr double kPeriodStepFraction = 2e-4;
// Start search: pass offsets tried per stepover, and tilt components (deg) tried (common
// practice, no source: tram errors of 0.005-0.1 deg are what a shop meets).
// Every pair of these (along >= 0, across of either sign) is a start (common practice, no
// source: tram errors of 0.005-0.2 deg are what a shop meets); roughly geometric steps.
constexpr double kStartTiltDeg[] = {0.0, 0.005, 0.01, 0.02, 0.035, 0.05, 0.075, 0.1, 0.15, 0.2};
// Solver limits: sweeps the solver may run, and its relative tolerances (MINPACK defaults
// tightened: the residual is in float um).
constexpr int kMaxSolverSweeps = 200;
// Solver evaluations (each with a Jacobian of up to 4 more sweeps) granted to each start before
// the best one is polished: enough to leave a wrong basin's start visibly worse (derived from
// the round trips), few enough to keep the command near a second.
constexpr int kStartSolverEvaluations = 12;
// Starts the solver runs from (the best of the start grid; derived: 4 covers the neighbouring
// offset and tilt basins on the round-trip floors of tests/infer/floor_fit_test.cpp).
constexpr size_t kSolverStarts = 4;
constexpr double kSolverTolerance = 1e-7;
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
// Profile over the tilt direction: directions tried (every 15 deg from the lay, the along
// sign being folded), sweeps each, and the cost rise that bounds the interval (9 residual
// variances: 3 sigma of one parameter, Bates & Watts 1988 §6.1 likelihood intervals).
constexpr int kProfileDirections = 13;
constexpr int kProfileSweeps = 30;
constexpr double kProfileSigmas = 3.0;
// Relative stepover moves of the stepover profile, growing: the first one that leaves the
// floor's 3-sigma cost ends it (1e-5 relative is below every sigma the round trips report).
constexpr double kStepoverProfileSteps[] = {1e-5, 2e-5, 5e-5, 1e-4, 2e-4, 5e-4, 1e-3, 2e-3, 5e-3};

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

// The measured window and the plane basis over its finite samples.
struct Window {
  Patch patch;
  Heightfield measured;          // window samples, um (NaN = missing)
  std::vector<int> index;        // finite sample -> cell index in the window (row-major)
  Eigen::MatrixXd q;             // thin Q of [1, x, y] over the finite samples
  Eigen::MatrixXd basis;         // [1, x - x0, y - y0]
  double x0_mm = 0.0, y0_mm = 0.0;
  std::vector<double> v;         // finite sample -> across-lay coordinate (across_lay_mm), mm
  double v_max_mm = 0.0;         // largest |v| plus a stepover (offsets move passes that far)
};

Window make_window(const Heightfield& hf, double stepover_mm) {
  Window w;
  const double cell = hf.cell_mm;
  const int max_cells = static_cast<int>(std::ceil(kMaxFitPeriods * stepover_mm / cell));
  const int cx = std::min(hf.nx, std::max(max_cells, 1)), cy = std::min(hf.ny, std::max(max_cells, 1));
  const int stride = std::max(1, (std::max(cx, cy) + kMaxFitSamples - 1) / kMaxFitSamples);
  const int nx = cx / stride, ny = cy / stride;
  const int i0 = (hf.nx - nx * stride) / 2, j0 = (hf.ny - ny * stride) / 2;
  Heightfield& m = w.measured;
  m.nx = nx;
  m.ny = ny;
  m.cell_mm = stride * cell;
  // Sample (a, b) is measured cell (i0 + a stride, j0 + b stride): its centre is the window
  // cell's centre when the window starts half a window cell before it.
  m.origin_x_mm = hf.x_mm(i0) - 0.5 * m.cell_mm;
  m.origin_y_mm = hf.y_mm(j0) - 0.5 * m.cell_mm;
  m.z_um.resize(ny, nx);
  for (int b = 0; b < ny; ++b) {
    for (int a = 0; a < nx; ++a) m.z_um(b, a) = hf.z_um(j0 + b * stride, i0 + a * stride);
  }
  w.patch.cell_mm = m.cell_mm;
  w.patch.origin_x_mm = m.origin_x_mm;
  w.patch.origin_y_mm = m.origin_y_mm;
  // Half a cell short of whole: the grid takes ceil(size / cell) cells, exactly nx and ny.
  w.patch.size_x_mm = (nx - 0.5) * m.cell_mm;
  w.patch.size_y_mm = (ny - 0.5) * m.cell_mm;
  w.x0_mm = m.origin_x_mm + 0.5 * nx * m.cell_mm;
  w.y0_mm = m.origin_y_mm + 0.5 * ny * m.cell_mm;
  for (int b = 0; b < ny; ++b) {
    for (int a = 0; a < nx; ++a) {
      if (std::isfinite(m.z_um(b, a))) w.index.push_back(b * nx + a);
    }
  }
  const int n = static_cast<int>(w.index.size());
  w.basis.resize(n, 3);
  for (int k = 0; k < n; ++k) {
    const int a = w.index[k] % nx, b = w.index[k] / nx;
    w.basis(k, 0) = 1.0;
    w.basis(k, 1) = m.x_mm(a) - w.x0_mm;
    w.basis(k, 2) = m.y_mm(b) - w.y0_mm;
  }
  Eigen::HouseholderQR<Eigen::MatrixXd> qr(w.basis);
  w.q = qr.householderQ() * Eigen::MatrixXd::Identity(n, 3);
  return w;
}

// Jacobian column from residuals at x (f0), x + h (f_plus) and x - h (f_minus): the one-sided
// difference with the smaller norm (see kTiltStepDeg).
Eigen::VectorXd shorter_difference(const Eigen::VectorXd& f0, const Eigen::VectorXd& f_plus,
                                   const Eigen::VectorXd& f_minus, double h) {
  Eigen::VectorXd forward = (f_plus - f0) / h, backward = (f0 - f_minus) / h;
  return forward.squaredNorm() <= backward.squaredNorm() ? forward : backward;
}

// The types Eigen's Levenberg-Marquardt asks of a functor (dynamic sizes, double).
struct LmFunctor {
  using Scalar = double;
  using InputType = Eigen::VectorXd;
  using ValueType = Eigen::VectorXd;
  using JacobianType = Eigen::MatrixXd;
  enum { InputsAtCompileTime = Eigen::Dynamic, ValuesAtCompileTime = Eigen::Dynamic };
};

// Residual functor for Eigen's Levenberg-Marquardt over the free parameters.
struct FitResidual : LmFunctor {

  const FitModel* model = nullptr;
  const Window* window = nullptr;
  Eigen::VectorXd full;          // all parameters; the free ones are overwritten
  std::vector<int> free_index;   // free parameter -> FitParam
  double stepover0_mm = 0.0;      // the surface estimate of the stepover (prior)
  double prior_weight = 0.0;      // residual scale / its standard error
  mutable int sweeps = 0;

  int inputs() const { return static_cast<int>(free_index.size()); }
  int samples() const { return static_cast<int>(window->index.size()); }
  // One residual per finite sample, plus the stepover prior.
  int values() const { return samples() + 1; }

  Eigen::VectorXd expand(const Eigen::VectorXd& x) const {
    Eigen::VectorXd p = full;
    for (size_t k = 0; k < free_index.size(); ++k) p[free_index[k]] = x[static_cast<int>(k)];
    return p;
  }
  // Measured minus simulated at the finite samples, before the plane is projected out.
  Eigen::VectorXd raw(const Eigen::VectorXd& p) const {
    ++sweeps;
    const int n = samples();
    Eigen::VectorXd r(n);
    if (!model->tooth_marks) {
      // The envelope is constant along the lay: one profile across it serves every sample.
      const FitProfile prof = simulate_fit_profile(*model, p, window->v_max_mm);
      for (int k = 0; k < n; ++k) {
        const int i = window->index[k];
        const double s = prof.at(window->v[static_cast<size_t>(k)]);
        r[k] = window->measured.z_um(i / window->measured.nx, i % window->measured.nx) -
               (std::isfinite(s) ? s : 0.0);
      }
      return r;
    }
    const Heightfield sim = simulate_fit_window(*model, p);
    for (int k = 0; k < n; ++k) {
      const int i = window->index[k];
      const float s = sim.z_um(i / sim.nx, i % sim.nx);
      // A sample no pass reached cannot be matched: it counts as its measured height.
      r[k] = window->measured.z_um(i / sim.nx, i % sim.nx) - (std::isfinite(s) ? s : 0.0f);
    }
    return r;
  }
  int operator()(const Eigen::VectorXd& x, Eigen::VectorXd& f) const {
    const Eigen::VectorXd p = expand(x);
    const Eigen::VectorXd r = raw(p);
    f.resize(values());
    f.head(samples()) = r - window->q * (window->q.transpose() * r);
    f[samples()] = prior_weight * (p[kStepoverMm] - stepover0_mm);
    return 0;
  }
  int df(const Eigen::VectorXd& x, Eigen::MatrixXd& jac) const {
    Eigen::VectorXd f0, f1, f2;
    (*this)(x, f0);
    jac.resize(values(), inputs());
    for (int k = 0; k < inputs(); ++k) {
      const int which = free_index[static_cast<size_t>(k)];
      const double h = (which == kTiltAlongDeg || which == kTiltAcrossDeg)
                           ? kTiltStepDeg
                           : kPeriodStepFraction * full[kStepoverMm];
      Eigen::VectorXd xh = x;
      xh[k] += h;
      (*this)(xh, f1);
      if (which == kTiltAlongDeg || which == kTiltAcrossDeg) {
        jac.col(k) = (f1 - f0) / h;  // a tilt moves no step (see kTiltStepDeg)
        continue;
      }
      xh[k] = x[k] - h;
      (*this)(xh, f2);
      jac.col(k) = shorter_difference(f0, f1, f2, h);
    }
    return 0;
  }
};

// The residual with the tilt direction fixed (deg from the lay) and the stepover held: free are
// the tilt magnitude and the pass offset. One point of the profile over the direction.
struct DirectionResidual : LmFunctor {

  const FitResidual* base = nullptr;  // all four parameters free
  double dir_rad = 0.0;
  double stepover_mm = 0.0;
  mutable int sweeps = 0;

  int inputs() const { return 2; }
  int values() const { return base->values(); }
  Eigen::VectorXd full(const Eigen::VectorXd& x) const {
    Eigen::VectorXd p(4);
    p << x[0] * std::cos(dir_rad), x[0] * std::sin(dir_rad), stepover_mm, x[1];
    return p;
  }
  int operator()(const Eigen::VectorXd& x, Eigen::VectorXd& f) const {
    ++sweeps;
    return (*base)(full(x), f);
  }
  int df(const Eigen::VectorXd& x, Eigen::MatrixXd& jac) const {
    Eigen::VectorXd f0, f1, f2;
    (*this)(x, f0);
    jac.resize(values(), 2);
    const double h[2] = {kTiltStepDeg, kPeriodStepFraction * stepover_mm};
    for (int k = 0; k < 2; ++k) {
      Eigen::VectorXd xh = x;
      xh[k] += h[k];
      (*this)(xh, f1);
      if (k == 0) {
        jac.col(k) = (f1 - f0) / h[k];  // the tilt magnitude moves no step (see kTiltStepDeg)
        continue;
      }
      xh[k] = x[k] - h[k];
      (*this)(xh, f2);
      jac.col(k) = shorter_difference(f0, f1, f2, h[k]);
    }
    return 0;
  }
};

double rms(const Eigen::VectorXd& v) {
  return v.size() ? std::sqrt(v.squaredNorm() / static_cast<double>(v.size())) : 0.0;
}

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

}  // namespace

FloorFit fit_floor(const Heightfield& hf, const SurfaceEstimates& e, const FloorFitOptions& o) {
  const double stepover = e.stepover.period_mm;
  Window w = make_window(hf, stepover);
  FloorFit fit;
  fit.model.cutter = o.cutter;
  fit.model.cutter.tilt_deg = 0.0;
  fit.model.cutter.runout_mm = 0.0;
  fit.model.lay_deg = e.lay_deg;
  fit.model.direction = o.direction;
  fit.model.window = w.patch;
  fit.model.threads = o.threads;
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
    const double scale = rms(meas - w.q * (w.q.transpose() * meas));
    res.prior_weight = scale / std::max(e.stepover.sigma_mm, 1e-6 * stepover);
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
  for (size_t k = 0; k < std::min<size_t>(kSolverStarts, starts.size()); ++k) {
    FitResidual trial = base;
    trial.full = starts[k].second;
    Eigen::VectorXd xk(trial.inputs());
    for (int i = 0; i < trial.inputs(); ++i) {
      xk[i] = trial.full[trial.free_index[static_cast<size_t>(i)]];
    }
    Eigen::LevenbergMarquardt<FitResidual> lm(trial);
    lm.parameters.maxfev = kStartSolverEvaluations;
    lm.parameters.xtol = kSolverTolerance;
    lm.parameters.ftol = kSolverTolerance;
    const int status = static_cast<int>(lm.minimize(xk));
    res.sweeps += trial.sweeps;
    Eigen::VectorXd fk;
    trial(xk, fk);
    ++res.sweeps;
    if (fk.squaredNorm() < best_cost) {
      best_cost = fk.squaredNorm();
      best_x = trial.expand(xk);
      fit.solver_status = status;
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
      res.prior_weight = std::min(res.prior_weight, rms(fb.head(trial.samples())) /
                                                        std::max(e.stepover.sigma_mm, 1e-6 * stepover));
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
  if (tilt_shows && res.inputs() == kFitParams) {
    profile_direction(res, best_cost, fit);
  }
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
  const double var = std::max(
      f.head(res.samples()).squaredNorm() / dof *
          correlation_factor(w.measured.nx, w.measured.ny, w.index, f.head(res.samples())),
      line_mean_variance(w.v, w.measured.cell_mm, f.head(res.samples()), res.inputs()));
  fit.correlation_factor =
      correlation_factor(w.measured.nx, w.measured.ny, w.index, f.head(res.samples()));
  const Eigen::MatrixXd jtj = jac.transpose() * jac;
  const Eigen::MatrixXd inv = jtj.completeOrthogonalDecomposition().pseudoInverse();
  fit.covariance = Eigen::MatrixXd::Zero(kFitParams, kFitParams);
  for (int a = 0; a < res.inputs(); ++a) {
    for (int b = 0; b < res.inputs(); ++b) {
      fit.covariance(res.free_index[a], res.free_index[b]) = var * inv(a, b);
    }
  }
  if (!fit.model.tooth_marks) {
    int profile_evaluations = 0;
    fit.stepover_profile_sigma_mm = stepover_profile_sigma_mm(
        res, f.squaredNorm(), var, profile_evaluations);
    fit.evaluations += profile_evaluations;
    // The profile model's own error: linear interpolation between strip cells h apart moves a
    // sharp feature (a rim's step) by up to h / 2, a uniform error of sd h / sqrt(12) on every
    // pass position, which the stepover (a slope through N passes) sees as that over
    // sqrt(N (N^2 - 1) / 12) (derived; least-squares slope). A 5 mm flat at 1.455 mm stepover
    // read 0.02 % long at 3 profile sigmas; with 32 strip cells per sample, 0.012 %.
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
  // The profile took one magnitude per direction; each carries its own (linearised) sigma, so
  // the interval is widened by kProfileSigmas of it (derived: the magnitude's interval at a
  // fixed direction).
  const double t_fit = std::hypot(fit.params[kTiltAlongDeg], fit.params[kTiltAcrossDeg]);
  if (tilt_shows && t_fit > 0.0) {
    const Eigen::Vector2d g(fit.params[kTiltAlongDeg] / t_fit, fit.params[kTiltAcrossDeg] / t_fit);
    const double var_t = g.dot(fit.covariance.topLeftCorner<2, 2>() * g);
    if (std::isfinite(var_t) && var_t > 0.0) {
      const double widen = kProfileSigmas * std::sqrt(var_t);
      fit.tilt_interval_deg.first = std::max(0.0, fit.tilt_interval_deg.first - widen);
      fit.tilt_interval_deg.second += widen;
    }
  }
  fit.residual_rms_um = rms(f.head(res.samples()));
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
  fit.measured_rms_um = rms(detrended);
  return fit;
}

}  // namespace cuspmap

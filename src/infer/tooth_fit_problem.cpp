// Tooth-resolved least squares: state, sweeps per pass, Jacobian by forward differences (a
// global re-sweeps every active pass, a shift only its own), Levenberg-Marquardt and the shift
// search. Inputs: ToothWindow, ToothModel, ToothState; output: cost (um^2), state.
// Method: Levenberg 1944 / Marquardt 1963 with Moré's (1978) diagonal scaling.
#include "infer/tooth_fit_problem.h"

#include <algorithm>
#include <cmath>
#include <Eigen/Dense>

namespace cuspmap {
namespace {

// Forward-difference steps per global (um, um, deg, deg, deg; offset below): each moves the
// floor by ~0.01-0.1 um, well above float rounding of the sweep (1e-6 um at these heights) and
// small against the marks (derived: 0.02 deg of dish over 25 um of radius is 0.009 um; 0.002
// deg of tilt at a 3 mm rim 0.1 um).
constexpr double kStep[kToothGlobals] = {0.2, 0.2, 0.02, 0.002, 0.002, 0.0};
// Offset and shift steps: wider than the cell-scale roughness the smoothed cost keeps (cells
// flipping across a rim step), so the difference sees the slope, not one flip (measured: the
// solver stalled at 1e-3 mm steps and went on at these). Offset: 1 % of the stepover; shift:
// a sixteenth of the tooth pitch.
constexpr double kOffsetStepStepovers = 0.01;
constexpr double kShiftStepPitches = 1.0 / 16.0;
// Shift step, mm: a tenth of a 5 um cell, the marks' slope times it ~0.01 um (derived).
// Smoothing box half-width in tooth pitches (4 cells at 0.05 mm on 5 um cells; measured: 2
// cells left the solver stalled further from the truth).
constexpr double kSmoothPitch = 0.4;
// Relative cost decrease below which the solver stops (well under one residual variance
// over the ~10^4 samples of the window; common practice, no source).
constexpr double kRelTolerance = 1e-7;
// Largest solver step of a runout component (um) and of the dish (relative to it) while the
// runout is free: within the solver's reach of the scan's grid (3 and 6 um apart) and under the
// valley walk's factor (derived; the valley: see solve).
constexpr double kMaxRunoutStepUm = 1.0, kMaxDishStep = 0.15;

// Smoothing of measured and simulated floors before they are compared: a flat end mill's rim
// leaves a step of ~fz tan(dish) at every arc (its corner is sharp), so the floor is
// discontinuous and the cost moves like |h| with anything that moves the arcs (shifts, offset,
// runout): no Gauss-Newton step sees it (measured: the cost rose linearly from the truth).
// The same smoothing on both sides keeps the optimum and makes the cost smooth within about
// the kernel's width. Two passes of a box of 2 * half + 1 cells along each axis (a triangle),
// normalised over the finite samples (normalised convolution, Knutsson & Westin 1993).
void smooth_masked(std::vector<double>& z, const std::vector<double>& mask, int nx, int ny,
                   int half) {
  std::vector<double> num(z.size()), den(z.size()), tmp_n(z.size()), tmp_d(z.size());
  for (size_t k = 0; k < z.size(); ++k) num[k] = z[k] * mask[k], den[k] = mask[k];
  auto box = [&](std::vector<double>& a, std::vector<double>& out, bool along_x) {
    const int lines = along_x ? ny : nx, len = along_x ? nx : ny;
    for (int l = 0; l < lines; ++l) {
      auto at = [&](int i) -> size_t {
        return along_x ? static_cast<size_t>(l) * nx + i : static_cast<size_t>(i) * nx + l;
      };
      double run = 0.0;
      for (int i = 0; i < std::min(half, len); ++i) run += a[at(i)];
      for (int i = 0; i < len; ++i) {
        if (i + half < len) run += a[at(i + half)];
        if (i - half - 1 >= 0) run -= a[at(i - half - 1)];
        out[at(i)] = run;
      }
    }
    a.swap(out);
  };
  for (int rep = 0; rep < 2; ++rep) {
    for (const bool along_x : {true, false}) {
      box(num, tmp_n, along_x);
      box(den, tmp_d, along_x);
    }
  }
  for (size_t k = 0; k < z.size(); ++k) z[k] = den[k] > 0.0 ? num[k] / den[k] : 0.0;
}

}  // namespace

Eigen::VectorXd ToothProblem::smoothed(const Heightfield& hf) const {
  const int nx = hf.nx, ny = hf.ny;
  std::vector<double> z(static_cast<size_t>(nx) * ny, 0.0), mask(z.size(), 0.0);
  for (size_t k = 0; k < w_.index.size(); ++k) {
    const size_t c = static_cast<size_t>(w_.index[k]);
    const float v = hf.z_um.data()[c];
    if (std::isfinite(v)) z[c] = v, mask[c] = 1.0;
  }
  if (smooth_half_ > 0) smooth_masked(z, mask, nx, ny, smooth_half_);
  Eigen::VectorXd out(static_cast<Eigen::Index>(w_.index.size()));
  for (size_t k = 0; k < w_.index.size(); ++k) {
    out[static_cast<Eigen::Index>(k)] = z[static_cast<size_t>(w_.index[k])];
  }
  return out;
}

Eigen::VectorXd ToothProblem::residual_of_floor(const Heightfield& floor) const {
  Eigen::VectorXd r = measured_ - smoothed(floor);
  return r - w_.q * (w_.q.transpose() * r);
}

ToothProblem::ToothProblem(const ToothWindow& w, const ToothModel& model)
    : w_(w), model_(model), active_(model.pass_index.size(), true) {
  // Kernel half-width: a quarter tooth pitch (the steps smoothed over half a pitch, the
  // marks' shape kept; derived), at least one cell.
  smooth_half_ = std::max(1, static_cast<int>(std::lround(kSmoothPitch * model.feed_per_tooth_mm /
                                                           w.measured.cell_mm)));
  // The measured plane is removed before smoothing: normalised smoothing does not keep a plane
  // next to missing samples and the window's edges (the kernel's centroid moves off the cell),
  // so a setup plane left a residual there that no parameter fits (measured on the damaged
  // round trip: dish 0.916 -> 0.975 deg for 1 deg, the along-feed sign's margin 1 255 -> 3 252
  // residual variances). The model's floor has no setup plane.
  const Eigen::VectorXd level = w.values - w.q * (w.q.transpose() * w.values);
  Heightfield m = w.measured;
  for (size_t k = 0; k < w.index.size(); ++k) {
    m.z_um.data()[w.index[k]] = static_cast<float>(level[static_cast<Eigen::Index>(k)]);
  }
  measured_ = smoothed(m);
  state_.g[kOffset] = model.offset_mm;
  state_.shift_mm.assign(model.pass_index.size(), 0.0);
  pass_floor_.resize(model.pass_index.size());
}

double ToothProblem::measured_norm2() const {
  return (measured_ - w_.q * (w_.q.transpose() * measured_)).squaredNorm();
}

int ToothProblem::active_passes() const {
  return static_cast<int>(std::count(active_.begin(), active_.end(), true));
}

Heightfield ToothProblem::sweep(const ToothState& s, int pass) {
  ToothModel m = model_;
  m.offset_mm = s.g[kOffset];
  ToothParams p;
  p.runout_cos_um = s.g[kRunoutCos];
  p.runout_sin_um = s.g[kRunoutSin];
  p.dish_deg = s.g[kDish];
  p.tilt_along_deg = s.g[kTiltAlong];
  p.tilt_across_deg = s.g[kTiltAcross];
  ++sweeps_;
  return simulate_tooth_pass(m, tooth_cutter(m, p), pass, s.shift_mm[static_cast<size_t>(pass)]);
}

void ToothProblem::combine(const std::vector<Heightfield>& floors, Heightfield& out) const {
  out = w_.measured;
  out.z_um.setConstant(kUnreached);
  for (size_t p = 0; p < floors.size(); ++p) {
    if (active_[p]) min_into(floors[p], out);
  }
}

Eigen::VectorXd ToothProblem::residual_of(const ToothState& s, std::vector<Heightfield>* floors) {
  std::vector<Heightfield> f(pass_floor_.size());
  for (size_t p = 0; p < f.size(); ++p) {
    if (active_[p]) f[p] = sweep(s, static_cast<int>(p));
  }
  Heightfield c;
  combine(f, c);
  if (floors) *floors = std::move(f);
  return residual_of_floor(c);
}

double ToothProblem::set(const ToothState& s) {
  state_ = s;
  r_ = residual_of(s, &pass_floor_);
  combine(pass_floor_, floor_);
  return r_.squaredNorm();
}

double ToothProblem::cost_with_shift(int pass, double shift_mm) {
  ToothState s = state_;
  s.shift_mm[static_cast<size_t>(pass)] = shift_mm;
  std::vector<Heightfield> f = pass_floor_;
  f[static_cast<size_t>(pass)] = sweep(s, pass);
  Heightfield c;
  combine(f, c);
  return residual_of_floor(c).squaredNorm();
}

void ToothProblem::update_active() {
  std::fill(active_.begin(), active_.end(), true);
  set(state_);
  const int n = static_cast<int>(w_.index.size());
  for (size_t p = 0; p < active_.size(); ++p) {
    int wins = 0;
    for (int k = 0; k < n; ++k) {
      const int cell = w_.index[static_cast<size_t>(k)];
      const float v = pass_floor_[p].z_um.data()[cell];
      if (std::isfinite(v) && v == floor_.z_um.data()[cell]) ++wins;
    }
    active_[p] = wins > 0;
  }
  set(state_);
}

Eigen::MatrixXd ToothProblem::jacobian(std::vector<int>& columns) {
  columns.clear();
  for (int j = 0; j < kToothGlobals; ++j) {
    if (free[j]) columns.push_back(j);
  }
  for (size_t p = 0; p < active_.size(); ++p) {
    if (active_[p]) columns.push_back(kToothGlobals + static_cast<int>(p));
  }
  Eigen::MatrixXd jac(r_.size(), static_cast<Eigen::Index>(columns.size()));
  for (size_t c = 0; c < columns.size(); ++c) {
    const int j = columns[c];
    ToothState s = state_;
    double h = 0.0;
    Eigen::VectorXd r;
    if (j < kToothGlobals) {
      h = j == kOffset ? kOffsetStepStepovers * model_.stepover_mm : kStep[j];
      s.g[j] += h;
      r = residual_of(s, nullptr);
    } else {
      const int p = j - kToothGlobals;
      h = kShiftStepPitches * model_.feed_per_tooth_mm;
      r = residual_of_floor([&] {
        std::vector<Heightfield> f = pass_floor_;
        s.shift_mm[static_cast<size_t>(p)] += h;
        f[static_cast<size_t>(p)] = sweep(s, p);
        Heightfield out;
        combine(f, out);
        return out;
      }());
    }
    jac.col(static_cast<Eigen::Index>(c)) = (r - r_) / h;
  }
  return jac;
}

double ToothProblem::solve(int iterations) {
  double cost = r_.squaredNorm();
  double lambda = 1e-3;
  for (int it = 0; it < iterations; ++it) {
    std::vector<int> cols;
    const Eigen::MatrixXd jac = jacobian(cols);
    const Eigen::MatrixXd jtj = jac.transpose() * jac;
    const Eigen::VectorXd jtr = jac.transpose() * r_;
    bool accepted = false;
    for (int tries = 0; tries < 8 && !accepted; ++tries) {
      Eigen::MatrixXd a = jtj;
      for (Eigen::Index k = 0; k < a.rows(); ++k) a(k, k) += lambda * std::max(jtj(k, k), 1e-12);
      Eigen::VectorXd step = -a.ldlt().solve(jtr);
      // With the runout free, a step along the dish-runout valley (nearly flat, rough at the
      // cell scale) is capped: an uncapped Gauss-Newton step overshot it into a far pocket
      // (measured: 20.6 um and 0.18 deg for 5 um and 1 deg, noise-free).
      if (free[kRunoutCos]) {
        double scale = 1.0;
        for (size_t c = 0; c < cols.size(); ++c) {
          const int j = cols[c];
          const double d = std::abs(step[static_cast<Eigen::Index>(c)]);
          if (j == kRunoutCos || j == kRunoutSin) scale = std::min(scale, kMaxRunoutStepUm / d);
          if (j == kDish) scale = std::min(scale, (kMaxDishStep * state_.g[kDish] + 0.01) / d);
        }
        step *= scale;
      }
      ToothState s = state_;
      for (size_t c = 0; c < cols.size(); ++c) {
        const int j = cols[c];
        if (j < kToothGlobals) {
          s.g[j] += step[static_cast<Eigen::Index>(c)];
        } else {
          s.shift_mm[static_cast<size_t>(j - kToothGlobals)] += step[static_cast<Eigen::Index>(c)];
        }
      }
      s.g[kDish] = std::max(s.g[kDish], 0.0);
      const ToothState keep = state_;
      const std::vector<Heightfield> keep_floors = pass_floor_;
      const double trial = set(s);
      if (trial < cost) {
        accepted = true;
        const double gain = (cost - trial) / cost;
        cost = trial;
        lambda = std::max(lambda / 4.0, 1e-7);
        if (gain < kRelTolerance) return cost;
      } else {
        state_ = keep;
        pass_floor_ = keep_floors;
        combine(pass_floor_, floor_);
        r_ = residual_of_floor(floor_);
        lambda *= 8.0;
      }
    }
    if (!accepted) break;
  }
  return cost;
}

void ToothProblem::refine_shifts(double step_mm) {
  for (size_t p = 0; p < active_.size(); ++p) {
    if (!active_[p]) continue;
    const double base = state_.shift_mm[p];
    double best = r_.squaredNorm(), best_shift = base;
    for (const double d : {-step_mm, -0.5 * step_mm, 0.5 * step_mm, step_mm}) {
      const double c = cost_with_shift(static_cast<int>(p), base + d);
      if (c < best) best = c, best_shift = base + d;
    }
    if (best_shift != base) {
      ToothState s = state_;
      s.shift_mm[p] = best_shift;
      set(s);
    }
  }
}

void ToothProblem::search_shifts(double period_mm, int trials, int rounds) {
  for (int round = 0; round < rounds; ++round) {
    for (size_t p = 0; p < active_.size(); ++p) {
      if (!active_[p]) continue;
      const int pass = static_cast<int>(p);
      const double base = state_.shift_mm[p];
      double best = r_.squaredNorm(), best_shift = base;
      for (int t = 1; t < trials; ++t) {
        const double s = std::fmod(base + period_mm * t / trials, period_mm);
        const double c = cost_with_shift(pass, s);
        if (c < best) best = c, best_shift = s;
      }
      if (best_shift != base) {
        ToothState s = state_;
        s.shift_mm[p] = best_shift;
        set(s);
      }
    }
  }
}

}  // namespace cuspmap

// Residual functors of the floor fit for Eigen's Levenberg-Marquardt: measured minus simulated
// at the window's finite samples with the setup plane projected out (variable projection), plus
// the stepover prior; and the same with the tilt direction held (the direction profile).
// Inputs: FitModel, FitWindow, parameters (deg, mm); output: residuals um, Jacobians.
// Method: Golub & Pereyra 1973 (variable projection); one-sided differences (see below).
#pragma once

#include <cmath>
#include <vector>
#include <Eigen/Dense>

#include "infer/fit_model.h"
#include "infer/fit_window.h"

namespace cuspmap {

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
// Solver tolerance (MINPACK's relative xtol/ftol, tightened: the residual is in float um).
constexpr double kSolverTolerance = 1e-7;

/// Jacobian column from residuals at x (f0), x + h (f_plus) and x - h (f_minus): the one-sided
/// difference with the smaller norm (see kTiltStepDeg).
Eigen::VectorXd shorter_difference(const Eigen::VectorXd& f0, const Eigen::VectorXd& f_plus,
                                   const Eigen::VectorXd& f_minus, double h);

/// Root mean square of a residual vector (0 when empty).
double residual_rms(const Eigen::VectorXd& v);

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
  const FitWindow* window = nullptr;
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
      // The envelope is constant along the lay: one pass's profile across it serves every
      // sample (the lowest pass there).
      const FitProfile prof = simulate_fit_profile(*model, p);
      Eigen::VectorXd other(n);
      bool steps = false;
      for (int k = 0; k < n; ++k) {
        const int i = window->index[k];
        double o = 0.0;
        const double s = prof.at(window->v[static_cast<size_t>(k)], &o);
        other[k] = o;
        steps = steps || std::isfinite(o);
        r[k] = window->measured.z_um(i / window->measured.nx, i % window->measured.nx) -
               (std::isfinite(s) ? s : 0.0);
      }
      if (!steps) return r;
      // A sample within a strip cell of a step (a tilted flat's rim ending, fit_model) lies on
      // the side it matches: the step's place is known to the parameters only as well as the
      // samples either side tell, and a sample put on the wrong side costs the whole step
      // squared, a cost that jumps as the step crosses it (random round trips: three of 22 000
      // samples on a 9.4 mm flat's 2.3 um steps held 86 % of the cost and the tilt 0.7 % off
      // at 5.6 sigma; tools/diagnose_campaign.py seed 2029 rs14). Matched against the plane
      // of the residual as first formed (the setup plane is in the measured heights).
      // Under a stylus tip (model->stylus_tip_mm) a sample within the tip's radius of a step
      // may read any height between its two sides: the tip's closing (ISO 16610-41) fills the
      // low side's corner with the tip's arc, from the low side up to the step's top (derived:
      // a closing lies between the lower and the upper side of a step); such a sample fits as
      // it is. Matched to the nearer side as before, a 10 um tip's closing beside 5.2 um steps
      // pulled the tilt 0.5 % (0.14935 +- 0.00015 deg for 0.1486, 5 sigma: seed 2029 rs10;
      // the same floor without the tip read 0.14864).
      const bool tip = model->stylus_tip_mm > 0.0;
      const Eigen::VectorXd plane = window->q * (window->q.transpose() * r);
      for (int k = 0; k < n; ++k) {
        if (!std::isfinite(other[k])) continue;
        const int i = window->index[k];
        const double alt = window->measured.z_um(i / window->measured.nx,
                                                 i % window->measured.nx) - other[k];
        if (tip && (alt - plane[k]) * (r[k] - plane[k]) <= 0.0) {
          r[k] = plane[k];
        } else if (std::abs(alt - plane[k]) < std::abs(r[k] - plane[k])) {
          r[k] = alt;
        }
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

}  // namespace cuspmap

// Least-squares problem of the tooth-resolved fit: global parameters (runout e cos psi and
// e sin psi, dish, tilt along and across, pass offset) and one start shift per pass, the floor
// of the passes as the cell-wise minimum of one tooth-resolved sweep each, residual with the
// plane projected out. Inputs: ToothWindow, ToothModel; output: residuals (um), Jacobian,
// Levenberg-Marquardt steps. Cost: a global column re-sweeps every pass, a shift column one.
// Method: damped Gauss-Newton (Levenberg 1944, Marquardt 1963; diagonal scaling as Moré 1978).
#pragma once

#include <Eigen/Core>
#include <vector>

#include "infer/tooth_model.h"
#include "infer/tooth_window.h"

namespace cuspmap {

/// The global parameters in the order of the state vector.
enum ToothGlobal {
  kRunoutCos = 0,  ///< e cos(psi), um
  kRunoutSin,      ///< e sin(psi), um
  kDish,           ///< dish, deg
  kTiltAlong,      ///< tilt along the lay, deg (signed)
  kTiltAcross,     ///< tilt across, deg (+ toward lay + 90)
  kOffset,         ///< pass offset across the lay from the window centre, mm
  kToothGlobals
};

/// Globals then one start shift (mm) per pass of the model.
struct ToothState {
  Eigen::Matrix<double, kToothGlobals, 1> g = Eigen::Matrix<double, kToothGlobals, 1>::Zero();
  std::vector<double> shift_mm;  ///< per pass (model.pass_index order), 0 .. Z fz
};

/// The problem: window, fixed model, which globals are free.
class ToothProblem {
 public:
  /// @param[in] w      measured window (must outlive this)
  /// @param[in] model  passes placed (place_passes), cutter with the known teeth
  ToothProblem(const ToothWindow& w, const ToothModel& model);

  /// Sets the state, sweeping every active pass; returns the cost |r|^2 (um^2).
  double set(const ToothState& s);
  /// Cost of the state with pass p's shift replaced (one sweep); the state is not changed.
  double cost_with_shift(int pass, double shift_mm);

  /// Levenberg-Marquardt from the current state over the free globals and the active passes'
  /// shifts; returns the final cost. At most `iterations` Jacobians.
  double solve(int iterations);

  /// Coordinate search of each active pass's shift over [0, period) in `trials` steps (the
  /// others held), `rounds` times; keeps each improvement.
  void search_shifts(double period_mm, int trials, int rounds);

  /// Each active pass's shift tried at +-step and +-step/2 (the others held); keeps the best.
  void refine_shifts(double step_mm);

  /// Passes that leave the lowest height at some sample are active; the others are dropped
  /// from the sweeps (they change nothing measured).
  void update_active();

  /// Jacobian of the residual at the current state (free globals, then active shifts) and the
  /// column labels (global index, or kToothGlobals + pass).
  Eigen::MatrixXd jacobian(std::vector<int>& columns);

  bool free[kToothGlobals] = {false, false, true, true, true, true};  ///< free globals
  const ToothState& state() const { return state_; }
  const Eigen::VectorXd& residual() const { return r_; }
  /// |smoothed measured heights with the plane projected out|^2, um^2: the cost of a floor that
  /// shows no marks at all (the scale the residual is judged on).
  double measured_norm2() const;
  const Heightfield& floor() const { return floor_; }
  const ToothModel& model() const { return model_; }
  int sweeps() const { return sweeps_; }
  int active_passes() const;
  bool is_active(int pass) const { return active_[static_cast<size_t>(pass)]; }

 private:
  Heightfield sweep(const ToothState& s, int pass);
  void combine(const std::vector<Heightfield>& floors, Heightfield& out) const;
  Eigen::VectorXd residual_of(const ToothState& s, std::vector<Heightfield>* floors);
  // The floor smoothed (see the .cpp) at the window's finite samples.
  Eigen::VectorXd smoothed(const Heightfield& hf) const;
  // Smoothed measured minus smoothed floor, plane projected out.
  Eigen::VectorXd residual_of_floor(const Heightfield& floor) const;

  const ToothWindow& w_;
  ToothModel model_;
  int smooth_half_ = 1;       // smoothing kernel half-width, cells
  Eigen::VectorXd measured_;  // smoothed measured heights at the finite samples
  ToothState state_;
  std::vector<bool> active_;
  std::vector<Heightfield> pass_floor_;  // at state_
  Heightfield floor_;                    // combined, at state_
  Eigen::VectorXd r_;                    // projected residual at state_
  int sweeps_ = 0;
};

}  // namespace cuspmap

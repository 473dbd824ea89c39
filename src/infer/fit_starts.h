// Start search of the inverse simulation: the cost of every trial tilt over a fine scan of the
// pass offset, from one sweep of a thin strip across the passes per tilt. Inputs: FitModel,
// sample positions (mm) and heights (um) of the window's finite samples (thinned to
// kStartSamples);
// output: the best starts (cost, parameters). Cost: one strip sweep per tilt (~1000 cells),
// the tilts on model.threads workers.
// Method: straight passes leave a floor that is constant along the lay (derived: the envelope
// of a revolving cutter moving along a line), so one profile across it, shifted, is the floor at
// any offset; the plane is projected out of each residual (Golub & Pereyra 1973).
#pragma once

#include <Eigen/Core>
#include <span>
#include <vector>

#include "infer/fit_model.h"

namespace cuspmap {

/// Most samples the start search compares (evenly thinned): 4000 residuals still place a pass
/// to a small fraction of its width, and 200 tilts x 64 offsets stay ~0.1 s (derived).
inline constexpr int kStartSamples = 4000;

/// One start of the solver.
struct FitStart {
  double cost = 0.0;       ///< squared norm of the plane-free residual, um^2
  Eigen::VectorXd params;  ///< kFitParams values
};

/// Scans tilt along x tilt across (every pair), and for each the pass offset over a stepover.
/// @param[in] model     lay, direction, cutter and window of the fit
/// @param[in] base      parameters (stepover used; tilt and offset replaced)
/// @param[in] xy_mm     n x 2 sample centres (X, Y), mm
/// @param[in] z_um      n measured heights, um
/// @param[in] alongs    tilt components along the feed to try, deg
/// @param[in] acrosses  tilt components across the feed to try, deg
/// @param[in,out] sweeps  incremented by the strip sweeps run
/// @return every (tilt, best offset) start, sorted by cost (lowest first)
std::vector<FitStart> fit_starts(const FitModel& model, const Eigen::VectorXd& base,
                                 const Eigen::MatrixXd& xy_mm, const Eigen::VectorXd& z_um,
                                 std::span<const double> alongs,
                                 std::span<const double> acrosses, int& sweeps);

}  // namespace cuspmap

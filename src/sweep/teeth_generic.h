// Tooth-resolved height an arc, helix or vertical move leaves at a cell. From each local minimum
// of the revolving envelope along the move, the unwrapped bearing of the cell minus the tooth
// angle is followed outwards in steps short enough that it cannot skip a tooth, and each
// crossing is refined by bisection. Cost O(teeth x ~10) bearing evaluations per cell.
// Method: DESIGN.md "Tooth-resolved" (Altintas, Manufacturing Automation, ch. 2; Kline & DeVor
// 1983 runout), crossings bracketed by a sign change and bisected (Numerical Recipes §9.1).
#pragma once

#include <Eigen/Core>

#include "sweep/prepare_moves.h"
#include "sweep/sweep_setup.h"

namespace cuspmap {

/// Lowest tooth-edge height over a cell from an arc or vertical move, mm above the floor (axial
/// offsets included); +infinity when no tooth passes, or when the envelope is not below bound_mm.
/// @param[in] setup     profiles, teeth, runout, tilt, spindle speed
/// @param[in] move      an Arc move, or a vertical Line
/// @param[in] p_mm      cell centre, patch-local
/// @param[in] bound_mm  the cell's current height (mm); +infinity when unreached
double teeth_generic_mm(const SweepSetup& setup, const PreparedMove& move,
                        const Eigen::Vector2d& p_mm, double bound_mm);

}  // namespace cuspmap

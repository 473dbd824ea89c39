// Tooth-resolved height one straight move leaves at a cell: the lowest of the tooth edges that
// pass over it, found without time stepping. Cost O(teeth) root solves per cell (a few atan2
// each) next to each local minimum of the revolving envelope along the move.
// Method: DESIGN.md "Tooth-resolved" (tooth trajectory, Altintas, Manufacturing Automation 2nd
// ed. 2012, ch. 2; runout after Kline & DeVor 1983): tooth k passes the cell when the cell's
// bearing from the axis equals the tooth angle (+ the runout's small bearing offset); along a
// line that condition is atan2(w, x) + kappa x = const, monotone between at most two turning
// points, so each crossing is a bracketed Newton root (Press et al., Numerical Recipes §9.4).
#pragma once

#include "sweep/prepare_moves.h"
#include "sweep/sweep_setup.h"

namespace cuspmap {

/// Lowest tooth-edge height over a cell from one non-vertical straight move, mm above the floor
/// (axial offsets included); +infinity when no tooth passes the cell within reach, or when the
/// revolving envelope (a lower bound of every crossing) is not below bound_mm.
/// @param[in] setup     profiles, teeth, runout, tilt, spindle speed
/// @param[in] move      a Line move with length_xy_mm > 0
/// @param[in] u_mm      cell coordinate along the move from its start
/// @param[in] w_mm      cell coordinate to the move's left
/// @param[in] bound_mm  the cell's current height (mm); +infinity when unreached
double teeth_line_mm(const SweepSetup& setup, const PreparedMove& move, double u_mm, double w_mm,
                     double bound_mm);

}  // namespace cuspmap

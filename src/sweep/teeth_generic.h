// Tooth-resolved height an arc, helix or vertical move leaves at a cell: the lowest of the tooth
// edges that pass over it, found without time stepping. Cost O(teeth) root solves per cell
// next to each local minimum of that tooth's heights along the move.
// Method: DESIGN.md "Tooth-resolved" (Altintas, Manufacturing Automation, ch. 2; Kline & DeVor
// 1983 runout): tooth k passes when the cell's unwrapped bearing from the axis minus the tooth
// angle hits its lattice. Along an arc the bearing's rate is S ra (ra - rho cos(phi - psi)) / d^2,
// so the turning points of bearing minus tooth angle are closed forms in phi; between them each
// crossing is a bracketed Newton root (Numerical Recipes 3rd ed., §9.4, rtsafe). Plunges: the
// bearing is fixed and crossings are closed forms.
#pragma once

#include <Eigen/Core>

#include "sweep/prepare_moves.h"
#include "sweep/sweep_setup.h"

namespace cuspmap {

/// Lowest tooth-edge height over a cell from an arc or vertical move, mm above the floor (axial
/// offsets included); +infinity when no tooth passes, or when the envelope is not below bound_mm.
/// @param[in] setup     profiles, tooth families, tilt, spindle speed
/// @param[in] move      an Arc move, or a vertical Line
/// @param[in] p_mm      cell centre, patch-local
/// @param[in] bound_mm  the cell's current height (mm); +infinity when unreached
double teeth_generic_mm(const SweepSetup& setup, const PreparedMove& move,
                        const Eigen::Vector2d& p_mm, double bound_mm);

}  // namespace cuspmap

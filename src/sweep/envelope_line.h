// Envelope of the revolving cutter along one straight move, applied to a run of cells of one
// grid row: each cell takes the minimum of its height and the lowest point of the cutter that
// passes over it. Heights um above the floor. Cost O(cells of the run), no sampling along the move.
// Method: DESIGN.md "Geometry": a cell whose distances to the moving axis span [dmin, dmax] gets
// z + min q over that interval; ramps and tilt add a linear term along the move, minimised per
// cell in closed form (tool/chord_min).
#pragma once

#include "sweep/prepare_moves.h"
#include "sweep/sweep_setup.h"

namespace cuspmap {

/// Lowers cells i_lo..i_hi of the row at y to the envelope of a straight (or vertical) move.
/// @param[in] setup   profiles, tilt, grid
/// @param[in] move    a Line move
/// @param[in] y_mm    the row's centre Y, patch-local
/// @param[in] i_lo, i_hi  columns to visit (from row_span)
/// @param[in,out] row  the row's heights in um, indexed by column; +infinity = not reached yet
void envelope_line_row(const SweepSetup& setup, const PreparedMove& move, double y_mm, int i_lo,
                       int i_hi, float* row);

/// Envelope height (mm above the floor, axial offset not included) one straight move leaves at
/// a cell with move-frame coordinates u (along the move from its start) and w (to its left).
/// +infinity when the cell is out of reach. The per-cell form of envelope_line_row.
double envelope_line_mm(const SweepSetup& setup, const PreparedMove& move, double u_mm,
                        double w_mm);

}  // namespace cuspmap

// The cells of one grid row a move can reach: the row's intersection with the set of points
// within the reach of the move's axis trace (a capsule for a line, a disc for a vertical move,
// a superset box-and-disc for an arc), as a column range. Cost O(1) per row.
// Method: line/capsule and line/circle intersection (convexity: the capsule meets a line in one
// interval, the union of its end discs and its band).
#pragma once

#include "sweep/prepare_moves.h"

namespace cuspmap {

/// Columns [i_lo, i_hi] of a row at height y whose cell centres the move may reach.
/// @param[in] move      prepared move (patch-local mm)
/// @param[in] y_mm      the row's centre Y, patch-local
/// @param[in] reach_mm  how far from the axis the cutter reaches
/// @param[in] cell_mm   cell size (column i's centre at (i + 0.5) cell)
/// @param[in] i_min, i_max  the tile's columns; the result is clipped to them
/// @param[out] i_lo, i_hi  column range, meaningful when the function returns true
/// @return false when no cell of this row and tile is within reach (exact for lines; arcs may
///         return cells that turn out unreached)
bool row_span(const PreparedMove& move, double y_mm, double reach_mm, double cell_mm, int i_min,
              int i_max, int& i_lo, int& i_hi);

}  // namespace cuspmap

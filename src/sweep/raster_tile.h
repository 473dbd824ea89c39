// Level-distance sweep of a tile whose nearest-move candidates are parallel level lines beside
// the whole tile (a raster at any angle): per row the nearest line changes only where w = n.p
// crosses a line's offset, so each cell needs the two lines around it instead of all of them.
// Inputs: the tile's pruned moves, mm; output: the tile's cells, um. Cost O(cells + rows x lines).
// Method: distance to parallel lines |n.p - c_k| with sorted offsets c_k (the nearest is one of
// the two around n.p); the ball/torus profile of DESIGN.md "Geometry".
#pragma once

#include <cstdint>
#include <vector>

#include "sweep/bin_moves.h"
#include "sweep/prepare_moves.h"
#include "sweep/sweep_setup.h"

namespace cuspmap {

/// Sweeps one tile as a raster of parallel lines, if its moves are one.
/// @param[in] setup      shared sweep data (setup.level_distance true)
/// @param[in] kept       the tile's moves that can be nearest to some cell (distance_tile's
///                       exact pruning), all level at one height
/// @param[in] tile       the tile's cells
/// @param[in] base_um    the moves' tip height plus the lowest tooth, um
/// @param[in,out] grid   rows of setup.nx cells whose first row is grid row grid_row0; when the
///                       function returns true every cell of the tile is written once (um, NaN
///                       where no move reaches), else nothing is touched
/// @param[in] grid_row0  grid row held by grid's first row
/// @param[in] stream     write with stores that bypass the caches (grids far beyond them); the
///                       caller then calls stream_fence() before other threads read the grid
/// @param[out] visits    distance evaluations done (one or two lines per cell)
/// @return false when `kept` is empty, holds an arc, or a line that is not parallel to the first
///         one or whose foot points do not lie inside it at all four tile corners
bool raster_tile(const SweepSetup& setup, const std::vector<const PreparedMove*>& kept,
                 const TileRect& tile, double base_um, float* grid, int grid_row0, bool stream,
                 std::int64_t& visits);

}  // namespace cuspmap

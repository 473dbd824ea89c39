// Level-distance sweep of one tile: when every move that reaches the tile is level at one
// common tip height z and the cutter's profile p(r) does not decrease with r, the envelope of
// the revolving cutter is z + p(distance to the nearest move), so the tile needs only the
// nearest-move distance per cell. Cost O(cells x moves that can be nearest) with exact pruning.
// Method: reduction of the Z-map envelope to a distance field (the "distance-to-path" view of a
// level pass, cf. Choi & Jerard, Sculptured Surface Machining, 1998, Z-map of a ball end mill),
// exact nearest-move search with upper-bound pruning per run of cells.
#pragma once

#include <cstdint>
#include <vector>

#include "sweep/bin_moves.h"
#include "sweep/prepare_moves.h"
#include "sweep/sweep_setup.h"

namespace cuspmap {

/// Sweeps one tile by nearest-move distance, if it can.
/// @param[in] setup       shared sweep data; setup.level_distance must be true
/// @param[in] moves       all prepared moves
/// @param[in] tile_moves  indices into moves of those that may reach this tile
/// @param[in] tile        the tile's cells
/// @param[in,out] grid    as sweep_tile: rows of nx cells whose first row is grid row grid_row0;
///                        when the function returns true every cell of the tile is written once
///                        (um, NaN where no move reaches), else nothing is touched
/// @param[in] grid_row0   grid row held by grid's first row
/// @param[out] visits     distance evaluations done (cells x moves, a constant run counts once)
/// @return false when a move of the tile is a ramp or a plunge or the moves' heights differ: the
///         caller then sweeps the tile with the general envelope
bool distance_tile(const SweepSetup& setup, const std::vector<PreparedMove>& moves,
                   const std::vector<int>& tile_moves, const TileRect& tile, float* grid,
                   int grid_row0, std::int64_t& visits);

}  // namespace cuspmap

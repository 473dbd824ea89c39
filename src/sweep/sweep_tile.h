// Sweeps every move binned to one tile into the grid, row by row, envelope or tooth by tooth.
// Moves go lowest-first (by a lower bound of what they can leave on the tile), and the rest are
// skipped once none can go below the tile's current highest cell: the result is the same as in
// path order (the minimum does not depend on order), the work is less. Heights um.
// Cost O(cells of the tile x moves that can still lower it).
// Method: Z-map minimum update (Choi & Jerard, Sculptured Surface Machining, 1998) with
// bound-ordered pruning.
#pragma once

#include <cstdint>
#include <vector>

#include "sweep/bin_moves.h"
#include "sweep/prepare_moves.h"
#include "sweep/sweep_setup.h"

namespace cuspmap {

/// Which sweep to run.
enum class SweepMode {
  Envelope,  ///< the revolving cutter's envelope
  Teeth,     ///< each tooth edge's own passes
};

/// Sweeps one tile.
/// @param[in] setup       shared sweep data
/// @param[in] moves       all prepared moves
/// @param[in] tile_moves  indices into moves of those that may reach this tile
/// @param[in] tile        the tile's cells
/// @param[in] mode        envelope or teeth
/// @param[in,out] grid    row-major rows of nx cells, um, whose first row is grid row
///                        `grid_row0` (the whole grid, or one band of it); the tile's cells are
///                        written (NaN where no move reached), no other cell is touched
/// @param[in] grid_row0   grid row held by grid's first row (0 for the whole grid)
/// @return cell visits by the minimum update
std::int64_t sweep_tile(const SweepSetup& setup, const std::vector<PreparedMove>& moves,
                        const std::vector<int>& tile_moves, const TileRect& tile, SweepMode mode,
                        float* grid, int grid_row0 = 0);

}  // namespace cuspmap

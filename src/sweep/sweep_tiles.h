// Sweeps a set of tiles of one grid (the whole grid or one band of it) on std::thread workers
// while the calling thread reports progress. Each tile is written by one worker only and the
// minimum does not depend on order, so heights are bit-identical for any thread count.
// Cost O(cells x moves reaching them) / threads. Method: tiled Z-map (Choi & Jerard 1998).
#pragma once

#include <cstdint>
#include <functional>
#include <vector>

#include "sweep/bin_moves.h"
#include "sweep/prepare_moves.h"
#include "sweep/sweep_setup.h"
#include "sweep/sweep_tile.h"

namespace cuspmap {

/// Sweeps tiles[t] with the moves bins[t], for every t.
/// @param[in] setup      shared sweep data
/// @param[in] moves      all prepared moves
/// @param[in] bins       per tile, indices into moves of those that may reach it
/// @param[in] tiles      the tiles (same count as bins)
/// @param[in] mode       envelope or teeth
/// @param[in,out] grid   rows of setup.nx cells; its first row is grid row grid_row0
/// @param[in] grid_row0  grid row held by grid's first row
/// @param[in] threads    workers, >= 1 (clamped to the tile count)
/// @param[in] progress   called with the done fraction of these tiles; may be empty
/// @return cell visits by the minimum update
/// @throws whatever a tile's sweep threw (the first one), after every worker stopped
std::int64_t sweep_tiles(const SweepSetup& setup, const std::vector<PreparedMove>& moves,
                         const std::vector<std::vector<int>>& bins,
                         const std::vector<TileRect>& tiles, SweepMode mode, float* grid,
                         int grid_row0, int threads,
                         const std::function<void(double)>& progress);

/// Worker count for a SimSpec value: > 0 as given, 0 = all hardware threads.
int sweep_threads(int requested);

}  // namespace cuspmap

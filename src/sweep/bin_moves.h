// Tiling of the grid and a uniform-bin spatial index: for every tile, the moves whose reach
// (axis trace grown by the cutter's reach) touches it. Cost O(moves x tiles each covers).
// Method: uniform grid binning (Akenine-Moller et al., Real-Time Rendering 4th ed., §19.1,
// uniform grids), bins = tiles.
#pragma once

#include <vector>

#include "sweep/prepare_moves.h"

namespace cuspmap {

/// A tile: columns [i0, i1) and rows [j0, j1) of the grid.
struct TileRect {
  int i0 = 0;  ///< first column
  int i1 = 0;  ///< one past the last column
  int j0 = 0;  ///< first row
  int j1 = 0;  ///< one past the last row
};

/// The grid cut into tiles of tile_cols x tile_rows cells (smaller at the right and top edges).
struct TileGrid {
  int nx = 0, ny = 0;                ///< grid columns and rows
  int tile_cols = 0, tile_rows = 0;  ///< cells per tile along X and Y
  int tiles_x = 0, tiles_y = 0;      ///< tiles along X and Y

  /// Number of tiles.
  int count() const { return tiles_x * tiles_y; }
  /// Tile t (row-major over tiles).
  TileRect rect(int t) const;
};

/// Tiles of a grid: rows of a tile are contiguous runs of a grid row (SIMD-friendly inner loops),
/// tiles small enough to stay in cache.
TileGrid tile_grid(int nx, int ny);

/// For each tile, the indices (into moves) of the moves that may reach it, in path order.
/// @param[in] moves     prepared moves (patch-local)
/// @param[in] tiles     the tiling
/// @param[in] cell_mm   cell size
/// @param[in] reach_mm  cutter reach from its axis
std::vector<std::vector<int>> bin_moves(const std::vector<PreparedMove>& moves,
                                        const TileGrid& tiles, double cell_mm, double reach_mm);

/// The bins of the tile rows [ty0, ty1) only (one band of the grid), from a candidate list.
/// @param[in] moves       prepared moves (patch-local)
/// @param[in] candidates  indices into moves worth testing, ascending (path order kept)
/// @param[in] tiles       the tiling of the whole grid
/// @param[in] ty0, ty1    tile rows wanted
/// @return bins of tile (tx, ty) at (ty - ty0) tiles_x + tx
std::vector<std::vector<int>> bin_moves_rows(const std::vector<PreparedMove>& moves,
                                             const std::vector<int>& candidates,
                                             const TileGrid& tiles, int ty0, int ty1,
                                             double cell_mm, double reach_mm);

}  // namespace cuspmap

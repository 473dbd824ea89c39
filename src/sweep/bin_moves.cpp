// Tiles and per-tile move lists: box range first, then the exact move-to-tile distance.
// Inputs: PreparedMove list, grid size, cell and reach (mm); output: per-tile index lists.
// Method: uniform binning of bounding boxes, refined by segment-box distance.
#include "sweep/bin_moves.h"

#include <algorithm>
#include <cmath>

namespace cuspmap {
namespace {

// Tile shape: 256 columns keep the per-row set-up of a move small against the run it fills;
// 32 rows x 256 floats = 32 KiB sits in a core's L1/L2 while every move of the tile passes.
constexpr int kTileCols = 256;
constexpr int kTileRows = 32;

// Tiles along X whose cells a line move can reach within tile row ty: the part of the segment
// whose y lies within the row's cell centres +- reach spans some x range, and a cell within reach
// of the segment lies within reach of that part. The range is widened by a cell on each side
// (rounding of the clip), so it never drops a tile the exact distance test keeps.
void line_columns(const PreparedMove& m, int ty, const TileGrid& tiles, double cell_mm,
                  double reach_mm, int& col0, int& col1) {
  const double dy = m.b_mm.y() - m.a_mm.y();
  if (dy == 0.0) return;
  const int j0 = ty * tiles.tile_rows, j1 = std::min(tiles.ny, j0 + tiles.tile_rows);
  const double y_lo = (j0 + 0.5) * cell_mm - reach_mm - cell_mm;
  const double y_hi = (j1 - 0.5) * cell_mm + reach_mm + cell_mm;
  const double t_a = std::clamp((y_lo - m.a_mm.y()) / dy, 0.0, 1.0);
  const double t_b = std::clamp((y_hi - m.a_mm.y()) / dy, 0.0, 1.0);
  const double dx = m.b_mm.x() - m.a_mm.x();
  const double x_a = m.a_mm.x() + t_a * dx, x_b = m.a_mm.x() + t_b * dx;
  const double tile_w = tiles.tile_cols * cell_mm, grow = reach_mm + cell_mm;
  col0 = std::max(col0, static_cast<int>(std::floor((std::min(x_a, x_b) - grow) / tile_w)));
  col1 = std::min(col1, static_cast<int>(std::floor((std::max(x_a, x_b) + grow) / tile_w)));
}

}  // namespace

TileRect TileGrid::rect(int t) const {
  const int tx = t % tiles_x, ty = t / tiles_x;
  TileRect r;
  r.i0 = tx * tile_cols;
  r.i1 = std::min(nx, r.i0 + tile_cols);
  r.j0 = ty * tile_rows;
  r.j1 = std::min(ny, r.j0 + tile_rows);
  return r;
}

TileGrid tile_grid(int nx, int ny) {
  TileGrid g;
  g.nx = nx;
  g.ny = ny;
  g.tile_cols = kTileCols;
  g.tile_rows = kTileRows;
  g.tiles_x = (nx + kTileCols - 1) / kTileCols;
  g.tiles_y = (ny + kTileRows - 1) / kTileRows;
  return g;
}

std::vector<std::vector<int>> bin_moves_rows(const std::vector<PreparedMove>& moves,
                                             const std::vector<int>& candidates,
                                             const TileGrid& tiles, int ty0, int ty1,
                                             double cell_mm, double reach_mm) {
  std::vector<std::vector<int>> bins(static_cast<std::size_t>(ty1 - ty0) * tiles.tiles_x);
  const double tile_w = tiles.tile_cols * cell_mm, tile_h = tiles.tile_rows * cell_mm;
  auto tile_index = [](double v, double size, int lo, int hi) {
    return std::clamp(static_cast<int>(std::floor(v / size)), lo, hi);
  };
  for (int k : candidates) {
    const PreparedMove& m = moves[k];
    if (m.y_max_mm + reach_mm < ty0 * tile_h || m.y_min_mm - reach_mm >= ty1 * tile_h) continue;
    const int tx0 = tile_index(m.x_min_mm - reach_mm, tile_w, 0, tiles.tiles_x - 1);
    const int tx1 = tile_index(m.x_max_mm + reach_mm, tile_w, 0, tiles.tiles_x - 1);
    const int row0 = tile_index(m.y_min_mm - reach_mm, tile_h, ty0, ty1 - 1);
    const int row1 = tile_index(m.y_max_mm + reach_mm, tile_h, ty0, ty1 - 1);
    for (int ty = row0; ty <= row1; ++ty) {
      int col0 = tx0, col1 = tx1;
      if (m.kind == MoveKind::Line) line_columns(m, ty, tiles, cell_mm, reach_mm, col0, col1);
      for (int tx = col0; tx <= col1; ++tx) {
        const TileRect r = tiles.rect(ty * tiles.tiles_x + tx);
        // Cell centres of the tile span this box.
        const double dist = m.distance_to_box((r.i0 + 0.5) * cell_mm, (r.i1 - 0.5) * cell_mm,
                                              (r.j0 + 0.5) * cell_mm, (r.j1 - 0.5) * cell_mm);
        if (dist <= reach_mm) bins[(ty - ty0) * tiles.tiles_x + tx].push_back(k);
      }
    }
  }
  return bins;
}

std::vector<std::vector<int>> bin_moves(const std::vector<PreparedMove>& moves,
                                        const TileGrid& tiles, double cell_mm, double reach_mm) {
  std::vector<int> all(moves.size());
  for (std::size_t k = 0; k < moves.size(); ++k) all[k] = static_cast<int>(k);
  return bin_moves_rows(moves, all, tiles, 0, tiles.tiles_y, cell_mm, reach_mm);
}

}  // namespace cuspmap

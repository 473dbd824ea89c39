// Tests of the tile binning of the sweep: each tile's list holds exactly the moves whose exact
// distance to the tile's cell centres is within the reach, in path order, whatever the moves'
// angles (a line's per-tile-row column range must never drop a tile the exact test keeps).
// Method: brute force over every (tile, move) pair with PreparedMove::distance_to_box (derived).
#include "sweep/bin_moves.h"

#include <vector>

#include "path/raster.h"
#include "sweep/distance_fixtures.h"
#include "test_support.h"

namespace cuspmap {
namespace {

using test::make_cutter;
using test::square_patch;

// Every tile's moves by testing every move against every tile (derived: the definition).
std::vector<std::vector<int>> brute_force_bins(const std::vector<PreparedMove>& moves,
                                               const TileGrid& tiles, double cell_mm,
                                               double reach_mm) {
  std::vector<std::vector<int>> bins(tiles.count());
  for (int t = 0; t < tiles.count(); ++t) {
    const TileRect r = tiles.rect(t);
    for (std::size_t k = 0; k < moves.size(); ++k) {
      const double d = moves[k].distance_to_box((r.i0 + 0.5) * cell_mm, (r.i1 - 0.5) * cell_mm,
                                                (r.j0 + 0.5) * cell_mm, (r.j1 - 0.5) * cell_mm);
      if (d <= reach_mm) bins[t].push_back(static_cast<int>(k));
    }
  }
  return bins;
}

Move line(double x0, double y0, double x1, double y1, double z = 0.0) {
  Move m;
  m.start_mm = {x0, y0, z};
  m.end_mm = {x1, y1, z};
  m.feed_mm_per_min = 1000.0;
  return m;
}

void require_exact_bins(const Toolpath& path, const Patch& patch, double reach_mm) {
  PreparedCounts counts;
  const std::vector<PreparedMove> moves =
      prepare_moves(path, CutSpec{}, patch, reach_mm, 10.0, counts);
  REQUIRE(!moves.empty());
  const int nx = static_cast<int>(std::lround(patch.size_x_mm / patch.cell_mm));
  const int ny = static_cast<int>(std::lround(patch.size_y_mm / patch.cell_mm));
  const TileGrid tiles = tile_grid(nx, ny);
  REQUIRE(tiles.count() > 1);
  const auto fast = bin_moves(moves, tiles, patch.cell_mm, reach_mm);
  const auto slow = brute_force_bins(moves, tiles, patch.cell_mm, reach_mm);
  REQUIRE(fast.size() == slow.size());
  for (std::size_t t = 0; t < fast.size(); ++t) {
    CAPTURE(t);
    REQUIRE(fast[t] == slow[t]);
  }
}

}  // namespace

TEST_CASE("bin_moves: angled rasters bin exactly the tiles within reach", "[sweep]") {
  const Patch patch = square_patch(6.0, 0.01);  // 600 x 600 cells: 3 x 19 tiles
  const Cutter cutter = make_cutter(CutterShape::Ball);
  for (double angle : {0.0, 0.01, 7.0, 30.0, 45.0, 89.9, 90.0, 135.0}) {
    for (RasterDirection dir : {RasterDirection::Zigzag, RasterDirection::OneWay}) {
      CAPTURE(angle, static_cast<int>(dir));
      PathSpec spec;
      spec.stepover_mm = 0.7;
      spec.angle_deg = angle;
      spec.direction = dir;
      const Toolpath path = raster_path(spec, CutSpec{}, patch, cutter);
      for (double reach : {0.05, 1.0, 3.0}) require_exact_bins(path, patch, reach);
    }
  }
}

TEST_CASE("bin_moves: lines ending inside the patch, plunges and arcs bin exactly", "[sweep]") {
  const Patch patch = square_patch(6.0, 0.01);
  Toolpath path;
  Move plunge = line(1.0, 1.0, 1.0, 1.0, 2.0);
  plunge.end_mm.z() = 0.0;  // vertical: no XY travel
  path.moves.push_back(plunge);
  path.moves.push_back(line(1.0, 1.0, 4.3, 2.9));        // short diagonal inside
  path.moves.push_back(line(-2.0, 0.2, 8.0, 0.2001));    // almost level across
  path.moves.push_back(line(5.9, -1.0, 5.9001, 7.0));    // almost vertical at the edge
  path.moves.push_back(line(3.0, 5.5, 2.0, 0.25));       // steep, downward
  Move arc = line(4.0, 3.0, 2.0, 3.0);
  arc.kind = MoveKind::Arc;
  arc.centre_mm = {3.0, 3.0};
  arc.ccw = true;
  path.moves.push_back(arc);
  for (double reach : {0.05, 0.4, 3.0}) {
    CAPTURE(reach);
    require_exact_bins(path, patch, reach);
  }
}

}  // namespace cuspmap

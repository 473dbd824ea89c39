// Tests for io/montage: tiles placed at the layout, labels drawn, shared scale, scale bar length.
#include "report/montage.h"

#include "report/legend.h"
#include "test_support.h"

using namespace cuspmap;

namespace {

MontageTile tile(int w, int h, double mm_per_px, std::uint8_t level,
                 std::vector<std::string> lines) {
  MontageTile t;
  t.image = make_image(w, h, 1, gray(level));
  t.mm_per_px = mm_per_px;
  t.label_lines = std::move(lines);
  return t;
}

}  // namespace

TEST_CASE("render_montage: tiles at their cells, labels in the band under each", "[report]") {
  std::vector<MontageTile> tiles = {
      tile(80, 60, 0.05, 40, {"raster zigzag", "ball 6 mm", "stepover 0.3 mm"}),
      tile(80, 60, 0.05, 120, {"raster one-way"}),
      tile(80, 60, 0.05, 200, {}),
  };
  MontageOptions o;
  o.columns = 2;
  const MontageLayout layout = montage_layout(tiles, o);
  const Image img = render_montage(tiles, o);
  REQUIRE(img.channels == 1);
  REQUIRE(layout.cell_width_px == 80);
  REQUIRE(layout.cell_height_px == 60);
  for (int k = 0; k < 3; ++k) {
    const int x = layout.tile_x(k, 2), y = layout.tile_y(k, 2);
    CAPTURE(k, x, y);
    REQUIRE(img.at(x, y) == tiles[k].image.at(0, 0));
    REQUIRE(img.at(x + 79, y + 59) == tiles[k].image.at(0, 0));
    REQUIRE(img.at(x - 1, y) == 0);  // frame
  }
  REQUIRE(layout.tile_y(2, 2) > layout.tile_y(0, 2) + 60);  // third tile on the second row
  // Label band of tile 0 (3 lines) holds ink; tile 2 has none.
  const auto ink_in_band = [&](int k) {
    int ink = 0;
    const int x = layout.tile_x(k, 2), y = layout.tile_y(k, 2) + layout.cell_height_px + 2;
    for (int yy = y; yy < y + layout.label_height_px - 2; ++yy) {
      for (int xx = x; xx < x + layout.cell_width_px; ++xx) ink += img.at(xx, yy) == 0 ? 1 : 0;
    }
    return ink;
  };
  REQUIRE(ink_in_band(0) > 100);
  REQUIRE(ink_in_band(1) > 20);
  REQUIRE(ink_in_band(2) == 0);
  REQUIRE(ink_in_band(0) > ink_in_band(1));
}

TEST_CASE("render_montage: scale bar length in pixels = length / mm per pixel", "[report]") {
  std::vector<MontageTile> tiles = {tile(120, 50, 0.02, 128, {"a"}),
                                    tile(120, 50, 0.02, 128, {"b"})};
  MontageOptions o;
  const MontageLayout layout = montage_layout(tiles, o);
  const Image img = render_montage(tiles, o);
  // Half a 120 px cell at 0.02 mm/px = 1.2 mm -> 1 mm -> 50 px.
  const ScaleBar expected = choose_scale_bar(0.02, 60, LengthUnit::Millimetre);
  REQUIRE_NEAR(expected.length_mm, 1.0, 1e-12);
  REQUIRE(expected.length_px == 50);
  const int row = layout.scale_bar_y_px + kScaleBarTickPx + 1;
  int run = 0;
  for (int x = layout.scale_bar_x_px; x < img.width && img.at(x, row) == 0; ++x) ++run;
  REQUIRE(run == 50);
  REQUIRE_NEAR(run * layout.mm_per_px, 1.0, 1e-9);
}

TEST_CASE("render_montage: finer tiles are shrunk to the shared coarsest scale", "[report]") {
  // Tile b is at 0.025 mm/px, twice as fine as a: it is shrunk by 2 to 40 x 30.
  MontageTile a = tile(40, 30, 0.05, 10, {"a"});
  MontageTile b = tile(80, 60, 0.025, 10, {"b"});
  for (int y = 0; y < 60; ++y) {
    for (int x = 0; x < 80; ++x) b.image.at(x, y) = static_cast<std::uint8_t>(x % 2 == 0 ? 0 : 200);
  }
  MontageOptions o;
  const MontageLayout layout = montage_layout({a, b}, o);
  REQUIRE_NEAR(layout.mm_per_px, 0.05, 0.0);
  REQUIRE(layout.cell_width_px == 40);
  REQUIRE(layout.cell_height_px == 30);
  const Image img = render_montage({a, b}, o);
  // Box average of 0 and 200 = 100 everywhere inside tile b.
  REQUIRE(img.at(layout.tile_x(1, 4) + 5, layout.tile_y(1, 4) + 5) == 100);
  // Out of the tile's 40 columns, the frame is right after it.
  REQUIRE(img.at(layout.tile_x(1, 4) + 40, layout.tile_y(1, 4) + 5) == 0);
  const Image shrunk = shrink_image(b.image, 2.0);
  REQUIRE(shrunk.width == 40);
  REQUIRE(shrunk.height == 30);
  REQUIRE_THROWS_AS(render_montage({}, o), std::invalid_argument);
  MontageTile bad = a;
  bad.mm_per_px = 0.0;
  REQUIRE_THROWS_AS(render_montage({bad}, o), std::invalid_argument);
}

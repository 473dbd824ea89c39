// Tests for io/height_image: exact gray levels of a linear ramp, +Y up, NaN marking, fixed
// range clamping, block downsampling, legend placement.
#include "report/height_image.h"

#include <cmath>
#include <limits>

#include "core/input_error.h"
#include "report/legend.h"
#include "test_support.h"

using namespace cuspmap;

namespace {

// A heightfield nx x ny with z(j, i) = f(i, j), cell 0.01 mm.
template <class F>
Heightfield field(int nx, int ny, F f) {
  Heightfield hf;
  hf.nx = nx;
  hf.ny = ny;
  hf.cell_mm = 0.01;
  hf.z_um.resize(ny, nx);
  for (int j = 0; j < ny; ++j) {
    for (int i = 0; i < nx; ++i) hf.z_um(j, i) = static_cast<float>(f(i, j));
  }
  return hf;
}

HeightImageOptions no_legend() {
  HeightImageOptions o;
  o.legend = false;
  return o;
}

}  // namespace

TEST_CASE("render_height_image: a linear ramp maps to the exact gray ramp, top row = highest Y",
          "[report]") {
  // z = 0.5 j um for rows j = 0..254: auto range 0..127 um, 0.5 um per level, so row j has gray
  // level j; image row r shows heightfield row 254 - r (the picture is seen from above, +Y up).
  const Heightfield hf = field(5, 255, [](int, int j) { return 0.5 * j; });
  const HeightImage img = render_height_image(hf, no_legend());
  REQUIRE(img.image.width == 5);
  REQUIRE(img.image.height == 255);
  REQUIRE(img.image.channels == 1);
  REQUIRE_NEAR(img.lo_um, 0.0, 0.0);
  REQUIRE_NEAR(img.hi_um, 127.0, 0.0);
  REQUIRE_NEAR(img.um_per_level, 0.5, 1e-12);
  for (int r = 0; r < 255; ++r) {
    for (int c = 0; c < 5; ++c) {
      CAPTURE(r, c);
      REQUIRE(img.image.at(c, r) == 254 - r);
    }
  }
}

TEST_CASE("render_height_image: one high cell at the top-right of the patch is drawn top-right",
          "[report]") {
  // 4 x 3 field, all 0 except the cell with the highest X and highest Y:
  //   row j=2 (top):    0 0 0 9   -> image row 0
  //   row j=1:          0 0 0 0
  //   row j=0 (bottom): 0 0 0 0   -> image row 2
  const Heightfield hf = field(4, 3, [](int i, int j) { return i == 3 && j == 2 ? 9.0 : 0.0; });
  const HeightImage img = render_height_image(hf, no_legend());
  REQUIRE(img.image.at(3, 0) == 254);
  REQUIRE(img.image.at(3, 2) == 0);
  REQUIRE(img.image.at(0, 0) == 0);
}

TEST_CASE("render_height_image: unreached cells are pure white, heights stay within 0..254",
          "[report]") {
  Heightfield hf = field(6, 4, [](int i, int j) { return i + 10.0 * j; });
  hf.z_um(1, 2) = kUnreached;
  const HeightImage img = render_height_image(hf, no_legend());
  REQUIRE(img.image.at(2, 4 - 1 - 1) == kUnreachedLevel);
  REQUIRE(img.unreached_pixels == 1);
  int white = 0;
  for (std::uint8_t v : img.image.pixels) white += v == 255 ? 1 : 0;
  REQUIRE(white == 1);  // the maximum height is drawn 254, never 255
  // An all-NaN field: all white, range 0..0.
  Heightfield empty = field(3, 3, [](int, int) { return std::nan(""); });
  const HeightImage none = render_height_image(empty, no_legend());
  REQUIRE(none.unreached_pixels == 9);
  REQUIRE(none.hi_um == 0.0);
}

TEST_CASE("render_height_image: a fixed range clamps heights outside it and counts them", "[report]") {
  // Heights 0..30 um across X, fixed range 10..20 um: cells below 10 -> 0, above 20 -> 254.
  const Heightfield hf = field(31, 2, [](int i, int) { return double(i); });
  HeightImageOptions o = no_legend();
  o.range = HeightRange{10.0, 20.0};
  const HeightImage img = render_height_image(hf, o);
  REQUIRE(img.lo_um == 10.0);
  REQUIRE(img.hi_um == 20.0);
  REQUIRE(img.image.at(0, 0) == 0);
  REQUIRE(img.image.at(10, 0) == 0);
  REQUIRE(img.image.at(15, 0) == 127);  // round(254 x 0.5)
  REQUIRE(img.image.at(20, 1) == 254);
  REQUIRE(img.image.at(30, 1) == 254);
  REQUIRE(img.clamped_cells == 2 * (10 + 10));
  o.range = HeightRange{5.0, 5.0};
  REQUIRE_THROWS_MATCHES(render_height_image(hf, o), InputError,
                         Catch::Message("height range 5..5 um: needs two finite heights with the "
                                        "high end above the low end"));
}

TEST_CASE("render_height_image: large grids are block-reduced by mean or minimum", "[report]") {
  // 10 x 10 cells, max 4 pixels -> k = 3, a 4 x 4 map; the last block row/column holds 1 cell.
  const Heightfield hf = field(10, 10, [](int i, int j) { return i + 100.0 * j; });
  HeightImageOptions o = no_legend();
  o.max_pixels = 4;
  o.downsample = BlockReduce::Mean;
  o.range = HeightRange{0.0, 254.0 * 4.0};  // 4 um per level: level = z / 4
  const HeightImage mean = render_height_image(hf, o);
  REQUIRE(mean.cells_per_pixel == 3);
  REQUIRE_NEAR(mean.mm_per_px, 0.03, 1e-12);
  REQUIRE(mean.image.width == 4);
  REQUIRE(mean.image.height == 4);
  // Bottom-left pixel (image row 3) = block of rows 0..2, columns 0..2: mean z = 1 + 100 = 101.
  REQUIRE(mean.image.at(0, 3) == height_gray_level(101.0, 0.0, 1016.0));
  // Top-right pixel = block of row 9, column 9 alone: z = 909.
  REQUIRE(mean.image.at(3, 0) == height_gray_level(909.0, 0.0, 1016.0));
  o.downsample = BlockReduce::Min;
  const HeightImage low = render_height_image(hf, o);
  REQUIRE(low.image.at(0, 3) == 0);                                      // min z = 0
  REQUIRE(low.image.at(1, 2) == height_gray_level(303.0, 0.0, 1016.0));  // rows 3..5, cols 3..5
}

TEST_CASE("render_height_image: the legend sits right of the framed map and shows the ramp",
          "[report]") {
  const Heightfield hf = field(50, 40, [](int i, int j) { return 0.1 * i + 0.2 * j; });
  const HeightImage bare = render_height_image(hf, no_legend());
  HeightImageOptions o;
  o.units = LengthUnit::Inch;
  const HeightImage img = render_height_image(hf, o);
  REQUIRE(img.image.width > img.map_x_px + 50 + 60);
  REQUIRE(img.image.height >= img.map_y_px + 40);
  // The map pixels equal the legend-free picture.
  for (int r = 0; r < 40; ++r) {
    for (int c = 0; c < 50; ++c) {
      REQUIRE(img.image.at(img.map_x_px + c, img.map_y_px + r) == bare.image.at(c, r));
    }
  }
  // A black frame one pixel outside the map.
  REQUIRE(img.image.at(img.map_x_px - 1, img.map_y_px + 5) == 0);
  REQUIRE(img.image.at(img.map_x_px + 50, img.map_y_px + 5) == 0);
  // Right of the map: the ramp's top row (254) at the map's top row, the bottom of the ramp (0),
  // and black label ink.
  const int legend_x = img.map_x_px + 50 + 1;
  bool has_top = false, has_bottom = false;
  int ink = 0;
  for (int y = 0; y < img.image.height; ++y) {
    for (int x = legend_x; x < img.image.width; ++x) {
      const std::uint8_t v = img.image.at(x, y);
      has_top = has_top || (v == 254 && y == img.map_y_px);
      has_bottom = has_bottom || v == 0;
      ink += v == 0 ? 1 : 0;
    }
  }
  REQUIRE(has_top);
  REQUIRE(has_bottom);
  REQUIRE(ink > 200);
}

TEST_CASE("height_image_caption: states the range, the gray step and the pixel size", "[report]") {
  const Heightfield hf = field(5, 255, [](int, int j) { return 0.5 * j; });
  const HeightImage img = render_height_image(hf, no_legend());
  REQUIRE(height_image_caption(img, LengthUnit::Millimetre) ==
          "Height seen from above, +Y up: black = 0 um, light gray = 127 um (0.500 um per gray "
          "level); white = not reached; 1 pixel = 1 x 1 cells (0.0100 mm).");
  // 127 um = 5000 uin (1 um = 39.37 uin).
  REQUIRE(height_image_caption(img, LengthUnit::Inch).find("light gray = 5000 uin") !=
          std::string::npos);
}

TEST_CASE("render_height_image: zoom draws each cell as zoom x zoom pixels; the caption says so",
          "[report]") {
  const Heightfield hf = field(6, 4, [](int i, int j) { return i + 10.0 * j; });
  HeightImageOptions o = no_legend();
  o.zoom = 5;
  const HeightImage img = render_height_image(hf, o);
  const HeightImage one = render_height_image(hf, no_legend());
  REQUIRE(img.image.width == 30);
  REQUIRE(img.image.height == 20);
  REQUIRE(img.zoom == 5);
  REQUIRE(img.unreached_pixels == 0);
  for (int y = 0; y < 20; ++y) {
    for (int x = 0; x < 30; ++x) REQUIRE(img.image.at(x, y) == one.image.at(x / 5, y / 5));
  }
  const std::string caption = height_image_caption(img, LengthUnit::Millimetre);
  INFO(caption);
  REQUIRE(caption.find("1 cell (0.01 mm) = 5 x 5 pixels.") != std::string::npos);
}

TEST_CASE("render_height_image: the auto range is the finite extremes, zeros' signs included",
          "[report]") {
  // The range is the lowest and highest finite height (NaN and infinities left out), taken in
  // lanes; it must equal the plain loop lo = min(lo, v), hi = max(hi, v) over the grid in Eigen's
  // reshaped() (column-major) order, which keeps the first of equal values: with +0 and -0 both
  // lowest, the sign of the first in that order (derived).
  const float inf = std::numeric_limits<float>::infinity();
  for (const int nx : {1, 3, 4, 7, 33}) {
    for (const int ny : {1, 2, 5}) {
      Heightfield hf = field(nx, ny, [](int i, int j) { return 1.0 + 0.37 * i - 0.21 * j; });
      hf.z_um(ny - 1, 0) = kUnreached;
      if (nx * ny > 4) hf.z_um(0, nx - 1) = -inf;  // not finite: outside the range
      double lo = inf, hi = -inf;
      for (float v : hf.z_um.reshaped()) {
        if (!std::isfinite(v)) continue;
        lo = std::min(lo, double{v});
        hi = std::max(hi, double{v});
      }
      const HeightImage img = render_height_image(hf, HeightImageOptions{});
      CAPTURE(nx, ny);
      REQUIRE(img.lo_um == (std::isfinite(lo) ? lo : 0.0));
      REQUIRE(img.hi_um == (std::isfinite(hi) ? hi : 0.0));
    }
  }
  // Zeros lowest: row-major order meets +0 first, column-major order -0 first.
  Heightfield zeros = field(6, 3, [](int i, int j) { return 1.0 + i + j; });
  zeros.z_um(0, 4) = 0.0f;   // row 0, column 4
  zeros.z_um(2, 1) = -0.0f;  // row 2, column 1: first in column-major order
  const HeightImage z = render_height_image(zeros, HeightImageOptions{});
  REQUIRE(z.lo_um == 0.0);
  REQUIRE(std::signbit(z.lo_um));
  // Zeros highest: the same rule for the top of the range.
  Heightfield below = field(6, 3, [](int i, int j) { return -1.0 - i - j; });
  below.z_um(1, 2) = -0.0f;  // column 2
  below.z_um(0, 3) = 0.0f;   // column 3: later in column-major order
  const HeightImage b = render_height_image(below, HeightImageOptions{});
  REQUIRE(b.hi_um == 0.0);
  REQUIRE(std::signbit(b.hi_um));
}

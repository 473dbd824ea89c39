// Tests for io/legend: the gray ramp of the height legend, scale bar lengths (1-2-5).
#include "report/legend.h"

#include <algorithm>
#include <cmath>

#include "test_support.h"

using namespace cuspmap;

TEST_CASE("render_height_legend: ramp rows run linearly from 254 at the top to 0", "[report]") {
  HeightLegendSpec spec;
  spec.lo_um = -1.5;
  spec.hi_um = 2.5;
  spec.bar_height_px = 128;
  const Image img = render_height_legend(spec);
  const int top = legend_ramp_top_px(spec);
  const int x = legend_ramp_left_px(spec) + legend_ramp_width_px(spec) / 2;
  for (int r = 0; r < 128; ++r) {
    CAPTURE(r);
    REQUIRE(img.at(x, top + r) == std::lround(254.0 * (1.0 - r / 127.0)));
  }
  // The "not reached" swatch: a framed white square below the ramp.
  REQUIRE(img.height > top + 128 + 16);
}

TEST_CASE("render_height_legend: labels differ with the range and the unit", "[report]") {
  HeightLegendSpec a;
  a.lo_um = 0.0;
  a.hi_um = 1.0;
  HeightLegendSpec b = a;
  b.hi_um = 2.0;
  HeightLegendSpec c = a;
  c.units = LengthUnit::Inch;
  const Image ia = render_height_legend(a), ib = render_height_legend(b),
              ic = render_height_legend(c);
  REQUIRE(ia.pixels != ib.pixels);
  REQUIRE(ia.pixels != ic.pixels);
  REQUIRE(height_unit_label(LengthUnit::Inch) == "uin");
  // 1 um = 39.37 uin (ISO 1302 tables; 1 in = 25.4 mm exactly).
  REQUIRE_NEAR(height_in_display_unit(1.0, LengthUnit::Inch), 39.3700787, 1e-6);
}

TEST_CASE("choose_scale_bar: the longest 1-2-5 length that fits, in mm or inches", "[report]") {
  // 0.05 mm per pixel, 100 px -> at most 5 mm -> 5 mm = 100 px.
  ScaleBar bar = choose_scale_bar(0.05, 100, LengthUnit::Millimetre);
  REQUIRE_NEAR(bar.length_mm, 5.0, 1e-12);
  REQUIRE(bar.length_px == 100);
  REQUIRE(bar.label == "5 mm");
  // 0.05 mm per pixel, 99 px -> at most 4.95 mm -> 2 mm = 40 px.
  bar = choose_scale_bar(0.05, 99, LengthUnit::Millimetre);
  REQUIRE(bar.length_px == 40);
  // Inches: 200 px of 0.05 mm = 10 mm = 0.394 in -> 0.2 in = 5.08 mm -> 101.6 -> 102 px.
  bar = choose_scale_bar(0.05, 200, LengthUnit::Inch);
  REQUIRE_NEAR(bar.length_mm, 5.08, 1e-12);
  REQUIRE(bar.length_px == 102);
  REQUIRE(bar.label == "0.2 in");
}

TEST_CASE("draw_scale_bar: the body is exactly length_px black pixels wide", "[report]") {
  Image img = make_image(200, 60, 1, kWhite);
  const ScaleBar bar = choose_scale_bar(0.01, 150, LengthUnit::Millimetre);  // 1 mm = 100 px
  REQUIRE(bar.length_px == 100);
  draw_scale_bar(img, 20, 5, bar, 1);
  for (int row = 5 + kScaleBarTickPx; row < 5 + kScaleBarTickPx + kScaleBarThicknessPx; ++row) {
    int black = 0;
    for (int x = 0; x < 200; ++x) black += img.at(x, row) == 0 ? 1 : 0;
    REQUIRE(black == 100);
    REQUIRE(img.at(20, row) == 0);
    REQUIRE(img.at(119, row) == 0);
  }
}

TEST_CASE("nearest_gray_level: std::lround clamped to [0, 254], halves up", "[report]") {
  // Source: C++ standard [c.math] lround: "rounding halfway cases away from zero".
  for (double v = -3.0; v <= 258.0; v += 0.03125) {  // every eighth of a level, halves included
    const long expected = std::clamp(std::lround(v), 0L, long{kTopHeightLevel});
    REQUIRE(nearest_gray_level(v) == expected);
  }
  CHECK(nearest_gray_level(std::nextafter(0.5, 0.0)) == 0);
  CHECK(nearest_gray_level(static_cast<double>(std::nextafter(0.5f, 0.0f) * 1.0f)) == 0);
  CHECK(nearest_gray_level(1e300) == kTopHeightLevel);
  CHECK(nearest_gray_level(-1e300) == 0);
}

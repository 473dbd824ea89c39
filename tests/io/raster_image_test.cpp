// Tests for io/raster_image: fill/blit clipping, gray<->RGB conversion, Bresenham lines.
#include "io/raster_image.h"

#include "test_support.h"

using namespace cuspmap;

namespace {

int count_level(const Image& img, std::uint8_t level) {
  int n = 0;
  for (int y = 0; y < img.height; ++y) {
    for (int x = 0; x < img.width; ++x) n += img.at(x, y) == level ? 1 : 0;
  }
  return n;
}

}  // namespace

TEST_CASE("make_image: size, channels and background", "[io]") {
  const Image g = make_image(7, 5, 1, gray(9));
  REQUIRE(g.pixels.size() == 35u);
  REQUIRE(count_level(g, 9) == 35);
  const Image c = make_image(2, 3, 3, Color{1, 2, 3});
  REQUIRE(c.pixels.size() == 18u);
  REQUIRE(pixel(c, 1, 2) == Color{1, 2, 3});
  REQUIRE_THROWS_AS(make_image(2, 2, 2, kWhite), std::invalid_argument);
}

TEST_CASE("fill_rect: clips to the image", "[io]") {
  Image img = make_image(10, 10, 1, kWhite);
  // Rectangle [-3, 2) x [8, 13): inside part is columns 0..1, rows 8..9 = 4 pixels.
  fill_rect(img, -3, 8, 5, 5, kBlack);
  REQUIRE(count_level(img, 0) == 4);
  REQUIRE(img.at(1, 9) == 0);
  REQUIRE(img.at(2, 9) == 255);
  fill_rect(img, 20, 20, 5, 5, kBlack);  // fully outside: nothing
  REQUIRE(count_level(img, 0) == 4);
}

TEST_CASE("blit: gray into RGB copies levels, RGB into gray takes the BT.601 luma", "[io]") {
  Image g = make_image(3, 3, 1, gray(100));
  Image c = make_image(4, 4, 3, kWhite);
  blit(g, c, 2, 2);  // only the 2 x 2 top-left part of g fits
  REQUIRE(pixel(c, 2, 2) == gray(100));
  REQUIRE(pixel(c, 3, 3) == gray(100));
  REQUIRE(pixel(c, 1, 1) == kWhite);
  Image red = make_image(1, 1, 3, Color{255, 0, 0});
  Image out = make_image(1, 1, 1, kWhite);
  blit(red, out, 0, 0);
  // Luma of pure red, ITU-R BT.601: 0.299 x 255 = 76.2 -> 76.
  REQUIRE(out.at(0, 0) == 76);
}

TEST_CASE("draw_line: Bresenham covers both endpoints and one pixel per major step", "[io]") {
  Image img = make_image(20, 20, 1, kWhite);
  draw_line(img, 2, 3, 17, 8, {kBlack, 1, 0});
  // 15 steps along X -> 16 pixels (Bresenham 1965: one pixel per column of the major axis).
  REQUIRE(count_level(img, 0) == 16);
  REQUIRE(img.at(2, 3) == 0);
  REQUIRE(img.at(17, 8) == 0);
  for (int x = 2; x <= 17; ++x) {
    int in_column = 0;
    for (int y = 0; y < 20; ++y) in_column += img.at(x, y) == 0 ? 1 : 0;
    CAPTURE(x);
    REQUIRE(in_column == 1);
  }
}

TEST_CASE("draw_line: clipped segments draw only their visible part", "[io]") {
  Image img = make_image(10, 10, 1, kWhite);
  // Horizontal line at row 4 from far left to far right: exactly the 10 pixels of the row.
  draw_line(img, -1e6, 4, 1e6, 4, {kBlack, 1, 0});
  REQUIRE(count_level(img, 0) == 10);
  // A segment entirely outside draws nothing; NaN draws nothing.
  draw_line(img, -50, -50, -10, 30, {kBlack, 1, 0});
  draw_line(img, std::nan(""), 0, 5, 5, {kBlack, 1, 0});
  REQUIRE(count_level(img, 0) == 10);
}

TEST_CASE("draw_line: dashes alternate dash_px on and off; thickness widens", "[io]") {
  Image img = make_image(40, 5, 1, kWhite);
  draw_line(img, 0, 2, 39, 2, {kBlack, 1, 4});
  // Pixels 0-3 on, 4-7 off, ...: 5 dashes of 4 in 40 columns.
  REQUIRE(count_level(img, 0) == 20);
  REQUIRE(img.at(3, 2) == 0);
  REQUIRE(img.at(4, 2) == 255);
  REQUIRE(img.at(8, 2) == 0);
  Image thick = make_image(10, 10, 1, kWhite);
  draw_line(thick, 0, 5, 9, 5, {kBlack, 3, 0});
  REQUIRE(count_level(thick, 0) == 30);  // rows 4, 5, 6
}

TEST_CASE("draw_line: dash_phase_px continues the pattern from a previous segment", "[io]") {
  // One 40 px dashed line equals two 20 px segments when the second starts at phase 20.
  Image whole = make_image(40, 3, 1, kWhite), parts = make_image(40, 3, 1, kWhite);
  draw_line(whole, 0, 1, 39, 1, {kBlack, 1, 3});
  draw_line(parts, 0, 1, 20, 1, {kBlack, 1, 3, 0});
  draw_line(parts, 20, 1, 39, 1, {kBlack, 1, 3, 20});
  REQUIRE(whole.pixels == parts.pixels);
}

// Tests for io/text_render: ink stays inside the measured box, scaling, non-ASCII handling.
#include "report/text_render.h"

#include <algorithm>

#include "test_support.h"

using namespace cuspmap;

namespace {

struct Ink {
  int count = 0, x0 = 1 << 30, y0 = 1 << 30, x1 = -1, y1 = -1;
};

Ink ink(const Image& img) {
  Ink k;
  for (int y = 0; y < img.height; ++y) {
    for (int x = 0; x < img.width; ++x) {
      if (img.at(x, y) == 255) continue;
      ++k.count;
      k.x0 = std::min(k.x0, x);
      k.y0 = std::min(k.y0, y);
      k.x1 = std::max(k.x1, x);
      k.y1 = std::max(k.y1, y);
    }
  }
  return k;
}

}  // namespace

TEST_CASE("draw_text: ink lies inside the measured box", "[report]") {
  for (int scale : {1, 2, 3}) {
    CAPTURE(scale);
    Image img = make_image(300, 100, 1, kWhite);
    const TextSize size = draw_text(img, 10, 20, "Ra 0.25 um\ngypsum", {scale, kBlack});
    REQUIRE(size.width_px == measure_text("Ra 0.25 um\ngypsum", scale).width_px);
    const Ink k = ink(img);
    REQUIRE(k.count > 0);
    REQUIRE(k.x0 >= 10);
    REQUIRE(k.y0 >= 20);
    REQUIRE(k.x1 < 10 + size.width_px);
    REQUIRE(k.y1 < 20 + size.height_px);
    // The descenders of "gypsum" reach the bottom row of the box (font rows 0..8).
    REQUIRE(k.y1 == 20 + size.height_px - 1);
  }
}

TEST_CASE("draw_text: scale s multiplies the ink area by s^2", "[report]") {
  Image a = make_image(200, 60, 1, kWhite), b = make_image(200, 60, 1, kWhite);
  draw_text(a, 0, 0, "Rz 12", {1, kBlack});
  draw_text(b, 0, 0, "Rz 12", {3, kBlack});
  REQUIRE(ink(b).count == 9 * ink(a).count);
}

TEST_CASE("draw_text: bytes outside printable ASCII draw as '?'", "[report]") {
  Image a = make_image(100, 30, 1, kWhite), b = make_image(100, 30, 1, kWhite);
  draw_text(a, 0, 0, "\xC2\xB5m", {1, kBlack});  // UTF-8 micro sign: two bytes
  draw_text(b, 0, 0, "??m", {1, kBlack});
  REQUIRE(a.pixels == b.pixels);
  REQUIRE(measure_text("", 2).width_px == 0);
}

// Tests for report/simulation_pictures' height pictures: beside a shared scale each floor also
// gets its own range, each picture titled with the scale it uses (issue 14: flat-end floors were
// almost black next to a ball floor on the shared scale alone).
#include "report/simulation_pictures.h"

#include <numbers>

#include "test_support.h"

using namespace cuspmap;

namespace {

// Cusps across Y, period 0.3 mm, `depth_um` peak to valley, on 120 x 120 cells of 0.01 mm.
Heightfield cusps(double depth_um) {
  Heightfield hf;
  hf.nx = hf.ny = 120;
  hf.cell_mm = 0.01;
  hf.z_um.resize(120, 120);
  for (int j = 0; j < 120; ++j) {
    const double y = hf.y_mm(j);
    for (int i = 0; i < 120; ++i) {
      hf.z_um(j, i) =
          static_cast<float>(0.5 * depth_um * (1.0 - std::cos(2.0 * std::numbers::pi * y / 0.3)));
    }
  }
  return hf;
}

// Lowest and highest gray of the map part of a height picture.
std::pair<int, int> map_span(const HeightImage& h) {
  int lo = 255, hi = 0;
  for (int y = h.map_y_px; y < h.map_y_px + h.map_height_px; ++y) {
    for (int x = h.map_x_px; x < h.map_x_px + h.map_width_px; ++x) {
      lo = std::min<int>(lo, h.image.at(x, y));
      hi = std::max<int>(hi, h.image.at(x, y));
    }
  }
  return {lo, hi};
}

// Black pixels in the band above the map, over the map's columns (where the title is written;
// the legend's own heading sits right of the map).
int title_ink(const HeightImage& h) {
  int ink = 0;
  for (int y = 0; y < h.map_y_px - 2; ++y) {
    for (int x = h.map_x_px; x < h.map_x_px + h.map_width_px; ++x) ink += h.image.at(x, y) == 0;
  }
  return ink;
}

}  // namespace

TEST_CASE("render_height_pictures: a shallow floor gets its own range beside the shared scale",
          "[report]") {
  // A ball floor with 4 um cusps and a flat-end floor with 0.3 um marks share 0..4 um: on that
  // scale the shallow floor spans round(254 x 0.3 / 4) = 19 gray levels (derived), near black.
  const HeightRange shared{0.0, 4.0};
  const HeightPictures flat = render_height_pictures(cusps(0.3), LengthUnit::Millimetre, shared,
                                                     /*own_range_too=*/true);
  const auto [slo, shi] = map_span(flat.shared);
  REQUIRE(slo == 0);
  REQUIRE(shi <= 20);
  REQUIRE(flat.own.has_value());
  const auto [olo, ohi] = map_span(*flat.own);
  REQUIRE(olo == 0);
  REQUIRE(ohi == 254);  // its own lowest to highest point
  REQUIRE_NEAR(flat.own->hi_um, 0.3, 1e-3);
  // Each says on the picture and in its caption which scale it is.
  REQUIRE(title_ink(flat.shared) > 50);
  REQUIRE(title_ink(*flat.own) > 50);
  REQUIRE(flat.shared_caption.rfind("Shared scale (all floors). ", 0) == 0);
  REQUIRE(flat.own_caption.rfind("Own range (this floor only). ", 0) == 0);
  // The deep floor fills the shared scale itself.
  const HeightPictures ball =
      render_height_pictures(cusps(4.0), LengthUnit::Millimetre, shared, true);
  REQUIRE(map_span(ball.shared).second >= 253);
}

TEST_CASE("render_height_pictures: one floor alone has one untitled picture", "[report]") {
  const HeightPictures one =
      render_height_pictures(cusps(1.0), LengthUnit::Inch, std::nullopt, true);
  REQUIRE_FALSE(one.own.has_value());
  REQUIRE(title_ink(one.shared) == 0);
  REQUIRE(one.shared_caption.rfind("Height seen from above", 0) == 0);
}

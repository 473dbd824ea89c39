// Tests for io/shaded_image: Lambert's cosine law (Lambert, Photometria, 1760; Foley, van Dam et
// al., Computer Graphics: Principles and Practice, sec. 16.1: diffuse brightness = cos of the
// angle between surface normal and light), auto exaggeration, orientation, unreached cells.
#include "report/shaded_image.h"

#include <numbers>

#include "core/input_error.h"
#include "report/legend.h"
#include "test_support.h"

using namespace cuspmap;

namespace {

template <class F>
Heightfield field(int nx, int ny, double cell_mm, F f) {
  Heightfield hf;
  hf.nx = nx;
  hf.ny = ny;
  hf.cell_mm = cell_mm;
  hf.z_um.resize(ny, nx);
  for (int j = 0; j < ny; ++j) {
    for (int i = 0; i < nx; ++i) hf.z_um(j, i) = static_cast<float>(f(i, j));
  }
  return hf;
}

double deg(double d) { return d * std::numbers::pi / 180.0; }

// Lambert's law written out independently: cos(angle between normal and light direction).
double lambert_cos(double gx, double gy, double az_deg, double el_deg) {
  const double n[3] = {-gx, -gy, 1.0};
  const double l[3] = {std::cos(deg(el_deg)) * std::cos(deg(az_deg)),
                       std::cos(deg(el_deg)) * std::sin(deg(az_deg)), std::sin(deg(el_deg))};
  const double nn = std::sqrt(n[0] * n[0] + n[1] * n[1] + n[2] * n[2]);
  return std::max(0.0, (n[0] * l[0] + n[1] * l[1] + n[2] * l[2]) / nn);
}

int level(double brightness) { return static_cast<int>(std::lround(254.0 * brightness)); }

}  // namespace

TEST_CASE("render_shaded_image: a flat floor has the Lambert value sin(elevation)", "[report]") {
  const Heightfield hf = field(8, 6, 0.01, [](int, int) { return 3.0; });
  for (double el : {30.0, 45.0, 90.0}) {
    CAPTURE(el);
    ShadedImageOptions o;
    o.light_elevation_deg = el;
    const ShadedImage img = render_shaded_image(hf, o);
    REQUIRE(img.image.width == 8);
    REQUIRE(img.image.height == 6);
    REQUIRE(img.exaggeration == 1.0);  // nothing to exaggerate
    REQUIRE(img.slope_p95 == 0.0);
    for (std::uint8_t v : img.image.pixels) REQUIRE(v == level(std::sin(deg(el))));
  }
}

TEST_CASE("render_shaded_image: a plane tilted towards the light is brighter than one tilted away",
          "[report]") {
  // z rises 2 um per 0.01 mm cell along +X: slope 0.2. Its normal leans towards -X.
  const Heightfield hf = field(9, 5, 0.01, [](int i, int) { return 2.0 * i; });
  ShadedImageOptions toward;
  toward.exaggeration = 1.0;
  toward.light_azimuth_deg = 180.0;  // light from -X, the side the plane faces
  ShadedImageOptions away = toward;
  away.light_azimuth_deg = 0.0;
  const ShadedImage lit = render_shaded_image(hf, toward);
  const ShadedImage dark = render_shaded_image(hf, away);
  for (std::uint8_t v : lit.image.pixels) REQUIRE(v == level(lambert_cos(0.2, 0.0, 180.0, 45.0)));
  for (std::uint8_t v : dark.image.pixels) REQUIRE(v == level(lambert_cos(0.2, 0.0, 0.0, 45.0)));
  REQUIRE(lit.image.at(4, 2) > dark.image.at(4, 2));
  // Along Y: a plane rising towards +Y faces -Y, so light from azimuth 270 beats 90.
  const Heightfield up = field(5, 9, 0.01, [](int, int j) { return 2.0 * j; });
  ShadedImageOptions from_below = toward, from_above = toward;
  from_below.light_azimuth_deg = 270.0;
  from_above.light_azimuth_deg = 90.0;
  REQUIRE(render_shaded_image(up, from_below).image.at(2, 4) >
          render_shaded_image(up, from_above).image.at(2, 4));
  REQUIRE_NEAR(lambert_brightness(0.2, 0.0, 180.0, 45.0), lambert_cos(0.2, 0.0, 180.0, 45.0),
               1e-15);
}

TEST_CASE("render_shaded_image: auto exaggeration aims the 95th-percentile slope at 30 deg",
          "[report]") {
  const Heightfield hf = field(9, 5, 0.01, [](int i, int) { return 2.0 * i; });
  ShadedImageOptions o;
  o.light_azimuth_deg = 180.0;
  const ShadedImage img = render_shaded_image(hf, o);
  REQUIRE_NEAR(img.slope_p95, 0.2, 1e-6);
  REQUIRE_NEAR(img.exaggeration, std::tan(deg(kAutoSlopeDeg)) / 0.2, 1e-5);
  // Shaded as a 30 deg plane.
  for (std::uint8_t v : img.image.pixels) {
    REQUIRE(v == level(lambert_cos(std::tan(deg(30.0)), 0.0, 180.0, 45.0)));
  }
}

TEST_CASE("render_shaded_image: scallops 0.2 um deep become clearly visible", "[report]") {
  // Cusp ridges across Y, period 0.3 mm, 0.2 um peak to valley: true slopes ~0.002, invisible
  // without exaggeration (gray 179 vs 180); auto exaggeration must spread them over > 100 levels.
  const double period_mm = 0.3, depth_um = 0.2, cell = 0.005;
  const Heightfield hf = field(60, 240, cell, [&](int, int j) {
    const double y = (j + 0.5) * cell;
    return 0.5 * depth_um * (1.0 - std::cos(2.0 * std::numbers::pi * y / period_mm));
  });
  ShadedImageOptions flat;
  flat.exaggeration = 1.0;
  flat.light_azimuth_deg = 90.0;
  const ShadedImage raw = render_shaded_image(hf, flat);
  ShadedImageOptions autox;
  autox.light_azimuth_deg = 90.0;
  const ShadedImage shaded = render_shaded_image(hf, autox);
  const auto spread = [](const Image& img) {
    const auto [lo, hi] = std::minmax_element(img.pixels.begin(), img.pixels.end());
    return int{*hi} - int{*lo};
  };
  REQUIRE(spread(raw.image) <= 2);
  REQUIRE(spread(shaded.image) > 100);
  REQUIRE(shaded.exaggeration > 100.0);
}

TEST_CASE("render_shaded_image: unreached cells are white and the top row is the highest Y",
          "[report]") {
  // Rows j >= 4 of 6 are unreached: they are the top two image rows.
  const Heightfield hf = field(4, 6, 0.01, [](int, int j) { return j >= 4 ? std::nan("") : 1.0; });
  const ShadedImage img = render_shaded_image(hf, ShadedImageOptions{});
  for (int c = 0; c < 4; ++c) {
    REQUIRE(img.image.at(c, 0) == 255);
    REQUIRE(img.image.at(c, 1) == 255);
    REQUIRE(img.image.at(c, 5) == level(std::sin(deg(45.0))));
  }
}

TEST_CASE("render_shaded_image: forced cells per pixel and bad options", "[report]") {
  const Heightfield hf = field(10, 7, 0.02, [](int i, int) { return 0.1 * i; });
  ShadedImageOptions o;
  o.cells_per_pixel = 3;
  const ShadedImage img = render_shaded_image(hf, o);
  REQUIRE(img.image.width == 4);
  REQUIRE(img.image.height == 3);
  REQUIRE_NEAR(img.mm_per_px, 0.06, 1e-12);
  o.light_elevation_deg = 0.0;
  REQUIRE_THROWS_MATCHES(render_shaded_image(hf, o), InputError,
                         Catch::Message("light elevation 0 deg: must be in (0, 90] deg"));
  o.light_elevation_deg = 45.0;
  o.exaggeration = -2.0;
  REQUIRE_THROWS_MATCHES(render_shaded_image(hf, o), InputError,
                         Catch::Message("exaggeration -2: must be a finite number > 0"));
}

TEST_CASE("shaded_image_caption: states the light and the exaggeration", "[report]") {
  const Heightfield hf = field(9, 5, 0.01, [](int i, int) { return 2.0 * i; });
  ShadedImageOptions o;
  o.exaggeration = 12.5;
  REQUIRE(shaded_image_caption(render_shaded_image(hf, o)) ==
          "Shaded relief seen from above, +Y up: light from azimuth 135 deg (counter-clockwise "
          "from +X) at 45.0 deg elevation; heights exaggerated x 12.5; white = not reached.");
}

TEST_CASE("render_shaded_image: marks finer than a pixel average to an even gray (no moire)",
          "[report]") {
  // Tooth-mark-like ridges along X every 0.7 pixel (7 cells at 10 cells per pixel), 0.3 um deep,
  // on 1200 x 120 cells: each cell is strongly lit or shadowed, but every pixel must show the same
  // average brightness. Sampling theorem (Gonzalez & Woods, 3rd ed., 4.5); a plain 10 x 10 block
  // mean leaves |sinc(10/7)| = 22% of the brightness ripple folded to a false 3.5-pixel period.
  const Heightfield hf = field(1200, 120, 0.005, [](int i, int) {
    return 0.15 * (1.0 - std::cos(2.0 * std::numbers::pi * i / 7.0));
  });
  ShadedImageOptions o;
  o.max_pixels = 120;
  o.light_azimuth_deg = 180.0;  // light across the ridges: the strongest ripple per cell
  const ShadedImage img = render_shaded_image(hf, o);
  REQUIRE(img.cells_per_pixel == 10);
  int lo = 255, hi = 0;
  for (int y = 2; y < img.image.height - 2; ++y) {
    for (int x = 2; x < img.image.width - 2; ++x) {  // edges use one-sided differences
      lo = std::min<int>(lo, img.image.at(x, y));
      hi = std::max<int>(hi, img.image.at(x, y));
    }
  }
  CAPTURE(lo, hi, img.exaggeration);
  REQUIRE(hi - lo <= 2);
}

TEST_CASE("render_shaded_image: zoom draws each cell as zoom x zoom pixels", "[report]") {
  const Heightfield hf = field(10, 7, 0.02, [](int i, int) { return 0.1 * i * i; });
  const ShadedImage one = render_shaded_image(hf, ShadedImageOptions{});
  ShadedImageOptions o;
  o.zoom = 3;
  const ShadedImage img = render_shaded_image(hf, o);
  REQUIRE(img.image.width == 30);
  REQUIRE(img.image.height == 21);
  REQUIRE_NEAR(img.mm_per_px, 0.02 / 3, 1e-12);
  for (int y = 0; y < 21; ++y) {
    for (int x = 0; x < 30; ++x) REQUIRE(img.image.at(x, y) == one.image.at(x / 3, y / 3));
  }
}

TEST_CASE("render_shaded_image: every interior cell takes the central-difference Lambert value",
          "[report]") {
  // Rows with all cells reached take a paired fast path; each pixel must still be the gray level
  // of Lambert's law on the central differences (Foley, van Dam et al., sec. 16.1), with the
  // slopes kept as floats as the general path keeps them (derived), on odd sizes and next to an
  // unreached cell.
  for (const int nx : {3, 4, 9, 40}) {
    Heightfield hf = field(nx, 11, 0.01, [](int i, int j) {
      return 0.8 * std::sin(0.9 * i) + 0.5 * std::cos(1.3 * j) + 0.02 * i * j;
    });
    hf.z_um(8, nx / 2) = kUnreached;
    ShadedImageOptions opt;
    opt.exaggeration = 3.0;
    opt.cells_per_pixel = 1;
    const ShadedImage img = render_shaded_image(hf, opt);
    const LightVector light = light_vector(opt.light_azimuth_deg, opt.light_elevation_deg);
    const double per_cell = 1.0 / (hf.cell_mm * 1000.0);
    for (int j = 1; j + 1 < hf.ny; ++j) {
      for (int i = 1; i + 1 < nx; ++i) {
        if (j >= 7 && j <= 9) continue;  // rows at and beside the unreached cell: general path
        const auto sx = static_cast<float>(
            0.5 * (double{hf.z_um(j, i + 1)} - hf.z_um(j, i - 1)) * per_cell);
        const auto sy = static_cast<float>(
            0.5 * (double{hf.z_um(j + 1, i)} - hf.z_um(j - 1, i)) * per_cell);
        const auto b = static_cast<float>(lambert_brightness(3.0 * sx, 3.0 * sy, light));
        CAPTURE(nx, j, i);
        // Top image row = highest Y.
        REQUIRE(int{img.image.at(i, hf.ny - 1 - j)} ==
                nearest_gray_level(kTopHeightLevel * std::clamp(b, 0.0f, 1.0f)));
      }
    }
  }
}

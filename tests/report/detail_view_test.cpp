// Tests for report/detail_window and report/detail_view: the detail window lands where the marks
// are deepest, the detail pictures show the tooth period in their spectrum (direct DFT of a row
// of pixel values, DFT definition: X_k = sum x_n exp(-2 pi i k n / N)), the overview of the same
// floor does not fold the marks into a false coarser period, and the outline sits around the
// window.
#include "report/detail_view.h"

#include <complex>
#include <numbers>

#include "test_support.h"

using namespace cuspmap;

namespace {

// Rim arcs of a flat end mill as seen on a floor: marks fz apart along X, bent into arcs of the
// rim radius R (phase x + (y - yc)^2 / (2R)), 0.5 (1 - cos) deep profile of depth A(x, y) um.
// A is 0.1 um everywhere plus a Gaussian bump of 0.4 um (sigma 1 mm) at (bump_x, bump_y).
// Derived test geometry (a stand-in for a tooth-resolved sweep, not a cutting model).
struct MarkedFloor {
  double size_mm = 12.0, cell_mm = 0.01, fz_mm = 0.03, rim_mm = 3.0;
  double bump_x_mm = 9.0, bump_y_mm = 3.0;
  Heightfield make() const {
    Heightfield hf;
    hf.nx = hf.ny = static_cast<int>(std::lround(size_mm / cell_mm));
    hf.cell_mm = cell_mm;
    hf.z_um.resize(hf.ny, hf.nx);
    for (int j = 0; j < hf.ny; ++j) {
      const double y = hf.y_mm(j);
      const double yc = 0.5 * std::round(y / 0.5);  // centre of the nearest 0.5 mm pass
      const double bend = (y - yc) * (y - yc) / (2.0 * rim_mm);
      for (int i = 0; i < hf.nx; ++i) {
        const double x = hf.x_mm(i);
        const double r2 = (x - bump_x_mm) * (x - bump_x_mm) + (y - bump_y_mm) * (y - bump_y_mm);
        const double depth = 0.1 + 0.4 * std::exp(-0.5 * r2);
        const double phase = 2.0 * std::numbers::pi * (x + bend) / fz_mm;
        hf.z_um(j, i) = static_cast<float>(depth * 0.5 * (1.0 - std::cos(phase)));
      }
    }
    return hf;
  }
};

// One row of a picture's first channel, from column x0, n pixels.
std::vector<double> row_of(const Image& img, int y, int x0, int n) {
  std::vector<double> v;
  for (int x = x0; x < x0 + n; ++x) v.push_back(img.at(x, y));
  return v;
}

// Amplitude spectrum 2|X_k|/N (the amplitude, in gray levels, of a sinusoid at bin k), k = 0..N/2,
// of the row with its mean removed; direct DFT (the definition; N <= ~600 here).
std::vector<double> amplitude_spectrum(std::vector<double> v) {
  const int n = static_cast<int>(v.size());
  double mean = 0.0;
  for (double x : v) mean += x / n;
  for (double& x : v) x -= mean;
  std::vector<double> amp(n / 2 + 1);
  for (int k = 0; k <= n / 2; ++k) {
    std::complex<double> s = 0.0;
    for (int t = 0; t < n; ++t) s += v[t] * std::polar(1.0, -2.0 * std::numbers::pi * k * t / n);
    amp[k] = 2.0 * std::abs(s) / n;
  }
  return amp;
}

int peak_bin(const std::vector<double>& amp) {
  int best = 1;
  for (int k = 1; k < static_cast<int>(amp.size()); ++k) {
    if (amp[k] > amp[best]) best = k;
  }
  return best;
}

double max_near(const std::vector<double>& amp, double bin, int reach) {
  double m = 0.0;
  for (int k = static_cast<int>(std::floor(bin)) - reach; k <= static_cast<int>(std::ceil(bin)) + reach;
       ++k) {
    if (k >= 1 && k < static_cast<int>(amp.size())) m = std::max(m, amp[k]);
  }
  return m;
}

}  // namespace

TEST_CASE("choose_detail_window: lands where the marks are deepest, about 1.5 mm wide",
          "[report]") {
  const MarkedFloor f;
  const Heightfield hf = f.make();
  const DetailWindow w = choose_detail_window(hf);
  // 1.5 mm / 0.01 mm = 150 cells, rounded to whole quarter steps of 37 cells: 148 cells.
  REQUIRE(w.nx == 148);
  REQUIRE(w.ny == 148);
  REQUIRE_NEAR(w.size_x_mm, 1.48, 1e-9);
  CAPTURE(w.x0_mm, w.y0_mm);
  REQUIRE(w.x0_mm <= f.bump_x_mm);
  REQUIRE(w.x0_mm + w.size_x_mm >= f.bump_x_mm);
  REQUIRE(w.y0_mm <= f.bump_y_mm);
  REQUIRE(w.y0_mm + w.size_y_mm >= f.bump_y_mm);
  // The window's Sq is that of its marks: a 0.5 (1 - cos) profile of depth A has Sq = A / (2
  // sqrt 2) (derived); A is 0.3-0.5 um inside the window.
  REQUIRE(w.sq_um > 0.3 / (2.0 * std::sqrt(2.0)));
  REQUIRE(w.sq_um < 0.5 / (2.0 * std::sqrt(2.0)));
}

TEST_CASE("choose_detail_window: an even floor gets the centre; a small floor the whole of it",
          "[report]") {
  Heightfield even;
  even.nx = even.ny = 400;
  even.cell_mm = 0.01;
  even.z_um.resize(400, 400);
  for (int j = 0; j < 400; ++j) {
    for (int i = 0; i < 400; ++i) even.z_um(j, i) = static_cast<float>(std::sin(0.7 * i));
  }
  const DetailWindow w = choose_detail_window(even);
  REQUIRE(std::abs(w.i0 + w.nx / 2 - 200) <= 37);
  REQUIRE(std::abs(w.j0 + w.ny / 2 - 200) <= 37);
  Heightfield small = even;
  small.nx = 20;
  small.ny = 10;
  small.z_um = even.z_um.block(0, 0, 10, 20);
  const DetailWindow s = choose_detail_window(small);
  REQUIRE(s.i0 == 0);
  REQUIRE(s.j0 == 0);
  REQUIRE(s.nx == 20);
  REQUIRE(s.ny == 10);
}

TEST_CASE("render_detail_view: a row of the detail shows the tooth period in its spectrum; the "
          "overview folds no false period",
          "[report]") {
  const MarkedFloor f;
  const Heightfield hf = f.make();
  const DetailWindow w = choose_detail_window(hf);
  const DetailView view = render_detail_view(hf, w, LengthUnit::Millimetre);
  // 148 cells, zoom 600 / 148 = 4: 0.0025 mm per pixel.
  REQUIRE(view.shaded.zoom == 4);
  REQUIRE_NEAR(view.shaded.mm_per_px, 0.0025, 1e-12);
  const double tooth_per_mm = 1.0 / f.fz_mm;
  {
    const Image& img = view.shaded.image;
    const std::vector<double> amp = amplitude_spectrum(row_of(img, img.height / 2, 0, img.width));
    const double expected_bin = tooth_per_mm * img.width * view.shaded.mm_per_px;  // 49.3
    CAPTURE(expected_bin, peak_bin(amp), amp[peak_bin(amp)]);
    REQUIRE(std::abs(peak_bin(amp) - expected_bin) <= 1.0);
    REQUIRE(amp[peak_bin(amp)] > 20.0);  // gray levels: the marks are plain to see
  }
  {
    const HeightImage& h = view.height;
    const std::vector<double> amp = amplitude_spectrum(
        row_of(h.image, h.map_y_px + h.map_height_px / 2, h.map_x_px, h.map_width_px));
    const double expected_bin = tooth_per_mm * h.map_width_px * h.mm_per_px;
    CAPTURE(expected_bin, peak_bin(amp));
    REQUIRE(std::abs(peak_bin(amp) - expected_bin) <= 1.0);
  }
  // The overview: 1200 cells -> 2 cells (0.02 mm) per pixel, 50 pixels per mm, so the 33.3 /mm
  // marks lie above the 25 /mm Nyquist limit and would fold to 50 - 33.3 = 16.7 /mm (sampling
  // theorem; Gonzalez & Woods, 4.5). The anti-aliased overview keeps that below 3 gray levels
  // where the detail shows more than 20. (A plain 2 x 2 block mean passes sinc(2/3) = 41%.)
  const ShadedImage overview = render_shaded_image(hf, ShadedImageOptions{});
  REQUIRE(overview.cells_per_pixel == 2);
  const int deep_row = overview.image.height - 1 - static_cast<int>(f.bump_y_mm / 0.02);
  const std::vector<double> amp =
      amplitude_spectrum(row_of(overview.image, deep_row, 0, overview.image.width));
  const double alias_bin = (50.0 - tooth_per_mm) * overview.image.width * 0.02;  // 200
  CAPTURE(alias_bin, max_near(amp, alias_bin, 2));
  REQUIRE(max_near(amp, alias_bin, 2) < 3.0);
  REQUIRE(view.caption.find("x 8.") != std::string::npos);  // the position is stated
}

TEST_CASE("outline_detail_window: two orange rings just outside the window's pixels",
          "[report]") {
  // 20 x 20 gray map of k = 2; window columns 4..9, rows 6..9 -> pixel columns 2..4, block rows
  // 3..4 -> picture rows 15..16 (top = highest Y).
  const Image gray_map = make_image(20, 20, 1, gray(100));
  DetailWindow w;
  w.i0 = 4;
  w.j0 = 6;
  w.nx = 6;
  w.ny = 4;
  const Image out = outline_detail_window(gray_map, 0, 0, 20, 2, w);
  REQUIRE(out.channels == 3);
  REQUIRE(pixel(out, 2, 15) == gray(100));  // inside: untouched
  REQUIRE(pixel(out, 4, 16) == gray(100));
  REQUIRE(pixel(out, 1, 15) == kDetailOutlineColor);  // ring 1, left
  REQUIRE(pixel(out, 0, 15) == kDetailOutlineColor);  // ring 2, left
  REQUIRE(pixel(out, 5, 16) == kDetailOutlineColor);  // ring 1, right
  REQUIRE(pixel(out, 3, 14) == kDetailOutlineColor);  // ring 1, top
  REQUIRE(pixel(out, 3, 17) == kDetailOutlineColor);  // ring 1, bottom
  REQUIRE(pixel(out, 3, 12) == gray(100));            // beyond the rings
}

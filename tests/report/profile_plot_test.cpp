// Tests for io/profile_plot: size, axes, the Ra band at mean +- Ra, the Rz bar of length Rz.
#include "report/profile_plot.h"

#include <numbers>

#include "test_support.h"

using namespace cuspmap;

namespace {

// A cusp-like profile: 0.8 mm long, period 0.2 mm, sine of amplitude 1 um around a mean of 2 um.
// Ra of a sine is 2A/pi (mean absolute value of A sin), Rz of a whole-period sine is 2A; the
// plot only draws what it is given, so these just need to be plausible.
ProfilePlotData sample(bool with_mean) {
  ProfilePlotData p;
  for (int k = 0; k <= 400; ++k) {
    const double x = 0.002 * k;
    p.x_mm.push_back(x);
    p.z_um.push_back(2.0 + std::sin(2.0 * std::numbers::pi * x / 0.2));
    if (with_mean) p.mean_line_um.push_back(2.0);
  }
  p.ra_um = 2.0 / std::numbers::pi;
  p.rz_um = 2.0;
  p.cutoff_mm = 0.8;
  p.title = "cross-feed profile";
  return p;
}

bool near_color(const Image& img, int x0, int x1, double y, Color c, int rows) {
  for (int x = x0; x <= x1; ++x) {
    for (int dy = -rows; dy <= rows; ++dy) {
      const int yy = static_cast<int>(std::lround(y)) + dy;
      if (img.contains(x, yy) && pixel(img, x, yy) == c) return true;
    }
  }
  return false;
}

}  // namespace

TEST_CASE("render_profile_plot: two stacked panels of the requested size with axes", "[report]") {
  ProfilePlotOptions o;
  const ProfilePlot plot = render_profile_plot({sample(true), sample(false)}, o);
  REQUIRE(plot.image.width == o.width_px);
  REQUIRE(plot.image.height == 2 * o.panel_height_px);
  REQUIRE(plot.image.channels == 3);
  REQUIRE(plot.panels.size() == 2u);
  for (const PlotFrame& f : plot.panels) {
    REQUIRE(f.width_px > 500);
    REQUIRE(f.height_px > 150);
    // Axes: a black column left of the plot area and a black row under it, unbroken.
    for (int y = f.top_px; y < f.top_px + f.height_px; ++y)
      REQUIRE(pixel(plot.image, f.left_px - 1, y) == kBlack);
    const int axis_y = f.top_px + f.height_px;
    for (int x = f.left_px; x < f.left_px + f.width_px; ++x)
      REQUIRE(pixel(plot.image, x, axis_y) == kBlack);
    // x spans the data; z spans the data, the Ra band and the Rz bar.
    REQUIRE_NEAR(f.x_lo, 0.0, 1e-12);
    REQUIRE_NEAR(f.x_hi, 0.8, 1e-12);
    REQUIRE(f.z_lo < 1.0);
    REQUIRE(f.z_hi > 3.0);
  }
  REQUIRE(plot.panels[1].top_px > o.panel_height_px);
}

TEST_CASE("render_profile_plot: Ra band lines at mean +- Ra, Rz bar spans Rz", "[report]") {
  const ProfilePlotData p = sample(true);
  const ProfilePlot plot = render_profile_plot({p}, ProfilePlotOptions{});
  const PlotFrame& f = plot.panels[0];
  const Image& img = plot.image;
  // The dashed band: within any 12 columns (dash 5 on, 5 off) there is band colour at the rows
  // of mean + Ra and mean - Ra (2 px thick).
  for (int x0 = f.left_px + 20; x0 < f.left_px + f.width_px - 20; x0 += 97) {
    CAPTURE(x0);
    REQUIRE(near_color(img, x0, x0 + 11, f.py_of_z(2.0 + p.ra_um), kRaBandColor, 1));
    REQUIRE(near_color(img, x0, x0 + 11, f.py_of_z(2.0 - p.ra_um), kRaBandColor, 1));
    REQUIRE(near_color(img, x0, x0 + 11, f.py_of_z(2.0), kMeanLineColor, 1));
  }
  // The Rz bar: every row from centre + Rz/2 to centre - Rz/2 at its column, nothing beyond.
  const int top = static_cast<int>(std::lround(f.py_of_z(2.0 + 1.0)));
  const int bottom = static_cast<int>(std::lround(f.py_of_z(2.0 - 1.0)));
  for (int y = top; y <= bottom; ++y) REQUIRE(pixel(img, f.rz_bar_x_px, y) == kRzBarColor);
  REQUIRE(pixel(img, f.rz_bar_x_px, top - 3) != kRzBarColor);
  REQUIRE(pixel(img, f.rz_bar_x_px, bottom + 3) != kRzBarColor);
  // Bar length in pixels = Rz on the height scale.
  REQUIRE_NEAR(bottom - top, p.rz_um / (f.z_hi - f.z_lo) * (f.height_px - 1), 1.0);
}

TEST_CASE("render_profile_plot: inches change the axis scale; bad input throws", "[report]") {
  ProfilePlotOptions o;
  o.units = LengthUnit::Inch;
  const ProfilePlot plot = render_profile_plot({sample(true)}, o);
  REQUIRE_NEAR(plot.panels[0].x_hi, 0.8 / 25.4, 1e-12);
  REQUIRE(plot.panels[0].z_hi > 3.0 * 39.37);
  ProfilePlotData bad = sample(true);
  bad.z_um.pop_back();
  REQUIRE_THROWS_AS(render_profile_plot({bad}, ProfilePlotOptions{}), std::invalid_argument);
  REQUIRE_THROWS_AS(render_profile_plot({}, ProfilePlotOptions{}), std::invalid_argument);
  REQUIRE_THROWS_AS(
      render_profile_plot({sample(true), sample(true), sample(true)}, ProfilePlotOptions{}),
      std::invalid_argument);
}

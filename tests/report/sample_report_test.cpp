// Hidden test [io_sample]: writes a full sample report (all pictures embedded) for
// tests/io/html_browser_test.sh and for looking at the pictures by eye; floors are the lower
// envelope of ball imprints (DESIGN.md "Closed forms"). Run: CUSPMAP_SAMPLE_REPORT=/tmp/r.html
// [CUSPMAP_SAMPLE_PNG_DIR=/tmp] cuspmap_tests "[io_sample]".
#include <cstdlib>
#include <numbers>

#include "core/write_file_atomic.h"
#include "report/height_image.h"
#include "report/html_report.h"
#include "report/montage.h"
#include "report/nice_ticks.h"
#include "io/png.h"
#include "report/profile_plot.h"
#include "report/shaded_image.h"
#include "test_support.h"

using namespace cuspmap;

namespace {

// Floor left by a ball of radius r_mm, passes along X every stepover_mm, one imprint every
// feed_mm along each pass (a simple stand-in for tooth marks), on a size_x x size_y patch.
Heightfield ball_floor(double r_mm, double stepover_mm, double feed_mm, double size_x,
                       double size_y, double cell_mm) {
  Heightfield hf;
  hf.cell_mm = cell_mm;
  hf.nx = static_cast<int>(std::ceil(size_x / cell_mm));
  hf.ny = static_cast<int>(std::ceil(size_y / cell_mm));
  hf.z_um.resize(hf.ny, hf.nx);
  for (int j = 0; j < hf.ny; ++j) {
    const double y = hf.y_mm(j);
    const double k0 = std::floor(y / stepover_mm);
    for (int i = 0; i < hf.nx; ++i) {
      const double x = hf.x_mm(i);
      const double m0 = std::floor(x / feed_mm);
      double z = std::numeric_limits<double>::infinity();
      for (double k : {k0, k0 + 1}) {
        for (double m : {m0, m0 + 1}) {
          const double d2 = std::pow(x - m * feed_mm, 2) + std::pow(y - k * stepover_mm, 2);
          if (d2 < r_mm * r_mm) z = std::min(z, (r_mm - std::sqrt(r_mm * r_mm - d2)) * kUmPerMm);
        }
      }
      hf.z_um(j, i) = static_cast<float>(z);
    }
  }
  return hf;
}

double mean_abs_deviation(const Heightfield& hf) {
  const double mean = hf.z_um.cast<double>().mean();
  return (hf.z_um.cast<double>() - mean).abs().mean();
}

ProfilePlotData profile(const Heightfield& hf, bool along_x, const std::string& title) {
  ProfilePlotData p;
  const int n = along_x ? hf.nx : hf.ny;
  for (int k = 0; k < n; ++k) {
    p.x_mm.push_back((k + 0.5) * hf.cell_mm);
    p.z_um.push_back(along_x ? hf.z_um(hf.ny / 2, k) : hf.z_um(k, hf.nx / 2));
  }
  double mean = 0.0;
  for (double z : p.z_um) mean += z / n;
  p.mean_line_um.assign(p.z_um.size(), mean);
  double lo = mean, hi = mean;
  for (double z : p.z_um) {
    p.ra_um += std::abs(z - mean) / n;
    lo = std::min(lo, z);
    hi = std::max(hi, z);
  }
  p.rz_um = hi - lo;  // sample only: peak-to-valley of the trace, not the ISO 4287 five-length Rz
  p.title = title;
  return p;
}

}  // namespace

TEST_CASE("sample report: writes a full HTML report for the browser test", "[.][io_sample]") {
  const char* path = std::getenv("CUSPMAP_SAMPLE_REPORT");
  REQUIRE(path != nullptr);
  const char* png_dir = std::getenv("CUSPMAP_SAMPLE_PNG_DIR");
  const auto keep = [&](const std::string& name, const std::string& png) {
    if (png_dir != nullptr) write_file_atomic(std::string(png_dir) + "/" + name, png);
  };

  const double stepovers[] = {0.3, 0.45, 0.6};
  std::vector<Heightfield> floors;
  for (double s : stepovers) floors.push_back(ball_floor(3.0, s, 0.08, 4.0, 3.0, 0.005));

  HeightImageOptions hopt;
  const HeightImage height = render_height_image(floors[1], hopt);
  const ShadedImage shaded = render_shaded_image(floors[1], ShadedImageOptions{});
  std::vector<MontageTile> tiles;
  HtmlTable table;
  table.caption = "Ball 6 mm, raster along X, three stepovers (sample data)";
  table.columns = {"stepover mm", "Sa um", "max height um"};
  table.best = {BestIs::None, BestIs::Lowest, BestIs::Lowest};
  for (std::size_t k = 0; k < floors.size(); ++k) {
    ShadedImageOptions so;
    so.exaggeration = shaded.exaggeration;  // same relief for a fair comparison
    const ShadedImage tile = render_shaded_image(floors[k], so);
    const std::string s = format_fixed(stepovers[k], 2);
    tiles.push_back(
        {tile.image, tile.mm_per_px, {"raster one-way", "ball 6 mm", "stepover " + s + " mm"}});
    const double sa = mean_abs_deviation(floors[k]);
    const double top = floors[k].z_um.maxCoeff();
    table.rows.push_back({{s}, {format_significant(sa, 3), sa}, {format_significant(top, 3), top}});
  }
  const Image montage = render_montage(tiles, MontageOptions{});
  const ProfilePlot plot = render_profile_plot({profile(floors[1], false, "cross-feed (along Y)"),
                                                profile(floors[1], true, "along feed (X)")},
                                               ProfilePlotOptions{});

  HtmlReport r;
  r.title = "Pump cover floor - finishing pass (sample)";
  r.subtitle = "Sample report built by the test suite from a synthetic ball-cutter floor";
  r.inputs = {{"tool", "ball, 6 mm"},
              {"path", "raster one-way along X"},
              {"stepover", "0.45 mm"},
              {"patch", "4 x 3 mm, cell 0.005 mm"}};
  r.tables = {table};
  const std::string height_png = encode_png(height.image), shaded_png = encode_png(shaded.image);
  const std::string montage_png = encode_png(montage), plot_png = encode_png(plot.image);
  r.images = {{height_png, "height picture", height_image_caption(height, LengthUnit::Millimetre)},
              {shaded_png, "shaded picture", shaded_image_caption(shaded)},
              {montage_png, "montage", "Three stepovers side by side at one scale"}};
  r.profile_plots = {{plot_png, "profile plot", "Cross-feed and along-feed profiles"}};
  r.filters = {"Sample data: mean line = arithmetic mean of the trace (no filter applied)"};
  r.notes = {"Sample <notes> & \"quotes\" are escaped"};
  const std::string html = render_html_report(r);
  write_file_atomic(path, html);
  keep("height.png", height_png);
  keep("shaded.png", shaded_png);
  keep("montage.png", montage_png);
  keep("profile.png", plot_png);
  REQUIRE(html.size() > 10000);
}

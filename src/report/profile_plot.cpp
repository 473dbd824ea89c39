// Stacked profile plots with mean line, Ra band, Rz bar, nice ticks, units and a key.
// Inputs: x mm, z um (plain vectors), Ra/Rz um, cut-off mm; output: RGB Image + panel frames.
// Method: Heckbert 1990 1-2-5 ticks; linear data-to-pixel maps; Bresenham polylines.
#include "report/profile_plot.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <stdexcept>

#include "report/legend.h"
#include "report/nice_ticks.h"
#include "report/text_render.h"

namespace cuspmap {
namespace {

constexpr int kMaxProfiles = 2;
constexpr int kMinWidthPx = 400;        // below this the key and the Rz zone leave no plot area
constexpr int kMinPanelHeightPx = 200;  // ditto for the text rows above and below the plot
constexpr int kPadPx = 10;
constexpr int kTickPx = 6;
constexpr int kRzZonePx = 110;      // room right of the plot for the Rz bar and its label
constexpr int kMaxXIntervals = 10;  // tick density: at most this many intervals per axis
constexpr int kMaxZIntervals = 6;
constexpr double kZMarginFraction = 0.06;  // headroom above/below the data so lines clear the frame
constexpr Color kGridColor = {225, 225, 225};
constexpr int kSignificantDigits = 3;  // Ra/Rz labels: 3 significant digits, as texture reports

int line_height(int scale) { return kFontLinePitchPx * scale; }

void check(const ProfilePlotData& p) {
  const std::size_t n = p.x_mm.size();
  if (n < 2 || p.z_um.size() != n || (!p.mean_line_um.empty() && p.mean_line_um.size() != n)) {
    throw std::invalid_argument(
        "render_profile_plot: x_mm, z_um (and mean_line_um if given) need the same length >= 2");
  }
}

// Draws a polyline, breaking it at non-finite samples; dashes run on from segment to segment.
void polyline(Image& img, const PlotFrame& f, const std::vector<double>& x,
              const std::vector<double>& z, double z_offset, const LineStyle& style) {
  LineStyle seg = style;
  double run_px = 0.0;
  for (std::size_t k = 1; k < x.size(); ++k) {
    const double x0 = f.px_of_x(x[k - 1]), y0 = f.py_of_z(z[k - 1] + z_offset);
    const double x1 = f.px_of_x(x[k]), y1 = f.py_of_z(z[k] + z_offset);
    seg.dash_phase_px = static_cast<int>(std::lround(run_px));
    draw_line(img, x0, y0, x1, y1, seg);
    if (std::isfinite(y0) && std::isfinite(y1))
      run_px += std::max(std::abs(x1 - x0), std::abs(y1 - y0));
  }
}

void draw_panel(Image& img, int top, const ProfilePlotData& p, const ProfilePlotOptions& o,
                PlotFrame& f) {
  const int s = std::max(o.text_scale, 1), lh = line_height(s);
  const bool inch = o.units == LengthUnit::Inch;
  const double x_unit = inch ? 1.0 / kMmPerInch : 1.0;  // mm -> display
  const std::string xu = inch ? "in" : "mm", zu = height_unit_label(o.units);
  std::vector<double> x(p.x_mm.size()), z(p.z_um.size()), m(p.mean_line_um.size());
  for (std::size_t k = 0; k < x.size(); ++k) x[k] = p.x_mm[k] * x_unit;
  for (std::size_t k = 0; k < z.size(); ++k) z[k] = height_in_display_unit(p.z_um[k], o.units);
  for (std::size_t k = 0; k < m.size(); ++k)
    m[k] = height_in_display_unit(p.mean_line_um[k], o.units);
  const double ra = height_in_display_unit(p.ra_um, o.units);
  const double rz = height_in_display_unit(p.rz_um, o.units);

  // Reference level: the mean line where given, else the mean of the profile.
  double z_min = std::numeric_limits<double>::infinity(), z_max = -z_min, sum = 0.0;
  int count = 0;
  for (std::size_t k = 0; k < z.size(); ++k) {
    for (double v : {z[k], m.empty() ? z[k] : m[k]}) {
      if (!std::isfinite(v)) continue;
      z_min = std::min(z_min, v);
      z_max = std::max(z_max, v);
    }
    if (std::isfinite(z[k])) {
      sum += z[k];
      ++count;
    }
  }
  const double centre = count > 0 ? sum / count : 0.0;
  if (!std::isfinite(z_min)) z_min = z_max = 0.0;
  const double ref_lo = m.empty() ? centre : z_min, ref_hi = m.empty() ? centre : z_max;
  z_min = std::min({z_min, ref_lo - ra, centre - rz / 2});
  z_max = std::max({z_max, ref_hi + ra, centre + rz / 2});
  // A profile flatter than this is drawn on a +-kMinHalfSpanUm axis, so float noise of a few
  // 1e-7 um (a float32 heightfield's last bits) is not blown up into fake texture.
  constexpr double kMinHalfSpanUm = 0.05;
  if (!(z_max - z_min >= 2.0 * kMinHalfSpanUm)) {
    const double mid = 0.5 * (z_min + z_max);
    z_min = mid - kMinHalfSpanUm;
    z_max = mid + kMinHalfSpanUm;
  }
  const double margin = kZMarginFraction * (z_max - z_min);
  f.z_lo = z_min - margin;
  f.z_hi = z_max + margin;
  f.x_lo = *std::min_element(x.begin(), x.end());
  f.x_hi = *std::max_element(x.begin(), x.end());
  if (!(f.x_hi > f.x_lo)) f.x_hi = f.x_lo + 1.0;

  const std::vector<double> z_ticks = nice_ticks(f.z_lo, f.z_hi, kMaxZIntervals);
  const int z_dec = decimals_for_step(nice_step(f.z_hi - f.z_lo, kMaxZIntervals));
  int z_label_w = 0;
  for (double t : z_ticks)
    z_label_w = std::max(z_label_w, measure_text(format_fixed(t, z_dec), s).width_px);

  // Text rows: title with the numbers, the key, the z unit; then the plot; then x ticks + unit.
  std::string stats = "Ra " + format_significant(ra, kSignificantDigits) + " " + zu + "   Rz " +
                      format_significant(rz, kSignificantDigits) + " " + zu;
  if (p.cutoff_mm > 0.0) {
    stats +=
        "   cut-off " + format_significant(p.cutoff_mm * x_unit, kSignificantDigits) + " " + xu;
  }
  const int title_y = top + kPadPx;
  const TextSize title_size = draw_text(img, kPadPx, title_y, p.title, {s, kBlack});
  draw_text(img, kPadPx + title_size.width_px + (p.title.empty() ? 0 : 4 * s * 3), title_y, stats,
            {s, kBlack});
  const int key_y = title_y + lh + lh / 4;
  int key_x = kPadPx;
  const auto key = [&](const LineStyle& style, const std::string& text) {
    draw_line(img, key_x, key_y + 3.5 * s, key_x + 28, key_y + 3.5 * s, style);
    key_x += 34 + draw_text(img, key_x + 34, key_y, text, {s, kBlack}).width_px + 6 * s;
  };
  key({kProfileColor, 1, 0}, "profile");
  if (!m.empty()) key({kMeanLineColor, 2, 0}, "mean line");
  key({kRaBandColor, 2, 5}, m.empty() ? "mean +/- Ra" : "mean line +/- Ra");
  key({kRzBarColor, 3, 0}, "bar length = Rz");

  f.left_px = kPadPx + z_label_w + kTickPx + 4;
  f.top_px = key_y + 2 * lh;
  f.width_px = o.width_px - f.left_px - kRzZonePx;
  const int bottom = top + o.panel_height_px - kPadPx - lh - kTickPx - 2;
  f.height_px = std::max(bottom - f.top_px, 2);
  f.rz_bar_x_px = f.left_px + f.width_px + 24;
  draw_text(img, kPadPx, f.top_px - lh - 2, "height " + zu, {s, kBlack});

  // Grid, then data, then axes on top so they stay unbroken.
  for (double t : z_ticks) {
    const int y = static_cast<int>(std::lround(f.py_of_z(t)));
    fill_rect(img, f.left_px, y, f.width_px, 1, kGridColor);
    fill_rect(img, f.left_px - kTickPx, y, kTickPx, 1, kBlack);
    const std::string label = format_fixed(t, z_dec);
    draw_text(img, f.left_px - kTickPx - 4 - measure_text(label, s).width_px, y - 7 * s / 2, label,
              {s, kBlack});
  }
  const int axis_y = f.top_px + f.height_px - 1;
  const double x_step = nice_step(f.x_hi - f.x_lo, kMaxXIntervals);
  const int x_dec = decimals_for_step(x_step);
  int last_label_end = -1;
  for (double t : nice_ticks(f.x_lo, f.x_hi, kMaxXIntervals)) {
    const int xp = static_cast<int>(std::lround(f.px_of_x(t)));
    fill_rect(img, xp, axis_y + 1, 1, kTickPx, kBlack);
    const std::string label = format_fixed(t, x_dec);
    const int w = measure_text(label, s).width_px;
    if (xp - w / 2 > last_label_end + 4 * s) {  // skip a label that would touch the previous one
      draw_text(img, xp - w / 2, axis_y + kTickPx + 4, label, {s, kBlack});
      last_label_end = xp + w / 2;
    }
  }
  draw_text(img, f.left_px + f.width_px + 8, axis_y + kTickPx + 4, "x " + xu, {s, kBlack});

  polyline(img, f, x, z, 0.0, {kProfileColor, 1, 0});
  if (!m.empty()) {
    polyline(img, f, x, m, 0.0, {kMeanLineColor, 2, 0});
    polyline(img, f, x, m, ra, {kRaBandColor, 2, 5});
    polyline(img, f, x, m, -ra, {kRaBandColor, 2, 5});
  } else {
    const LineStyle band{kRaBandColor, 2, 5};
    for (double sign : {1.0, -1.0}) {
      draw_line(img, f.left_px, f.py_of_z(centre + sign * ra), f.left_px + f.width_px - 1,
                f.py_of_z(centre + sign * ra), band);
    }
  }
  // Rz bar: a vertical bar whose length on the height scale is Rz, centred on the mean height.
  const double y_top = f.py_of_z(centre + rz / 2), y_bot = f.py_of_z(centre - rz / 2);
  const LineStyle bar{kRzBarColor, 3, 0};
  draw_line(img, f.rz_bar_x_px, y_top, f.rz_bar_x_px, y_bot, bar);
  draw_line(img, f.rz_bar_x_px - 6, y_top, f.rz_bar_x_px + 6, y_top, bar);
  draw_line(img, f.rz_bar_x_px - 6, y_bot, f.rz_bar_x_px + 6, y_bot, bar);
  draw_text(img, f.rz_bar_x_px + 12, static_cast<int>(0.5 * (y_top + y_bot)) - 7 * s / 2, "Rz",
            {s, kBlack});

  fill_rect(img, f.left_px - 1, f.top_px, 1, f.height_px + 1, kBlack);   // z axis
  fill_rect(img, f.left_px - 1, axis_y + 1, f.width_px + 1, 1, kBlack);  // x axis
}

}  // namespace

ProfilePlot render_profile_plot(const std::vector<ProfilePlotData>& profiles,
                                const ProfilePlotOptions& options) {
  if (profiles.empty() || static_cast<int>(profiles.size()) > kMaxProfiles) {
    throw std::invalid_argument("render_profile_plot: needs 1 or 2 profiles");
  }
  for (const ProfilePlotData& p : profiles) check(p);
  if (options.width_px < kMinWidthPx || options.panel_height_px < kMinPanelHeightPx) {
    throw std::invalid_argument("render_profile_plot: picture needs >= 400 x 200 px per panel");
  }
  ProfilePlot plot;
  const int panels = static_cast<int>(profiles.size());
  plot.image = make_image(options.width_px, panels * options.panel_height_px, 3, kWhite);
  plot.panels.resize(profiles.size());
  for (int k = 0; k < panels; ++k) {
    draw_panel(plot.image, k * options.panel_height_px, profiles[k], options, plot.panels[k]);
    if (k > 0)
      fill_rect(plot.image, 0, k * options.panel_height_px, options.width_px, 1, kGridColor);
  }
  return plot;
}

}  // namespace cuspmap

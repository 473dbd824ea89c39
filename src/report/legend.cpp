// Height legend (gray ramp, 1-2-5 labels, "not reached" swatch) and scale bars.
// Inputs: range in um, display unit, sizes in px; outputs: gray legend image, drawn scale bar.
// Method: Heckbert 1990 nice numbers; uin = um x 39.37 (core/units.h kUinPerUm).
#include "report/legend.h"

#include <algorithm>
#include <cmath>
#include <vector>

#include "report/nice_ticks.h"
#include "report/text_render.h"

namespace cuspmap {
namespace {

constexpr int kPadPx = 8;           // margin around the legend
constexpr int kRampWidthPx = 18;    // wide enough to read a gray level at a glance
constexpr int kTickPx = 5;          // tick mark length right of the ramp
constexpr int kLabelGapPx = 4;      // gap between tick and label
constexpr int kSwatchPx = 16;       // side of the "not reached" swatch
constexpr int kMaxLegendTicks = 6;  // at most this many intervals between labelled ticks
constexpr int kFlatLevel = 127;     // gray of a degenerate (hi == lo) range

// Capitals occupy font rows 0..6: their visual centre is 3.5 units below the text top.
int text_centre_offset(int scale) { return (7 * scale) / 2; }

struct Label {
  int row;  // ramp row, 0 = top
  std::string text;
};

std::vector<Label> legend_labels(const HeightLegendSpec& spec) {
  const int bar = std::max(spec.bar_height_px, 2);
  const double lo = height_in_display_unit(spec.lo_um, spec.units);
  const double hi = height_in_display_unit(spec.hi_um, spec.units);
  if (!(hi > lo)) return {{bar / 2, format_fixed(lo, 3)}};
  const double step = nice_step(hi - lo, kMaxLegendTicks);
  // The ends carry one more decimal than the ticks so the exact range can be read off.
  const int end_decimals = decimals_for_step(step) + 1;
  std::vector<Label> labels{{0, format_fixed(hi, end_decimals)},
                            {bar - 1, format_fixed(lo, end_decimals)}};
  const int min_gap = measure_text("0", spec.text_scale).height_px + 2;
  for (double v : nice_ticks(lo, hi, kMaxLegendTicks)) {
    const int row = static_cast<int>(std::lround((hi - v) / (hi - lo) * (bar - 1)));
    if (row < min_gap || row > bar - 1 - min_gap) continue;  // would collide with an end label
    labels.push_back({row, format_fixed(v, decimals_for_step(step))});
  }
  return labels;
}

}  // namespace

std::string height_unit_label(LengthUnit units) { return units == LengthUnit::Inch ? "uin" : "um"; }

double height_in_display_unit(double height_um, LengthUnit units) {
  return units == LengthUnit::Inch ? height_um * kUinPerUm : height_um;
}

int legend_ramp_top_px(const HeightLegendSpec& spec) {
  // Title (two lines), a gap, then half a label height so the top label is not cut off.
  return kPadPx + measure_text("height\num", spec.text_scale).height_px + kPadPx +
         text_centre_offset(spec.text_scale);
}

int legend_ramp_left_px(const HeightLegendSpec&) { return kPadPx; }
int legend_ramp_width_px(const HeightLegendSpec&) { return kRampWidthPx; }

Image render_height_legend(const HeightLegendSpec& spec) {
  const int bar = std::max(spec.bar_height_px, 2);
  const int scale = std::max(spec.text_scale, 1);
  const std::vector<Label> labels = legend_labels(spec);
  int label_width = 0;
  for (const Label& l : labels)
    label_width = std::max(label_width, measure_text(l.text, scale).width_px);
  const std::string title = "height\n" + height_unit_label(spec.units);
  const std::string swatch_text = "not\nreached";
  const TextSize title_size = measure_text(title, scale);
  const TextSize swatch_size = measure_text(swatch_text, scale);
  const int ramp_top = legend_ramp_top_px(spec);
  const int ramp_right = kPadPx + kRampWidthPx;
  const int label_x = ramp_right + kTickPx + kLabelGapPx;
  int width = std::max(label_x + label_width, kPadPx + title_size.width_px) + kPadPx;
  int height = ramp_top + bar + text_centre_offset(scale) + kPadPx;
  const int swatch_y = height;
  if (spec.show_unreached) {
    width = std::max(width, kPadPx + kSwatchPx + kLabelGapPx + swatch_size.width_px + kPadPx);
    height += std::max(kSwatchPx, swatch_size.height_px) + kPadPx;
  }
  Image img = make_image(width, height, 1, kWhite);
  draw_text(img, kPadPx, kPadPx, title, {scale, kBlack});
  const double lo = spec.lo_um, hi = spec.hi_um;
  for (int r = 0; r < bar; ++r) {
    const int level =
        hi > lo ? static_cast<int>(std::lround(kTopHeightLevel * (1.0 - double(r) / (bar - 1))))
                : kFlatLevel;
    fill_rect(img, kPadPx, ramp_top + r, kRampWidthPx, 1, gray(static_cast<std::uint8_t>(level)));
  }
  // The frame sits outside the ramp so every ramp pixel keeps its level.
  draw_rect(img, kPadPx - 1, ramp_top - 1, kRampWidthPx + 2, bar + 2, kBlack);
  for (const Label& l : labels) {
    const int y = ramp_top + l.row;
    fill_rect(img, ramp_right + 1, y, kTickPx, 1, kBlack);
    draw_text(img, label_x, y - text_centre_offset(scale), l.text, {scale, kBlack});
  }
  if (spec.show_unreached) {
    draw_rect(img, kPadPx, swatch_y, kSwatchPx, kSwatchPx, kBlack);  // white inside, framed
    draw_text(img, kPadPx + kSwatchPx + kLabelGapPx, swatch_y, swatch_text, {scale, kBlack});
  }
  return img;
}

ScaleBar choose_scale_bar(double mm_per_px, int max_px, LengthUnit units) {
  if (!(mm_per_px > 0.0) || max_px < 1) return {};
  const double unit_mm = units == LengthUnit::Inch ? kMmPerInch : 1.0;
  const double length = nice_length_at_most(max_px * mm_per_px / unit_mm);
  ScaleBar bar;
  bar.length_mm = length * unit_mm;
  bar.length_px = static_cast<int>(std::lround(bar.length_mm / mm_per_px));
  if (length <= 0.0 || bar.length_px < 1) return {};
  bar.label =
      format_fixed(length, decimals_for_step(length)) + (units == LengthUnit::Inch ? " in" : " mm");
  return bar;
}

int draw_scale_bar(Image& image, int x, int y, const ScaleBar& bar, int text_scale) {
  if (bar.length_px < 1) return 0;
  fill_rect(image, x, y, 2, kScaleBarTickPx, kBlack);
  fill_rect(image, x + bar.length_px - 2, y, 2, kScaleBarTickPx, kBlack);
  fill_rect(image, x, y + kScaleBarTickPx, bar.length_px, kScaleBarThicknessPx, kBlack);
  const int label_y = y + kScaleBarTickPx + kScaleBarThicknessPx + 4;
  const TextSize size = draw_text(image, x, label_y, bar.label, {text_scale, kBlack});
  return label_y - y + size.height_px;
}

}  // namespace cuspmap

// Legends drawn into pictures: the gray-ramp height legend of height.png (range, units, the
// "not reached" swatch) and the scale bar of shaded pictures and montages (a nice length in mm
// or inches). Cost: O(legend pixels).
// Method: 1-2-5 nice numbers (Heckbert, Graphics Gems I, 1990); labels via io/text_render.
#pragma once

#include <string>

#include "core/units.h"
#include "io/raster_image.h"

namespace cuspmap {

/// Gray level of the highest height in height.png; 0 is the lowest. 255 is kept for "not reached".
inline constexpr int kTopHeightLevel = 254;
/// Gray level that marks cells no move reached (pure white, never used for a height).
inline constexpr int kUnreachedLevel = 255;

/// The gray level nearest to `level` (halves up, as std::lround), clamped to
/// [0, kTopHeightLevel]; inlined per pixel instead of a library call (the same levels).
inline int nearest_gray_level(double level) {
  const double v = level > 0.0 ? (level < kTopHeightLevel ? level : kTopHeightLevel) : 0.0;
  const int whole = static_cast<int>(v);  // v >= 0: truncation is the floor
  return v - whole >= 0.5 ? whole + 1 : whole;
}

/// Unit label for heights: "um" (Millimetre) or "uin" (Inch).
std::string height_unit_label(LengthUnit units);
/// Height in um converted to the display unit (um, or uin = um x 39.37).
double height_in_display_unit(double height_um, LengthUnit units);

/// What the height legend shows.
struct HeightLegendSpec {
  double lo_um = 0.0;  ///< height drawn as gray 0 (black), um
  double hi_um = 0.0;  ///< height drawn as gray 254, um; hi == lo draws one gray 127 value
  LengthUnit units = LengthUnit::Millimetre;  ///< labels in um (Millimetre) or uin (Inch)
  int bar_height_px = 200;                    ///< length of the gray ramp, >= 2
  bool show_unreached = true;                 ///< add the white "not reached" swatch below the ramp
  int text_scale = 2;                         ///< text size (pixels per font unit)
};

/// Renders the legend as its own gray image (white background) to blit beside a height map:
/// a title ("height um"), a vertical ramp whose row r (0 = top) has gray
/// round(254 (1 - r / (bar_height_px - 1))), tick marks and labels at 1-2-5 values in between,
/// the exact ends labelled, and optionally the framed white swatch "not reached".
/// @return a gray image; ramp rows start at legend_ramp_top_px(spec)
Image render_height_legend(const HeightLegendSpec& spec);

/// Row of the legend image where the ramp's top (gray 254) is drawn.
int legend_ramp_top_px(const HeightLegendSpec& spec);
/// Column of the legend image where the ramp starts, and its width in pixels.
int legend_ramp_left_px(const HeightLegendSpec& spec);
int legend_ramp_width_px(const HeightLegendSpec& spec);

/// A scale bar: a nice length, its size in pixels and its label.
struct ScaleBar {
  double length_mm = 0.0;  ///< physical length, mm (a 1-2-5 value in mm, or in inches x 25.4)
  int length_px = 0;       ///< round(length_mm / mm_per_px)
  std::string label;       ///< e.g. "2 mm" or "0.05 in"
};

/// The longest 1-2-5 length (in mm, or in inches for LengthUnit::Inch) that fits in max_px.
/// @param[in] mm_per_px  picture scale, > 0
/// @param[in] max_px     longest bar allowed, >= 1
/// @return length_px >= 1 unless nothing fits (then a zero ScaleBar)
ScaleBar choose_scale_bar(double mm_per_px, int max_px, LengthUnit units);

/// Draws the bar with its top-left at (x, y): end ticks in rows y .. y + kScaleBarTickPx - 1,
/// then the solid black body, length_px wide and kScaleBarThicknessPx tall, starting at row
/// y + kScaleBarTickPx and column x, then the label below.
/// @return the height drawn, pixels
int draw_scale_bar(Image& image, int x, int y, const ScaleBar& bar, int text_scale);

/// Thickness of the scale bar body, pixels.
inline constexpr int kScaleBarThicknessPx = 4;
/// Length of the end ticks above the bar body, pixels.
inline constexpr int kScaleBarTickPx = 4;

}  // namespace cuspmap

// Text in pictures: draws ASCII strings (with '\n' line breaks) into an Image with a built-in
// vector bitmap font scaled by whole pixels, so labels need no font file on the machine.
// Cost: O(characters x scale^2). Characters outside printable ASCII are drawn as '?'.
// Method: stb_easy_font (S. Barrett, public domain; Debian libstb-dev) quads, rasterised here.
#pragma once

#include <string_view>

#include "io/raster_image.h"

namespace cuspmap {

/// Line pitch of the font at scale 1, pixels (stb_easy_font advances 12 units per '\n').
inline constexpr int kFontLinePitchPx = 12;

/// How text is drawn.
struct TextStyle {
  int scale = 2;         ///< pixels per font unit, >= 1 (2 gives ~14 px capitals, readable)
  Color color = kBlack;  ///< ink colour
};

/// Size of a block of text in pixels.
struct TextSize {
  int width_px = 0;   ///< widest line
  int height_px = 0;  ///< lines x line pitch (last line without its leading below)
};

/// Measures text as draw_text would draw it.
/// @param[in] text   ASCII, '\n' separates lines; empty -> {0, 0}
/// @param[in] scale  pixels per font unit, >= 1
TextSize measure_text(std::string_view text, int scale);

/// Draws text with its top-left corner at (x, y) (y down), clipped to the image.
/// @param[in,out] image  gray or RGB
/// @param[in] text       ASCII; other bytes become '?'
TextSize draw_text(Image& image, int x, int y, std::string_view text, const TextStyle& style);

}  // namespace cuspmap

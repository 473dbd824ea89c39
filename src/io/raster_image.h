// Image: an 8-bit gray or RGB raster (top row first) and the primitives pictures are drawn with:
// pixel access, rectangle fill, blit, clipped straight lines. Cost: O(pixels touched).
// Method: Bresenham, IBM Systems Journal 4(1), 1965 (lines); Liang & Barsky, ACM TOG 3(1), 1984
// (clipping).
#pragma once

#include <cstdint>
#include <vector>

namespace cuspmap {

/// An 8-bit colour. Gray images store the luma of it (exact for r == g == b).
struct Color {
  std::uint8_t r = 0;  ///< red, 0..255
  std::uint8_t g = 0;  ///< green, 0..255
  std::uint8_t b = 0;  ///< blue, 0..255
  bool operator==(const Color&) const = default;
};

/// A gray colour r = g = b = level.
constexpr Color gray(std::uint8_t level) { return Color{level, level, level}; }

inline constexpr Color kBlack = gray(0);    ///< text, axes, frames
inline constexpr Color kWhite = gray(255);  ///< page background

/// An 8-bit raster image. Pixel (x, y) has x to the right and y DOWN (row 0 is the top row, as
/// PNG stores it); its channels sit at pixels[(y * width + x) * channels + c].
struct Image {
  int width = 0;                     ///< columns, >= 0
  int height = 0;                    ///< rows, >= 0
  int channels = 1;                  ///< 1 = gray, 3 = RGB (interleaved)
  std::vector<std::uint8_t> pixels;  ///< height x width x channels bytes

  /// True when (x, y) lies inside the image.
  bool contains(int x, int y) const { return x >= 0 && y >= 0 && x < width && y < height; }
  /// First channel of pixel (x, y) (the gray level of a gray image); (x, y) must be inside.
  std::uint8_t& at(int x, int y) {
    return pixels[(static_cast<std::size_t>(y) * width + x) * channels];
  }
  const std::uint8_t& at(int x, int y) const {
    return pixels[(static_cast<std::size_t>(y) * width + x) * channels];
  }
};

/// A width x height image filled with `background`.
/// @param[in] width, height  size in pixels, >= 0
/// @param[in] channels       1 (gray) or 3 (RGB); anything else throws std::invalid_argument
Image make_image(int width, int height, int channels, Color background);

/// Colour of pixel (x, y), which must be inside (gray images give r = g = b).
Color pixel(const Image& image, int x, int y);

/// Sets pixel (x, y) to `color`; a pixel outside the image is ignored (clipping).
void set_pixel(Image& image, int x, int y, Color color);

/// Fills the rectangle [x, x + w) x [y, y + h), clipped to the image; w or h <= 0 draws nothing.
void fill_rect(Image& image, int x, int y, int w, int h, Color color);

/// Draws a rectangle outline one pixel wide on the rectangle's own border pixels.
void draw_rect(Image& image, int x, int y, int w, int h, Color color);

/// Copies `src` into `dst` with src's top-left corner at (x, y), clipped to dst. A gray source
/// goes into an RGB destination as r = g = b; an RGB source into a gray one as its luma
/// (ITU-R BT.601 weights 0.299, 0.587, 0.114).
void blit(const Image& src, Image& dst, int x, int y);

/// Line style for draw_line.
struct LineStyle {
  Color color = kBlack;   ///< line colour
  int thickness_px = 1;   ///< square brush size in pixels, >= 1
  int dash_px = 0;        ///< 0 = solid; else dash_px pixels on, dash_px pixels off
  int dash_phase_px = 0;  ///< pattern pixels already used before the start (polylines pass the
                          ///< running length so the dashes run on across segments)
};

/// Draws the straight segment (x0, y0)-(x1, y1) (pixel centres at integer coordinates, y down),
/// clipped to the image first so that far-off endpoints cost nothing; endpoints included.
/// Non-finite coordinates draw nothing.
void draw_line(Image& image, double x0, double y0, double x1, double y1, const LineStyle& style);

}  // namespace cuspmap

// Rasterises stb_easy_font's axis-aligned quads into an Image at an integer scale.
// Inputs: ASCII text, position (px, y down), scale; output: pixels set in the image.
// Method: stb_easy_font v1.1 glyph segments (public domain), filled as rectangles.
#include "report/text_render.h"

#include <stb_easy_font.h>

#include <algorithm>
#include <string>
#include <vector>

namespace cuspmap {
namespace {

// stb_easy_font writes 4 vertices of 16 bytes (x, y, z floats + RGBA) per quad. The busiest
// glyph of its table has 11 segments (one quad each); 16 per character leaves a margin.
constexpr int kVertexBytes = 16;
constexpr int kFloatsPerVertex = kVertexBytes / static_cast<int>(sizeof(float));
constexpr int kMaxQuadsPerChar = 16;
// Printable ASCII is what the font table covers (codes 32..126).
constexpr char kFirstPrintable = 32, kLastPrintable = 126;

std::string printable(std::string_view text) {
  std::string s(text);
  for (char& c : s) {
    if (c != '\n' && (c < kFirstPrintable || c > kLastPrintable)) c = '?';
  }
  return s;
}

}  // namespace

TextSize measure_text(std::string_view text, int scale) {
  if (text.empty()) return {};
  std::string s = printable(text);
  const int s_scale = std::max(scale, 1);
  const int lines = 1 + static_cast<int>(std::count(s.begin(), s.end(), '\n'));
  // Glyph rows span 0..8 below the line's top (capitals 0..6, descenders of g, j, p, q, y to 8).
  constexpr int kGlyphDepth = 9;
  return {stb_easy_font_width(s.data()) * s_scale,
          ((lines - 1) * kFontLinePitchPx + kGlyphDepth) * s_scale};
}

TextSize draw_text(Image& image, int x, int y, std::string_view text, const TextStyle& style) {
  if (text.empty()) return {};
  std::string s = printable(text);
  const int scale = std::max(style.scale, 1);
  std::vector<float> vertices(s.size() * kMaxQuadsPerChar * 4 * kFloatsPerVertex);
  const int buffer_bytes = static_cast<int>(vertices.size() * sizeof(float));
  const int quads =
      stb_easy_font_print(0.0f, 0.0f, s.data(), nullptr, vertices.data(), buffer_bytes);
  for (int q = 0; q < quads; ++q) {
    // Vertices 0 and 2 of a quad are opposite corners (x0, y0) and (x1, y1); units are pixels.
    const float* v0 = &vertices[static_cast<std::size_t>(q) * 4 * kFloatsPerVertex];
    const float* v2 = v0 + 2 * kFloatsPerVertex;
    const int qx0 = static_cast<int>(v0[0]), qy0 = static_cast<int>(v0[1]);
    const int qx1 = static_cast<int>(v2[0]), qy1 = static_cast<int>(v2[1]);
    fill_rect(image, x + qx0 * scale, y + qy0 * scale, (qx1 - qx0) * scale, (qy1 - qy0) * scale,
              style.color);
  }
  return measure_text(text, scale);
}

}  // namespace cuspmap

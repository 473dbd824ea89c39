// Montage of labelled pictures on a shared scale with one scale bar.
// Inputs: tiles (image, mm per px, label lines); output: gray or RGB Image.
// Method: box-filter shrink to the coarsest scale; io/legend scale bar (1-2-5 lengths).
#include "report/montage.h"

#include <algorithm>
#include <cmath>
#include <stdexcept>

#include "report/legend.h"
#include "report/text_render.h"

namespace cuspmap {
namespace {

constexpr int kMarginPx = 12;
constexpr int kGapPx = 16;
constexpr int kLabelTopPx = 6;  // space between a picture's frame and its first label line
// Tiles whose scales differ by less than this relative amount are drawn unresampled: rounding of
// cell sizes read from job files should not blur a picture.
constexpr double kSameScaleRelTol = 1e-6;
// The scale bar may use up to half a cell: long enough to read, short enough to fit.
constexpr double kScaleBarCellFraction = 0.5;

double shrink_factor(const MontageTile& t, double mm_per_px) {
  const double f = mm_per_px / t.mm_per_px;
  return f < 1.0 + kSameScaleRelTol ? 1.0 : f;
}

std::size_t max_label_lines(const std::vector<MontageTile>& tiles) {
  std::size_t n = 0;
  for (const MontageTile& t : tiles) n = std::max(n, t.label_lines.size());
  return n;
}

}  // namespace

Image shrink_image(const Image& image, double factor) {
  if (!(factor > 1.0)) return image;
  const int w = std::max(1, static_cast<int>(std::lround(image.width / factor)));
  const int h = std::max(1, static_cast<int>(std::lround(image.height / factor)));
  Image out = make_image(w, h, image.channels, kWhite);
  for (int oy = 0; oy < h; ++oy) {
    const int y0 = std::min(static_cast<int>(oy * factor), image.height - 1);
    const int y1 = std::clamp(static_cast<int>(std::ceil((oy + 1) * factor)), y0 + 1, image.height);
    for (int ox = 0; ox < w; ++ox) {
      const int x0 = std::min(static_cast<int>(ox * factor), image.width - 1);
      const int x1 =
          std::clamp(static_cast<int>(std::ceil((ox + 1) * factor)), x0 + 1, image.width);
      for (int c = 0; c < image.channels; ++c) {
        long sum = 0;
        for (int y = y0; y < y1; ++y) {
          const std::size_t row = static_cast<std::size_t>(y) * image.width;
          for (int x = x0; x < x1; ++x) sum += image.pixels[(row + x) * image.channels + c];
        }
        const long n = static_cast<long>(y1 - y0) * (x1 - x0);
        (&out.at(ox, oy))[c] = static_cast<std::uint8_t>((sum + n / 2) / n);
      }
    }
  }
  return out;
}

MontageLayout montage_layout(const std::vector<MontageTile>& tiles, const MontageOptions& options) {
  if (tiles.empty()) throw std::invalid_argument("render_montage: no tiles");
  if (options.columns < 1) throw std::invalid_argument("render_montage: columns must be >= 1");
  MontageLayout layout;
  for (const MontageTile& t : tiles) {
    if (t.image.width < 1 || t.image.height < 1 || !(t.mm_per_px > 0.0)) {
      throw std::invalid_argument("render_montage: every tile needs an image and mm_per_px > 0");
    }
    layout.mm_per_px = std::max(layout.mm_per_px, t.mm_per_px);
  }
  for (const MontageTile& t : tiles) {
    const double f = shrink_factor(t, layout.mm_per_px);
    const int w =
        f > 1.0 ? std::max(1, static_cast<int>(std::lround(t.image.width / f))) : t.image.width;
    const int h =
        f > 1.0 ? std::max(1, static_cast<int>(std::lround(t.image.height / f))) : t.image.height;
    layout.cell_width_px = std::max(layout.cell_width_px, w);
    layout.cell_height_px = std::max(layout.cell_height_px, h);
  }
  const int s = std::max(options.text_scale, 1);
  const int lines = static_cast<int>(max_label_lines(tiles));
  // 2 px keep the tile's frame clear of the labels; then the lines (9 units deep for the last).
  layout.label_height_px =
      2 + (lines > 0 ? kLabelTopPx + (lines - 1) * kFontLinePitchPx * s + 9 * s : 0);
  layout.gap_px = kGapPx;
  layout.grid_left_px = kMarginPx;
  layout.grid_top_px =
      kMarginPx +
      (options.title.empty() ? 0 : measure_text(options.title, s).height_px + kMarginPx);
  const int columns = std::min<int>(options.columns, static_cast<int>(tiles.size()));
  const int rows = (static_cast<int>(tiles.size()) + columns - 1) / columns;
  layout.scale_bar_x_px = kMarginPx;
  layout.scale_bar_y_px = layout.grid_top_px +
                          rows * (layout.cell_height_px + layout.label_height_px) +
                          (rows - 1) * kGapPx + kGapPx;
  return layout;
}

Image render_montage(const std::vector<MontageTile>& tiles, const MontageOptions& options) {
  const MontageLayout layout = montage_layout(tiles, options);
  const int s = std::max(options.text_scale, 1);
  const int columns = std::min<int>(options.columns, static_cast<int>(tiles.size()));
  bool rgb = false;
  for (const MontageTile& t : tiles) rgb = rgb || t.image.channels == 3;

  const ScaleBar bar = choose_scale_bar(
      layout.mm_per_px, static_cast<int>(kScaleBarCellFraction * layout.cell_width_px),
      options.units);
  const std::string note = "all pictures at one scale";
  const int bar_block_h =
      kScaleBarTickPx + kScaleBarThicknessPx + 4 + measure_text("0", s).height_px;
  const int width =
      std::max(2 * kMarginPx + columns * layout.cell_width_px + (columns - 1) * kGapPx,
               layout.scale_bar_x_px + std::max(bar.length_px, 1) + 3 * kGapPx +
                   measure_text(note, s).width_px + kMarginPx);
  const int height = layout.scale_bar_y_px + bar_block_h + kMarginPx;
  Image out = make_image(width, height, rgb ? 3 : 1, kWhite);
  if (!options.title.empty()) draw_text(out, kMarginPx, kMarginPx, options.title, {s, kBlack});

  for (int k = 0; k < static_cast<int>(tiles.size()); ++k) {
    const MontageTile& t = tiles[k];
    const Image picture = shrink_image(t.image, shrink_factor(t, layout.mm_per_px));
    const int x = layout.tile_x(k, columns), y = layout.tile_y(k, columns);
    // The frame is one pixel outside the picture so white (not reached) cells stay readable.
    draw_rect(out, x - 1, y - 1, picture.width + 2, picture.height + 2, kBlack);
    blit(picture, out, x, y);
    if (t.label_lines.empty()) continue;
    std::string text;
    for (std::size_t line = 0; line < t.label_lines.size(); ++line) {
      text += (line > 0 ? "\n" : "") + t.label_lines[line];
    }
    // Labels are drawn into a cell-wide strip, so a long line is cut at the cell edge.
    Image strip =
        make_image(layout.cell_width_px, layout.label_height_px - 2, out.channels, kWhite);
    draw_text(strip, 0, kLabelTopPx, text, {s, kBlack});
    blit(strip, out, x, y + layout.cell_height_px + 2);
  }
  draw_scale_bar(out, layout.scale_bar_x_px, layout.scale_bar_y_px, bar, s);
  draw_text(out, layout.scale_bar_x_px + bar.length_px + 3 * kGapPx,
            layout.scale_bar_y_px + kScaleBarTickPx, note, {s, kBlack});
  return out;
}

}  // namespace cuspmap

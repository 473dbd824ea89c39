// montage.png: pictures side by side on one shared scale, up to `columns` per row, each with a
// few label lines, and one 1-2-5 scale bar in mm or in. Cost: O(input + output pixels).
// Method: box-filter shrink to the coarsest tile scale (Gonzalez & Woods, 3rd ed., 2.4);
// Heckbert, Graphics Gems I, 1990 (1-2-5 lengths).
#pragma once

#include <string>
#include <vector>

#include "core/units.h"
#include "io/raster_image.h"

namespace cuspmap {

/// One picture of the montage.
struct MontageTile {
  Image image;                           ///< gray or RGB, e.g. ShadedImage::image
  double mm_per_px = 0.0;                ///< its scale, > 0 (ShadedImage::mm_per_px)
  std::vector<std::string> label_lines;  ///< shown under the picture, ~3 lines, ASCII
};

/// Layout of the montage.
struct MontageOptions {
  int columns = 4;                            ///< tiles per row, >= 1
  LengthUnit units = LengthUnit::Millimetre;  ///< scale bar in mm (Millimetre) or in (Inch)
  int text_scale = 2;                         ///< label text size
  std::string title;                          ///< optional line above the grid
};

/// Geometry of the montage, for callers and tests that locate its parts.
struct MontageLayout {
  double mm_per_px = 0.0;   ///< the shared scale: the coarsest of the tiles
  int cell_width_px = 0;    ///< width of a grid cell (widest resampled tile)
  int cell_height_px = 0;   ///< height of a grid cell's picture part (tallest resampled tile)
  int label_height_px = 0;  ///< height of the label band under each picture
  int grid_left_px = 0;     ///< left edge of the first cell's picture
  int grid_top_px = 0;      ///< top edge of the first row's pictures
  int gap_px = 0;           ///< space between cells
  int scale_bar_x_px = 0;   ///< where the scale bar's ticks start (top-left)
  int scale_bar_y_px = 0;
  /// Top-left pixel of tile k's picture.
  int tile_x(int k, int columns) const {
    return grid_left_px + (k % columns) * (cell_width_px + gap_px);
  }
  int tile_y(int k, int columns) const {
    return grid_top_px + (k / columns) * (cell_height_px + label_height_px + gap_px);
  }
};

/// Computes the layout render_montage uses (no drawing).
/// @throws std::invalid_argument for no tiles, an empty tile image, mm_per_px <= 0 or columns < 1
MontageLayout montage_layout(const std::vector<MontageTile>& tiles, const MontageOptions& options);

/// Renders the montage: every tile resampled to the shared (coarsest) scale, framed, top-left
/// aligned in its cell, its label lines below it (clipped to the cell width), and one scale bar
/// under the grid. Gray output when every tile is gray, else RGB; white background.
/// @throws std::invalid_argument as montage_layout
Image render_montage(const std::vector<MontageTile>& tiles, const MontageOptions& options);

/// Resamples an image by area averaging so that each output pixel covers `factor` (>= 1) input
/// pixels per side: output size max(1, round(size / factor)).
Image shrink_image(const Image& image, double factor);

}  // namespace cuspmap

// height.png: a heightfield as an 8-bit grayscale picture seen from above (+Y up), black = the
// lowest height of the range, gray 254 = the highest, pure white (255) = cells no move reached,
// with an optional legend giving the range in um or uin. Cost: O(cells + pixels).
// Method: linear gray mapping of heights; anti-aliased k x k decimation (report/reduce_blocks);
// whole-pixel magnification (pixel replication) for detail views.
#pragma once

#include <optional>
#include <string>

#include "core/heightfield.h"
#include "core/units.h"
#include "io/raster_image.h"
#include "report/reduce_blocks.h"

namespace cuspmap {

/// A fixed height range shared by several pictures.
struct HeightRange {
  double lo_um = 0.0;  ///< height drawn black, um
  double hi_um = 0.0;  ///< height drawn gray 254, um; must be > lo_um
};

/// How height.png is drawn.
struct HeightImageOptions {
  std::optional<HeightRange> range;           ///< empty = min..max of the finite cells (auto)
  LengthUnit units = LengthUnit::Millimetre;  ///< legend labels in um (mm) or uin (in)
  int max_pixels = 1024;  ///< longest side of the map part; larger grids are block-reduced
  BlockReduce downsample = BlockReduce::AntiAlias;  ///< how k x k cells become one pixel
  /// > 1 draws each cell as zoom x zoom pixels (detail views at native resolution; only when the
  /// grid is not reduced, k = 1). 1 = off.
  int zoom = 1;
  bool legend = true;  ///< add the legend (and a margin and frame) right of the map
  int text_scale = 2;  ///< legend text size
  /// One line drawn above the map when a legend is drawn (e.g. which scale the picture uses);
  /// empty = none.
  std::string title;
};

/// The picture and the numbers the report states about it.
struct HeightImage {
  Image image;                ///< gray; without legend exactly the map, else map + legend
  double lo_um = 0.0;         ///< height drawn as gray 0
  double hi_um = 0.0;         ///< height drawn as gray 254
  double um_per_level = 0.0;  ///< (hi - lo) / 254: height step of one gray level, um
  int cells_per_pixel = 1;  ///< k: each pixel covers k x k cells (partial blocks at +X / -Y edges)
  int zoom = 1;             ///< each cell drawn as zoom x zoom pixels (k = 1 then)
  double mm_per_px = 0.0;   ///< k x cell size / zoom
  int map_x_px = 0;         ///< column of the map's left edge in `image`
  int map_y_px = 0;         ///< row of the map's top edge in `image`
  int map_width_px = 0;     ///< ceil(nx / k) x zoom
  int map_height_px = 0;    ///< ceil(ny / k) x zoom
  std::int64_t clamped_cells = 0;     ///< finite cells outside a fixed range (drawn 0 or 254)
  std::int64_t unreached_pixels = 0;  ///< map pixels drawn white (no finite cell in the block)
};

/// Gray level of a height: round(254 (z - lo) / (hi - lo)) clamped to 0..254; NaN -> 255;
/// hi <= lo -> 127 for every finite height.
int height_gray_level(double z_um, double lo_um, double hi_um);

/// Renders height.png. Map pixel row 0 (top) shows the highest Y: map row r holds block row
/// (map_height_px - 1 - r) of the heightfield, whose row 0 is the lowest Y; columns run along +X.
/// @param[in] hf  heightfield (um, NaN = not reached); nx, ny >= 1
/// @param[in] options  range (auto or fixed), units, size limit, legend
/// @return the image and its scale; an all-NaN field gives an all-white map, range 0..0
/// @throws InputError when a fixed range is not finite or its high end is not above its low end
HeightImage render_height_image(const Heightfield& hf, const HeightImageOptions& options);

/// One-line caption for reports, in the display unit, e.g. "Height seen from above, +Y up: black
/// = 0.00 um, light gray = 8.50 um (0.0335 um per gray level); white = not reached; 1 pixel =
/// 2 x 2 cells (0.01 mm)." (zoomed: "1 cell (0.005 mm) = 2 x 2 pixels.")
std::string height_image_caption(const HeightImage& image, LengthUnit units);

}  // namespace cuspmap

// The detail view of a floor: the window where the marks are deepest (report/detail_window),
// drawn cell by cell (each cell zoom x zoom pixels) as heights on the window's own range and as
// shaded relief, with a caption stating where it lies; and the orange outline that marks the
// window on the overviews. Inputs: heightfield (um, mm cells); outputs: gray/RGB Images.
// Method: report/height_image and report/shaded_image at k = 1; pixel replication.
#pragma once

#include <string>

#include "core/units.h"
#include "io/raster_image.h"
#include "report/detail_window.h"
#include "report/height_image.h"
#include "report/shaded_image.h"

namespace cuspmap {

/// Longest side the detail pictures are magnified towards, px (whole pixels per cell): about
/// the overview's size, so marks a few cells apart are plainly visible.
inline constexpr int kDetailTargetPx = 600;

/// Colour of the outline that marks the detail window on the overviews: a saturated orange
/// that no gray of the height or relief scale can be mistaken for.
inline constexpr Color kDetailOutlineColor{235, 110, 0};

/// The detail pictures of one window.
struct DetailView {
  HeightImage height;   ///< heights on the window's own range, titled with its position
  ShadedImage shaded;   ///< relief of the window (auto exaggeration of its own)
  std::string caption;  ///< where the window lies, why there, both pictures' scales
};

/// Renders the detail view of `window` (from choose_detail_window) at native resolution:
/// zoom = max(1, kDetailTargetPx / longest window side in cells).
/// @param[in] floor   the whole heightfield (um; NaN = not reached)
/// @param[in] window  a window inside it
/// @param[in] units   legend, title and caption units
DetailView render_detail_view(const Heightfield& floor, const DetailWindow& window,
                              LengthUnit units);

/// RGB copy of `image` with the detail window outlined two pixels wide just outside the window's
/// pixels (clipped at the picture's edge); the window's own pixels are left as they were.
/// @param[in] map_x_px, map_y_px  top-left pixel of the map in `image`
/// @param[in] map_height_px       map rows (the map's top row shows the highest Y)
/// @param[in] cells_per_pixel     k of the map (unzoomed)
Image outline_detail_window(const Image& image, int map_x_px, int map_y_px, int map_height_px,
                            int cells_per_pixel, const DetailWindow& window);

}  // namespace cuspmap

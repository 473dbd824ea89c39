// Detail view pictures (heights and relief of one window, cell by cell) and the window's outline
// on the overviews. Inputs: heightfield um, window cells; outputs: Images and a caption.
// Method: report/height_image and report/shaded_image without reduction; pixel replication.
#include "report/detail_view.h"

#include <algorithm>
#include <cstdint>

#include "core/display_quantity.h"

namespace cuspmap {

DetailView render_detail_view(const Heightfield& floor, const DetailWindow& w, LengthUnit units) {
  const Heightfield cells = crop_heightfield(floor, w);
  const int longest = std::max(w.nx, w.ny);
  const int zoom = std::max(1, kDetailTargetPx / longest);
  const std::string where = "x " + display_length(w.x0_mm, units) + " to " +
                            display_length(w.x0_mm + w.size_x_mm, units) + ", y " +
                            display_length(w.y0_mm, units) + " to " +
                            display_length(w.y0_mm + w.size_y_mm, units);
  DetailView view;
  HeightImageOptions hopt;
  hopt.units = units;
  hopt.zoom = zoom;
  hopt.max_pixels = longest;  // never reduced: one cell is zoom x zoom pixels
  hopt.title = "Detail, own range: " + where;
  view.height = render_height_image(cells, hopt);
  ShadedImageOptions sopt;
  sopt.zoom = zoom;
  sopt.max_pixels = longest;
  view.shaded = render_shaded_image(cells, sopt);
  view.caption = "Detail at native resolution (outlined in orange on the whole-floor pictures): " +
                 where + " from the patch origin, placed where the marks are deepest (Sq about " +
                 "the window's own plane " + display_roughness(w.sq_um, units) +
                 "). Heights on the window's own range. " +
                 height_image_caption(view.height, units) + " Relief: " +
                 shaded_image_caption(view.shaded);
  return view;
}

Image outline_detail_window(const Image& image, int map_x_px, int map_y_px, int map_height_px,
                            int cells_per_pixel, const DetailWindow& w) {
  // The picture in RGB (a gray level g as r = g = b, as blit does), built directly: make_image's
  // fill and blit's per-pixel conversion were ~50 M instructions on the 12 mm job's two maps.
  Image out;
  if (image.channels == 3) {
    out = image;
  } else {
    out.width = image.width;
    out.height = image.height;
    out.channels = 3;
    out.pixels.resize(image.pixels.size() * 3);
    std::uint8_t* rgb = out.pixels.data();
    for (const std::uint8_t g : image.pixels) {
      rgb[0] = g;
      rgb[1] = g;
      rgb[2] = g;
      rgb += 3;
    }
  }
  const int k = std::max(cells_per_pixel, 1);
  const int x0 = w.i0 / k, x1 = (w.i0 + w.nx + k - 1) / k;  // pixel columns [x0, x1)
  const int top = map_height_px - (w.j0 + w.ny + k - 1) / k;  // rows flip: top = highest Y
  const int bottom = map_height_px - w.j0 / k;                // one past the last row
  for (int ring = 1; ring <= 2; ++ring) {
    draw_rect(out, map_x_px + x0 - ring, map_y_px + top - ring, x1 - x0 + 2 * ring,
              bottom - top + 2 * ring, kDetailOutlineColor);
  }
  return out;
}

}  // namespace cuspmap

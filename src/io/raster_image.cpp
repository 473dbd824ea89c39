// Raster primitives on Image: fill, blit with gray/RGB conversion, clipped Bresenham lines.
// Inputs/outputs: pixel coordinates, x right, y down; colours 8-bit.
// Method: Liang & Barsky 1984 parametric clipping, then Bresenham 1965 integer stepping.
#include "io/raster_image.h"

#include "core/clip_segment.h"

#include <algorithm>
#include <cstring>
#include <cmath>
#include <cstdlib>
#include <stdexcept>

namespace cuspmap {
namespace {

// ITU-R BT.601 luma, in integer thousandths so gray inputs map to themselves exactly.
std::uint8_t luma(Color c) {
  return static_cast<std::uint8_t>((299 * c.r + 587 * c.g + 114 * c.b + 500) / 1000);
}

}  // namespace

Image make_image(int width, int height, int channels, Color background) {
  if (channels != 1 && channels != 3) {
    throw std::invalid_argument("make_image: channels must be 1 or 3");
  }
  if (width < 0 || height < 0) throw std::invalid_argument("make_image: negative size");
  Image image;
  image.width = width;
  image.height = height;
  image.channels = channels;
  image.pixels.resize(static_cast<std::size_t>(width) * height * channels);
  if (channels == 1) {
    std::fill(image.pixels.begin(), image.pixels.end(), luma(background));
  } else {
    for (std::size_t k = 0; k < image.pixels.size(); k += 3) {
      image.pixels[k] = background.r;
      image.pixels[k + 1] = background.g;
      image.pixels[k + 2] = background.b;
    }
  }
  return image;
}

Color pixel(const Image& image, int x, int y) {
  const std::uint8_t* p = &image.at(x, y);
  return image.channels == 1 ? gray(p[0]) : Color{p[0], p[1], p[2]};
}

void set_pixel(Image& image, int x, int y, Color color) {
  if (!image.contains(x, y)) return;
  std::uint8_t* p = &image.at(x, y);
  if (image.channels == 1) {
    p[0] = luma(color);
  } else {
    p[0] = color.r;
    p[1] = color.g;
    p[2] = color.b;
  }
}

void fill_rect(Image& image, int x, int y, int w, int h, Color color) {
  const int x0 = std::max(x, 0), y0 = std::max(y, 0);
  const int x1 = std::min(x + w, image.width), y1 = std::min(y + h, image.height);
  for (int yy = y0; yy < y1; ++yy) {
    for (int xx = x0; xx < x1; ++xx) set_pixel(image, xx, yy, color);
  }
}

void draw_rect(Image& image, int x, int y, int w, int h, Color color) {
  if (w <= 0 || h <= 0) return;
  fill_rect(image, x, y, w, 1, color);
  fill_rect(image, x, y + h - 1, w, 1, color);
  fill_rect(image, x, y, 1, h, color);
  fill_rect(image, x + w - 1, y, 1, h, color);
}

void blit(const Image& src, Image& dst, int x, int y) {
  const int sx0 = std::max(0, -x), sy0 = std::max(0, -y);
  const int sx1 = std::min(src.width, dst.width - x), sy1 = std::min(src.height, dst.height - y);
  if (src.channels == dst.channels && sx1 > sx0) {
    // Same layout: a row copy (a gray level's luma is the level itself, so nothing changes).
    const std::size_t bytes = static_cast<std::size_t>(sx1 - sx0) * src.channels;
    for (int sy = sy0; sy < sy1; ++sy) std::memcpy(&dst.at(x + sx0, y + sy), &src.at(sx0, sy), bytes);
    return;
  }
  for (int sy = sy0; sy < sy1; ++sy) {
    for (int sx = sx0; sx < sx1; ++sx) set_pixel(dst, x + sx, y + sy, pixel(src, sx, sy));
  }
}

void draw_line(Image& image, double x0, double y0, double x1, double y1, const LineStyle& style) {
  if (!std::isfinite(x0) || !std::isfinite(y0) || !std::isfinite(x1) || !std::isfinite(y1)) return;
  const int thickness = std::max(style.thickness_px, 1);
  // Clip to the image grown by the brush size, so a thick line just outside still shows its edge.
  const double pad = thickness;
  double t0 = 0.0, t1 = 1.0;
  if (!clip_segment(x0, y0, x1, y1, -pad, image.width - 1 + pad, -pad, image.height - 1 + pad, t0,
                    t1)) {
    return;
  }
  const double cx0 = x0 + t0 * (x1 - x0), cy0 = y0 + t0 * (y1 - y0);
  const double cx1 = x0 + t1 * (x1 - x0), cy1 = y0 + t1 * (y1 - y0);
  int ix = static_cast<int>(std::lround(cx0)), iy = static_cast<int>(std::lround(cy0));
  const int ex = static_cast<int>(std::lround(cx1)), ey = static_cast<int>(std::lround(cy1));
  // Dash phase counts pixels along the major axis from the unclipped start, so clipping does not
  // shift the dash pattern.
  int step = std::max(style.dash_phase_px, 0) +
             static_cast<int>(std::lround(std::max(std::abs(cx0 - x0), std::abs(cy0 - y0))));
  const int dx = std::abs(ex - ix), dy = -std::abs(ey - iy);
  const int sx = ix < ex ? 1 : -1, sy = iy < ey ? 1 : -1;
  const int lo = -(thickness - 1) / 2;  // brush offsets lo .. lo + thickness - 1
  int err = dx + dy;
  for (;;) {
    if (style.dash_px <= 0 || (step / style.dash_px) % 2 == 0) {
      for (int by = lo; by < lo + thickness; ++by) {
        for (int bx = lo; bx < lo + thickness; ++bx)
          set_pixel(image, ix + bx, iy + by, style.color);
      }
    }
    if (ix == ex && iy == ey) break;
    const int e2 = 2 * err;
    if (e2 >= dy) {
      err += dy;
      ix += sx;
    }
    if (e2 <= dx) {
      err += dx;
      iy += sy;
    }
    ++step;
  }
}

}  // namespace cuspmap

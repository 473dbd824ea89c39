// Heightfield -> grayscale height picture (+Y up, black = low, white = not reached) + legend.
// Inputs: heights in um on cells of cell_mm; outputs: gray Image, range used, um per level.
// Method: linear quantisation to 255 levels (0..254) after NaN-aware block reduction.
#include "report/height_image.h"

#include <algorithm>
#include <cmath>
#include <cstddef>
#include <limits>

#include "core/input_error.h"
#include "report/legend.h"
#include "report/nice_ticks.h"
#include "report/text_render.h"

#if defined(__SSE2__)
#include <emmintrin.h>
#endif

namespace cuspmap {
namespace {

constexpr int kFlatLevel = 127;  // a range of zero width: one mid gray, neither "low" nor "high"
constexpr int kMarginPx = 8;     // white margin around the framed map when a legend is drawn
constexpr int kMinLegendBarPx = 120;  // a ramp shorter than this cannot hold three labels

// The lowest and highest finite value of a rows x cols row-major grid (+inf / -inf when none),
// as the loop lo = std::min(lo, v), hi = std::max(hi, v) over the finite values in column-major
// order (Eigen's reshaped()) gives them: four SSE2 lanes (non-finite values masked to +-inf),
// then, where the answer is a zero, its sign from the first zero in that order (the loop keeps
// the first of equal values; only +0 and -0 are equal values with different bits).
void finite_range(const float* z, std::size_t rows, std::size_t cols, float& lo, float& hi) {
  const std::size_t n = rows * cols;
  constexpr float kInf = std::numeric_limits<float>::infinity();
  lo = kInf;
  hi = -kInf;
  std::size_t k = 0;
#if defined(__SSE2__)
  __m128 lo4 = _mm_set1_ps(kInf), hi4 = _mm_set1_ps(-kInf);
  const __m128i abs_bits = _mm_set1_epi32(0x7fffffff), inf_bits = _mm_set1_epi32(0x7f800000);
  for (; k + 4 <= n; k += 4) {
    const __m128 v = _mm_loadu_ps(z + k);
    const __m128 finite = _mm_castsi128_ps(
        _mm_cmplt_epi32(_mm_and_si128(_mm_castps_si128(v), abs_bits), inf_bits));
    // minps(a, b) = a < b ? a : b: the loop's "replace only when lower" (and maxps alike).
    lo4 = _mm_min_ps(_mm_or_ps(_mm_and_ps(finite, v), _mm_andnot_ps(finite, _mm_set1_ps(kInf))),
                     lo4);
    hi4 = _mm_max_ps(_mm_or_ps(_mm_and_ps(finite, v), _mm_andnot_ps(finite, _mm_set1_ps(-kInf))),
                     hi4);
  }
  alignas(16) float los[4], his[4];
  _mm_store_ps(los, lo4);
  _mm_store_ps(his, hi4);
  for (int u = 0; u < 4; ++u) {
    lo = std::min(lo, los[u]);
    hi = std::max(hi, his[u]);
  }
#endif
  for (; k < n; ++k) {
    if (!std::isfinite(z[k])) continue;
    lo = std::min(lo, z[k]);
    hi = std::max(hi, z[k]);
  }
  if (lo == 0.0f || hi == 0.0f) {
    // The first zero in column-major order: the lowest column, then the lowest row.
    std::size_t best_col = cols;
    float first_zero = 0.0f;
    for (std::size_t r = 0; r < rows; ++r) {
      for (std::size_t c = 0; c < best_col; ++c) {
        if (z[r * cols + c] == 0.0f) {
          best_col = c;
          first_zero = z[r * cols + c];
          break;
        }
      }
    }
    if (lo == 0.0f) lo = first_zero;
    if (hi == 0.0f) hi = first_zero;
  }
}

}  // namespace

int height_gray_level(double z_um, double lo_um, double hi_um) {
  if (std::isnan(z_um)) return kUnreachedLevel;
  if (!(hi_um > lo_um)) return kFlatLevel;
  const double t = (z_um - lo_um) / (hi_um - lo_um);
  return nearest_gray_level(t * kTopHeightLevel);
}

HeightImage render_height_image(const Heightfield& hf, const HeightImageOptions& options) {
  HeightImage out;
  if (options.range) {
    const HeightRange& r = *options.range;
    if (!std::isfinite(r.lo_um) || !std::isfinite(r.hi_um) || !(r.hi_um > r.lo_um)) {
      throw InputError("height range " + format_number(r.lo_um) + ".." + format_number(r.hi_um) +
                       " um: needs two finite heights with the high end above the low end");
    }
    out.lo_um = r.lo_um;
    out.hi_um = r.hi_um;
  } else {
    float lo = 0.0f, hi = 0.0f;
    finite_range(hf.z_um.data(), static_cast<std::size_t>(hf.z_um.rows()),
                 static_cast<std::size_t>(hf.z_um.cols()), lo, hi);
    out.lo_um = std::isfinite(lo) ? double{lo} : 0.0;
    out.hi_um = std::isfinite(hi) ? double{hi} : 0.0;
  }
  out.um_per_level = (out.hi_um - out.lo_um) / kTopHeightLevel;
  if (options.range) {
    for (float v : hf.z_um.reshaped()) {
      if (std::isfinite(v) && (v < out.lo_um || v > out.hi_um)) ++out.clamped_cells;
    }
  }

  out.cells_per_pixel = cells_per_pixel_for(hf.nx, hf.ny, options.max_pixels);
  out.zoom = out.cells_per_pixel == 1 ? std::max(options.zoom, 1) : 1;
  out.mm_per_px = out.cells_per_pixel * hf.cell_mm / out.zoom;
  const HeightGrid blocks = reduce_blocks(hf.z_um, out.cells_per_pixel, options.downsample);
  const int zoom = out.zoom;
  out.map_width_px = static_cast<int>(blocks.cols()) * zoom;
  out.map_height_px = static_cast<int>(blocks.rows()) * zoom;
  Image map = make_image(out.map_width_px, out.map_height_px, 1, kWhite);
  // One level per block, written to its zoom x zoom pixels: the first pixel row of a block row,
  // then copies of it.
  const int block_rows = static_cast<int>(blocks.rows()), block_cols = static_cast<int>(blocks.cols());
  for (int br = 0; br < block_rows; ++br) {
    const int block_row = block_rows - 1 - br;  // top = highest Y
    const int r0 = br * zoom;
    std::uint8_t* first = &map.at(0, r0);
    for (int bc = 0; bc < block_cols; ++bc) {
      const int level = height_gray_level(blocks(block_row, bc), out.lo_um, out.hi_um);
      if (level == kUnreachedLevel) ++out.unreached_pixels;  // counted per block
      const auto gray_level = static_cast<std::uint8_t>(level);
      if (zoom == 1) {
        first[bc] = gray_level;  // no fill_n: it was a memset call per pixel
      } else {
        std::fill_n(first + static_cast<std::ptrdiff_t>(bc) * zoom, zoom, gray_level);
      }
    }
    for (int r = r0 + 1; r < r0 + zoom; ++r) {
      std::copy_n(first, out.map_width_px, &map.at(0, r));
    }
  }
  if (!options.legend) {
    out.image = std::move(map);
    return out;
  }

  HeightLegendSpec spec;
  spec.lo_um = out.lo_um;
  spec.hi_um = out.hi_um;
  spec.units = options.units;
  spec.text_scale = options.text_scale;
  spec.show_unreached = true;  // always explain white, so nobody reads it as a high spot
  spec.bar_height_px = std::max(out.map_height_px, kMinLegendBarPx);
  const Image legend = render_height_legend(spec);
  // The map sits in a black frame one pixel outside it, so the white margin is never mistaken for
  // unreached cells; the legend's ramp top lines up with the map's top row.
  out.map_x_px = kMarginPx;
  const int title_h = options.title.empty()
                          ? 0
                          : measure_text(options.title, options.text_scale).height_px + kMarginPx;
  out.map_y_px = title_h + std::max(kMarginPx, legend_ramp_top_px(spec));
  const int legend_x = out.map_x_px + out.map_width_px + kMarginPx;
  const int legend_y = out.map_y_px - legend_ramp_top_px(spec);
  const int width =
      std::max(legend_x + legend.width,
               kMarginPx + measure_text(options.title, options.text_scale).width_px + kMarginPx);
  const int height =
      std::max(out.map_y_px + out.map_height_px + kMarginPx, legend_y + legend.height);
  out.image = make_image(width, height, 1, kWhite);
  draw_rect(out.image, out.map_x_px - 1, out.map_y_px - 1, out.map_width_px + 2,
            out.map_height_px + 2, kBlack);
  blit(map, out.image, out.map_x_px, out.map_y_px);
  blit(legend, out.image, legend_x, legend_y);
  if (!options.title.empty()) {
    draw_text(out.image, kMarginPx, kMarginPx, options.title, {options.text_scale, kBlack});
  }
  return out;
}

std::string height_image_caption(const HeightImage& image, LengthUnit units) {
  const std::string u = height_unit_label(units);
  const double lo = height_in_display_unit(image.lo_um, units);
  const double hi = height_in_display_unit(image.hi_um, units);
  const double step = height_in_display_unit(image.um_per_level, units);
  // Decimals of a 1-2-5 step near 1/25 of the range (~10 gray levels): ends read to that step.
  const int decimals = decimals_for_step(nice_step(std::max(hi - lo, 1e-12), kTopHeightLevel / 10));
  const double px = units == LengthUnit::Inch ? image.mm_per_px / kMmPerInch : image.mm_per_px;
  const std::string k = std::to_string(image.cells_per_pixel);
  // Built by appending: GCC 12 misreports chained std::string operator+ (-Wrestrict, PR 105651).
  std::string text = "Height seen from above, +Y up: black = ";
  text.append(format_fixed(lo, decimals)).append(" ").append(u);
  text.append(", light gray = ").append(format_fixed(hi, decimals)).append(" ").append(u);
  text.append(" (").append(format_significant(step, 3)).append(" ").append(u);
  const char* length_unit = units == LengthUnit::Inch ? " in" : " mm";
  if (image.zoom > 1) {
    const std::string m = std::to_string(image.zoom);
    text.append(" per gray level); white = not reached; 1 cell (")
        .append(format_number(px * image.zoom))
        .append(length_unit);
    text.append(") = ").append(m).append(" x ").append(m).append(" pixels.");
    return text;
  }
  text.append(" per gray level); white = not reached; 1 pixel = ")
      .append(k)
      .append(" x ")
      .append(k);
  text.append(" cells (").append(format_significant(px, 3));
  text.append(length_unit).append(").");
  return text;
}

}  // namespace cuspmap

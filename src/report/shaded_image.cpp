// Lambert-shaded relief of a heightfield with automatic vertical exaggeration.
// Inputs: heights um on cells of cell_mm, light azimuth/elevation deg; output: gray Image.
// Method: Lambert 1760 cosine law; central-difference normals; nearest-rank percentile.
#include "report/shaded_image.h"

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <numbers>
#include <vector>

#include "core/input_error.h"
#include "core/large_buffer.h"
#include "core/parallel_blocks.h"
#include "core/units.h"
#include "core/widen_floats.h"
#include "report/legend.h"
#include "report/nice_ticks.h"
#include "report/finite_row.h"
#include "report/reduce_blocks.h"

#if defined(__SSE2__)
#include <emmintrin.h>
#endif

namespace cuspmap {
namespace {

// Slopes sampled for the percentile: 2^18 values pin the 95th percentile's rank to
// sqrt(0.95 x 0.05 / 2^18) = 0.04 % of the distribution (the binomial standard error of a
// sample quantile's rank, derived) while bounding the work: at 2^20 every cell of a 1.44 M-cell
// floor was sampled, ~10 % of the whole `simulate` (docs/performance.md, "Fourth pass").
constexpr std::int64_t kMaxSlopeSamples = std::int64_t{1} << 18;
// Rows per work item of the brightness pass.
constexpr int kShadeRowsPerTask = 32;

double radians(double deg) { return deg * std::numbers::pi / 180.0; }

// d z / d(index) at (j, i) along one axis, um per cell: central where both neighbours are
// reached, one-sided at edges and next to unreached cells, 0 when isolated.
double diff_um_per_cell(const HeightGrid& z, int j, int i, int dj, int di) {
  const int ny = static_cast<int>(z.rows()), nx = static_cast<int>(z.cols());
  const float c = z(j, i);
  const int jm = j - dj, im = i - di, jp = j + dj, ip = i + di;
  const bool has_m = jm >= 0 && im >= 0 && std::isfinite(z(jm, im));
  const bool has_p = jp < ny && ip < nx && std::isfinite(z(jp, ip));
  if (has_m && has_p) return 0.5 * (double{z(jp, ip)} - z(jm, im));
  if (has_p) return double{z(jp, ip)} - c;
  if (has_m) return double{c} - z(jm, im);
  return 0.0;
}

#if defined(__SSE2__)
// Two cells' brightness in double lanes: the operations of the scalar form below, one by one
// (each IEEE-rounded the same way: the same floats).
__m128 brightness_pair(__m128d left, __m128d right, __m128d down, __m128d up, double per_cell,
                       double ex, const LightVector& l) {
  const __m128d half = _mm_set1_pd(0.5), scale = _mm_set1_pd(per_cell), exv = _mm_set1_pd(ex);
  // Slopes rounded to float, as slope_at keeps them.
  const __m128 sx = _mm_cvtpd_ps(_mm_mul_pd(_mm_mul_pd(half, _mm_sub_pd(right, left)), scale));
  const __m128 sy = _mm_cvtpd_ps(_mm_mul_pd(_mm_mul_pd(half, _mm_sub_pd(up, down)), scale));
  const __m128d gx = _mm_mul_pd(exv, _mm_cvtps_pd(sx)), gy = _mm_mul_pd(exv, _mm_cvtps_pd(sy));
  const __m128d neg_gx = _mm_xor_pd(gx, _mm_set1_pd(-0.0));
  const __m128d num = _mm_add_pd(
      _mm_sub_pd(_mm_mul_pd(neg_gx, _mm_set1_pd(l.x)), _mm_mul_pd(gy, _mm_set1_pd(l.y))),
      _mm_set1_pd(l.z));
  const __m128d den = _mm_sqrt_pd(
      _mm_add_pd(_mm_add_pd(_mm_set1_pd(1.0), _mm_mul_pd(gx, gx)), _mm_mul_pd(gy, gy)));
  // std::max(0.0, dot) = dot > 0 ? dot : 0 (and +0 for -0), as maxpd(dot, 0) gives.
  return _mm_cvtpd_ps(_mm_max_pd(_mm_div_pd(num, den), _mm_setzero_pd()));
}
#endif

// Brightness of cells 1 .. nx - 2 of a row whose own row and both neighbours are all reached:
// central differences (slope_at's arithmetic without its tests), then lambert_brightness.
void interior_brightness(const float* zm, const float* z, const float* zp, int nx,
                         double per_cell_to_slope, double ex, const LightVector& light, float* b) {
  int i = 1;
#if defined(__SSE2__)
  const auto two = [](const float* p) { return widen_two_floats(p); };
  for (; i + 2 < nx; i += 2) {
    const __m128 v = brightness_pair(two(z + i - 1), two(z + i + 1), two(zm + i), two(zp + i),
                                     per_cell_to_slope, ex, light);
    _mm_storel_epi64(reinterpret_cast<__m128i*>(b + i), _mm_castps_si128(v));
  }
#endif
  for (; i + 1 < nx; ++i) {
    const auto sx = static_cast<float>(0.5 * (double{z[i + 1]} - z[i - 1]) * per_cell_to_slope);
    const auto sy = static_cast<float>(0.5 * (double{zp[i]} - zm[i]) * per_cell_to_slope);
    b[i] = static_cast<float>(lambert_brightness(ex * sx, ex * sy, light));
  }
}

}  // namespace

LightVector light_vector(double light_azimuth_deg, double light_elevation_deg) {
  const double az = radians(light_azimuth_deg), el = radians(light_elevation_deg);
  return {std::cos(el) * std::cos(az), std::cos(el) * std::sin(az), std::sin(el)};
}

double lambert_brightness(double gx, double gy, const LightVector& l) {
  const double dot = (-gx * l.x - gy * l.y + l.z) / std::sqrt(1.0 + gx * gx + gy * gy);
  return std::max(0.0, dot);
}

double lambert_brightness(double gx, double gy, double light_azimuth_deg,
                          double light_elevation_deg) {
  return lambert_brightness(gx, gy, light_vector(light_azimuth_deg, light_elevation_deg));
}

ShadedImage render_shaded_image(const Heightfield& hf, const ShadedImageOptions& options) {
  if (!(options.light_elevation_deg > 0.0 && options.light_elevation_deg <= 90.0)) {
    throw InputError("light elevation " + format_number(options.light_elevation_deg) +
                     " deg: must be in (0, 90] deg");
  }
  if (options.exaggeration &&
      !(*options.exaggeration > 0.0 && std::isfinite(*options.exaggeration))) {
    throw InputError("exaggeration " + format_number(*options.exaggeration) +
                     ": must be a finite number > 0");
  }
  ShadedImage out;
  out.light_azimuth_deg = options.light_azimuth_deg;
  out.light_elevation_deg = options.light_elevation_deg;
  const int ny = hf.ny, nx = hf.nx;
  // um per cell -> dimensionless slope: divide by the cell size in um.
  const double per_cell_to_slope = 1.0 / (hf.cell_mm * kUmPerMm);
  // Slopes (dimensionless) at cell (j, i) as floats; false where the cell is unreached.
  auto slope_at = [&](int j, int i, float& sx, float& sy) {
    if (!std::isfinite(hf.z_um(j, i))) return false;
    sx = static_cast<float>(diff_um_per_cell(hf.z_um, j, i, 0, 1) * per_cell_to_slope);
    sy = static_cast<float>(diff_um_per_cell(hf.z_um, j, i, 1, 0) * per_cell_to_slope);
    return true;
  };

  // Rows whose cells are all reached: between two more such rows, every interior cell takes the
  // central differences without a test per neighbour (the same arithmetic as slope_at).
  std::vector<std::uint8_t> row_full(static_cast<std::size_t>(ny));
  for (int j = 0; j < ny; ++j) {
    row_full[static_cast<std::size_t>(j)] = row_all_finite(&hf.z_um(j, 0), nx) ? 1 : 0;
  }
  // Whether (j, i) and its four neighbours are reached (central differences on both axes).
  const auto interior = [&](int j, int i) {
    return j > 0 && j + 1 < ny && i > 0 && i + 1 < nx && row_full[static_cast<std::size_t>(j)] &&
           row_full[static_cast<std::size_t>(j - 1)] && row_full[static_cast<std::size_t>(j + 1)];
  };

  // 95th percentile of |grad z| (nearest rank) over an evenly strided sample of reached cells;
  // slopes are computed where sampled and again in the brightness pass (no slope grids).
  const std::int64_t cells = static_cast<std::int64_t>(nx) * ny;
  const std::int64_t stride = std::max<std::int64_t>(1, cells / kMaxSlopeSamples);
  std::vector<float> slopes;
  slopes.reserve(static_cast<std::size_t>(std::min(cells, kMaxSlopeSamples + 1)));
  for (std::int64_t k = 0; k < cells; k += stride) {
    float sx = 0.0f, sy = 0.0f;
    const int j = static_cast<int>(k / nx), i = static_cast<int>(k % nx);
    if (interior(j, i)) {
      // slope_at's central differences without its tests (the same floats).
      sx = static_cast<float>(0.5 * (double{hf.z_um(j, i + 1)} - hf.z_um(j, i - 1)) *
                              per_cell_to_slope);
      sy = static_cast<float>(0.5 * (double{hf.z_um(j + 1, i)} - hf.z_um(j - 1, i)) *
                              per_cell_to_slope);
      slopes.push_back(std::sqrt(sx * sx + sy * sy));
    } else if (slope_at(j, i, sx, sy)) {
      slopes.push_back(std::sqrt(sx * sx + sy * sy));  // slopes: no overflow for hypot to guard
    }
  }
  if (!slopes.empty()) {
    const auto rank = static_cast<std::size_t>(
        std::ceil(kAutoSlopePercentile * static_cast<double>(slopes.size())) - 1);
    std::nth_element(slopes.begin(), slopes.begin() + rank, slopes.end());
    out.slope_p95 = slopes[rank];
  }
  if (options.exaggeration) {
    out.exaggeration = *options.exaggeration;
  } else if (out.slope_p95 > 0.0) {
    out.exaggeration = std::tan(radians(kAutoSlopeDeg)) / out.slope_p95;
  }

  const LightVector light = light_vector(options.light_azimuth_deg, options.light_elevation_deg);
  HeightGrid brightness(ny, nx);
  advise_huge_pages(brightness.data(), static_cast<std::size_t>(brightness.size()) * sizeof(float));
  const double ex = out.exaggeration;
  parallel_blocks((ny + kShadeRowsPerTask - 1) / kShadeRowsPerTask, 0, [&](int t) {
    for (int j = t * kShadeRowsPerTask; j < std::min(ny, (t + 1) * kShadeRowsPerTask); ++j) {
      float* b = &brightness(j, 0);
      const auto general = [&](int i) {
        float sx = 0.0f, sy = 0.0f;
        b[i] = slope_at(j, i, sx, sy)
                   ? static_cast<float>(lambert_brightness(ex * sx, ex * sy, light))
                   : kUnreached;
      };
      const bool fast = j > 0 && j + 1 < ny && nx > 2 && row_full[static_cast<std::size_t>(j)] &&
                        row_full[static_cast<std::size_t>(j - 1)] &&
                        row_full[static_cast<std::size_t>(j + 1)];
      if (!fast) {
        for (int i = 0; i < nx; ++i) general(i);
        continue;
      }
      const float *zm = &hf.z_um(j - 1, 0), *z = &hf.z_um(j, 0), *zp = &hf.z_um(j + 1, 0);
      general(0);
      interior_brightness(zm, z, zp, nx, per_cell_to_slope, ex, light, b);
      general(nx - 1);
    }
  });
  out.cells_per_pixel = options.cells_per_pixel > 0
                            ? options.cells_per_pixel
                            : cells_per_pixel_for(nx, ny, options.max_pixels);
  out.zoom = out.cells_per_pixel == 1 ? std::max(options.zoom, 1) : 1;
  out.mm_per_px = out.cells_per_pixel * hf.cell_mm / out.zoom;
  const HeightGrid blocks = reduce_blocks(brightness, out.cells_per_pixel, BlockReduce::AntiAlias);
  const int zoom = out.zoom;
  const int bh = static_cast<int>(blocks.rows());
  const int w = static_cast<int>(blocks.cols()) * zoom, h = bh * zoom;
  out.image = make_image(w, h, 1, kWhite);
  for (int r = 0; r < h; ++r) {
    for (int c = 0; c < w; ++c) {
      const float b = blocks(bh - 1 - r / zoom, c / zoom);  // image top = highest Y
      out.image.at(c, r) = static_cast<std::uint8_t>(
          std::isfinite(b) ? nearest_gray_level(kTopHeightLevel * std::clamp(b, 0.0f, 1.0f))
                           : kUnreachedLevel);
    }
  }
  return out;
}

std::string shaded_image_caption(const ShadedImage& image) {
  return "Shaded relief seen from above, +Y up: light from azimuth " +
         format_significant(image.light_azimuth_deg, 3) + " deg (counter-clockwise from +X) at " +
         format_significant(image.light_elevation_deg, 3) +
         " deg elevation; heights exaggerated x " + format_significant(image.exaggeration, 3) +
         "; white = not reached.";
}

}  // namespace cuspmap

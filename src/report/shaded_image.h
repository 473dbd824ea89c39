// shaded.png: Lambert-lit relief of a heightfield seen from above (+Y up), vertically exaggerated
// so marks a fraction of a um deep show as a shop light shows them; gray = round(254 n.l), 255 =
// not reached. Cost: O(cells) + a percentile over <= 2^20 sampled slopes.
// Method: Lambert, Photometria, 1760 (cosine law); Foley, van Dam et al., Computer Graphics, 16.1.
#pragma once

#include <optional>
#include <string>

#include "core/heightfield.h"
#include "io/raster_image.h"

namespace cuspmap {

/// How shaded.png is lit and sized.
struct ShadedImageOptions {
  /// Direction the light comes FROM, in the XY plane, degrees counter-clockwise from +X.
  /// 135 = from the upper left of the picture, the usual relief-map convention (a light from
  /// below makes valleys read as ridges to most eyes).
  double light_azimuth_deg = 135.0;
  double light_elevation_deg = 45.0;   ///< angle of the light above the floor, (0, 90]
  std::optional<double> exaggeration;  ///< vertical exaggeration (> 0); empty = auto
  int max_pixels = 1024;               ///< longest side of the picture; larger grids are reduced
  int cells_per_pixel = 0;             ///< > 0 forces k (shared scale across pictures); 0 = auto
  int zoom = 1;  ///< > 1 draws each cell as zoom x zoom pixels when k = 1 (detail views)
};

/// The picture and the numbers the report states about it.
struct ShadedImage {
  Image image;                       ///< gray, ceil(nx / k) x ceil(ny / k), no margins
  double exaggeration = 1.0;         ///< vertical exaggeration used
  double light_azimuth_deg = 0.0;    ///< as used (from options)
  double light_elevation_deg = 0.0;  ///< as used (from options)
  double slope_p95 = 0.0;            ///< 95th percentile of the true |grad z| (dimensionless)
  int cells_per_pixel = 1;           ///< k: each pixel averages the shading of k x k cells
  int zoom = 1;                      ///< each cell drawn as zoom x zoom pixels (k = 1 then)
  double mm_per_px = 0.0;            ///< k x cell size / zoom
};

/// Auto exaggeration aims the 95th-percentile slope at this angle: with the default 45 deg light
/// a 30 deg facet spans brightness cos 75 .. cos 15 (0.26 .. 0.97), strong contrast without
/// clipping to black or white. Common practice, no source (a readable-relief choice).
inline constexpr double kAutoSlopeDeg = 30.0;
/// Percentile of the slope distribution used for auto exaggeration (robust against a few spikes
/// at the patch edge or at a plunge).
inline constexpr double kAutoSlopePercentile = 0.95;

/// Unit vector toward a distant light (x, y, z; +Z up).
struct LightVector {
  double x = 0.0;  ///< cos el cos az
  double y = 0.0;  ///< cos el sin az
  double z = 1.0;  ///< sin el
};

/// The light vector for an azimuth (deg, counter-clockwise from +X) and elevation (deg).
LightVector light_vector(double light_azimuth_deg, double light_elevation_deg);

/// lambert_brightness below with the light vector computed once (per image, not per cell).
double lambert_brightness(double gx, double gy, const LightVector& light);

/// Lambert brightness of a surface with gradient (gx, gy) (dimensionless dz/dx, dz/dy, +Y up)
/// under a distant light: max(0, n . l), n = (-gx, -gy, 1) / |.|,
/// l = (cos el cos az, cos el sin az, sin el). A flat floor gives sin(el).
double lambert_brightness(double gx, double gy, double light_azimuth_deg,
                          double light_elevation_deg);

/// Renders shaded.png. Shading is computed per cell at full resolution (gradients in um/mm
/// divided by 1000 to be dimensionless, times the exaggeration), then reduced with the
/// anti-aliased area mean (report/reduce_blocks), as a camera pixel integrates light, so marks
/// finer than a pixel average to an even gray instead of moire. Image row 0 = highest Y.
/// @param[in] hf  heightfield (um; NaN = not reached -> white); nx, ny >= 1, cell_mm > 0
/// @return picture (ceil(nx / k) zoom x ceil(ny / k) zoom), exaggeration used (auto: tan(30 deg) / slope_p95; 1 when the floor is flat)
/// @throws InputError when the elevation is outside (0, 90] deg or a given exaggeration <= 0
ShadedImage render_shaded_image(const Heightfield& hf, const ShadedImageOptions& options);

/// One-line caption for reports, e.g. "Shaded relief seen from above, +Y up: light from
/// azimuth 135 deg (counter-clockwise from +X) at 45 deg elevation; heights exaggerated x 276;
/// white = not reached."
std::string shaded_image_caption(const ShadedImage& image);

}  // namespace cuspmap

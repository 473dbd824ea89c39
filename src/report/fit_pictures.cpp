// The fit window as three pictures on one height scale (measured, simulated, residual).
// Inputs: FloorFit; output: Image. Cost O(window cells).
// Method: report/height_image gray mapping with one shared range; report/montage layout.
#include "report/fit_pictures.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <string>
#include <vector>

#include "core/display_quantity.h"
#include "report/height_image.h"
#include "report/legend.h"
#include "report/montage.h"

namespace cuspmap {
namespace {

// Longest side of each picture, px (three side by side stay under ~1000 px).
constexpr int kTilePixels = 320;

void extend(const Heightfield& hf, double& lo, double& hi) {
  for (int j = 0; j < hf.ny; ++j) {
    for (int i = 0; i < hf.nx; ++i) {
      const double z = hf.z_um(j, i);
      if (!std::isfinite(z)) continue;
      lo = std::min(lo, z);
      hi = std::max(hi, z);
    }
  }
}

MontageTile tile(const Heightfield& hf, const HeightRange& range, LengthUnit units,
                 std::vector<std::string> labels) {
  HeightImageOptions o;
  o.range = range;
  o.units = units;
  o.legend = false;
  o.max_pixels = kTilePixels;
  // Small windows are drawn a whole number of pixels per sample so the labels fit under them.
  o.zoom = std::max(1, kTilePixels / std::max(1, std::max(hf.nx, hf.ny)));
  const HeightImage img = render_height_image(hf, o);
  labels.push_back(display_number(height_in_display_unit(range.lo_um, units), 1e-6) + ".." +
                   display_number(height_in_display_unit(range.hi_um, units), 1e-6) + " " +
                   height_unit_label(units));
  return MontageTile{img.image, img.mm_per_px, labels};
}

}  // namespace

Image render_fit_pictures(const FloorFit& fit, LengthUnit units) {
  double lo = std::numeric_limits<double>::infinity(), hi = -lo;
  extend(fit.measured, lo, hi);
  extend(fit.simulated, lo, hi);
  if (!(hi > lo)) {
    lo = -1.0;
    hi = 1.0;
  }
  const HeightRange shared{lo, hi};
  // The residual on the same um per gray level, centred on zero.
  const HeightRange centred{-0.5 * (hi - lo), 0.5 * (hi - lo)};
  std::vector<MontageTile> tiles;
  tiles.push_back(tile(fit.measured, shared, units, {"measured, plane off"}));
  tiles.push_back(tile(fit.simulated, shared, units, {"best-fit simulated"}));
  tiles.push_back(tile(fit.residual, centred, units,
                       {"residual, rms " +
                        display_number(height_in_display_unit(fit.residual_rms_um, units), 1e-6) +
                        " " + height_unit_label(units)}));
  MontageOptions mo;
  mo.columns = 3;
  mo.units = units;
  mo.title = "diagnose fit: measured, simulated, residual on one height scale";
  return render_montage(tiles, mo);
}

}  // namespace cuspmap

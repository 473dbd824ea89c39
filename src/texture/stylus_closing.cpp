// Morphological closing of a profile by a disk: dilation then erosion with the tip's lower
// half-circle b(u) = sqrt(r^2 - u^2) - r sampled at the profile's own spacing.
// Inputs: heights um, spacing mm, tip radius um; output: closed heights um. Cost O(n r / dx).
// Method: ISO 16610-41:2015 (closing = erosion of the dilation, disk element).
#include "texture/stylus_closing.h"

#include <algorithm>
#include <cassert>
#include <cmath>
#include <limits>

#include "core/units.h"

namespace cuspmap {

std::vector<double> stylus_closing(std::span<const double> z_um, double spacing_mm, double tip_um) {
  assert(spacing_mm > 0.0 && tip_um >= 0.0 && "closing needs a spacing > 0 and a tip >= 0");
  const long n = static_cast<long>(z_um.size());
  std::vector<double> out(z_um.begin(), z_um.end());
  const double step_um = spacing_mm * kUmPerMm;
  const long half = static_cast<long>(std::floor(tip_um / step_um));
  if (n == 0 || half < 1) return out;  // the tip spans no neighbour: nothing to bridge
  // b[k] <= 0: how far the tip's lower circle rises above its lowest point at offset k samples.
  std::vector<double> b(static_cast<size_t>(half) + 1);
  for (long k = 0; k <= half; ++k) {
    const double u = static_cast<double>(k) * step_um;
    b[static_cast<size_t>(k)] = std::sqrt(std::max(0.0, tip_um * tip_um - u * u)) - tip_um;
  }
  // Dilation: the lowest point of a tip centred over sample i, resting on the profile.
  std::vector<double> rest(static_cast<size_t>(n), -std::numeric_limits<double>::infinity());
  for (long i = 0; i < n; ++i) {
    double& r = rest[static_cast<size_t>(i)];
    for (long k = -half; k <= half; ++k) {
      const long s = i + k;
      if (s < 0 || s >= n) continue;
      r = std::max(r, z_um[static_cast<size_t>(s)] + b[static_cast<size_t>(std::abs(k))]);
    }
  }
  // Erosion: the lower envelope of the resting tips.
  for (long i = 0; i < n; ++i) {
    double low = std::numeric_limits<double>::infinity();
    for (long k = -half; k <= half; ++k) {
      const long s = i + k;
      if (s < 0 || s >= n) continue;
      low = std::min(low, rest[static_cast<size_t>(s)] - b[static_cast<size_t>(std::abs(k))]);
    }
    out[static_cast<size_t>(i)] = low;
  }
  return out;
}

}  // namespace cuspmap

// Linear trend of a periodic trace (see periodic_trend.h).
// Inputs: trace, period, bins; output: slope um/mm. Cost O(samples).
// Method: pooled within-group regression slope (analysis of covariance).
#include "infer/periodic_trend.h"

#include <algorithm>
#include <cmath>
#include <vector>

#include "texture/remove_least_squares_line.h"

namespace cuspmap {

bool periodic_trend_slope(const ProfileTrace& t, double period_mm, int bins,
                          double& slope_um_per_mm) {
  if (bins < 1 || period_mm <= 0.0) return false;
  const double bin_mm = period_mm / bins;
  std::vector<double> n(bins, 0.0), sx(bins, 0.0), sz(bins, 0.0), sxx(bins, 0.0), sxz(bins, 0.0);
  for (size_t i = 0; i < t.z_um.size(); ++i) {
    // Positions from the first sample keep the sums well conditioned.
    const double x = static_cast<double>(i) * t.spacing_mm;
    double phase = std::fmod(t.start_mm + x, period_mm);
    if (phase < 0.0) phase += period_mm;
    const int b = std::min(bins - 1, static_cast<int>(phase / bin_mm));
    n[b] += 1.0, sx[b] += x, sz[b] += t.z_um[i], sxx[b] += x * x, sxz[b] += x * t.z_um[i];
  }
  double num = 0.0, den = 0.0;
  for (int b = 0; b < bins; ++b) {
    if (n[b] < 2.0) continue;
    num += sxz[b] - sx[b] * sz[b] / n[b];
    den += sxx[b] - sx[b] * sx[b] / n[b];
  }
  if (!(den > 0.0)) return false;
  slope_um_per_mm = num / den;
  return true;
}

void remove_trend(ProfileTrace& t, double slope_um_per_mm) {
  if (t.z_um.empty()) return;
  double mean = 0.0;
  for (size_t i = 0; i < t.z_um.size(); ++i) {
    t.z_um[i] -= slope_um_per_mm * static_cast<double>(i) * t.spacing_mm;
    mean += t.z_um[i];
  }
  mean /= static_cast<double>(t.z_um.size());
  for (double& z : t.z_um) z -= mean;
}

void remove_periodic_trend(ProfileTrace& t, double period_mm, int bins) {
  double slope = 0.0;
  if (!periodic_trend_slope(t, period_mm, bins, slope)) {
    remove_least_squares_line(t.z_um);
    return;
  }
  remove_trend(t, slope);
}

}  // namespace cuspmap

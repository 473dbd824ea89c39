// Gaussian profile filter (ISO 16610-21) by direct convolution with a sampled, truncated kernel;
// the kernel is renormalised over the samples that exist near the profile's ends.
// Inputs: heights um, spacing mm, cut-off mm; output: mean line um. Cost O(n * lc / spacing).
// Method: ISO 16610-21:2011 §4.2 weighting function; discrete weights sampled at the grid points.
#include "texture/gaussian_profile_filter.h"

#include <algorithm>
#include <cassert>
#include <cmath>
#include <numbers>

namespace cuspmap {

double gaussian_weight(double x_mm, double cutoff_mm) {
  const double w = kGaussianAlpha * cutoff_mm;
  const double u = x_mm / w;
  return std::exp(-std::numbers::pi * u * u) / w;
}

double gaussian_transmission(double wavelength_mm, double cutoff_mm) {
  const double u = kGaussianAlpha * cutoff_mm / wavelength_mm;
  return std::exp(-std::numbers::pi * u * u);
}

std::vector<double> gaussian_profile_filter(std::span<const double> z_um, double spacing_mm,
                                            double cutoff_mm) {
  assert(spacing_mm > 0.0 && cutoff_mm > 0.0 && "filter needs positive spacing and cut-off");
  const std::ptrdiff_t n = static_cast<std::ptrdiff_t>(z_um.size());
  const std::ptrdiff_t half =
      static_cast<std::ptrdiff_t>(std::lround(kGaussianTruncationCutoffs * cutoff_mm / spacing_mm));
  std::vector<double> out(z_um.begin(), z_um.end());
  if (half < 1 || n == 0) return out;
  std::vector<double> kernel(static_cast<size_t>(half) + 1);
  for (std::ptrdiff_t k = 0; k <= half; ++k) {
    kernel[static_cast<size_t>(k)] =
        gaussian_weight(static_cast<double>(k) * spacing_mm, cutoff_mm);
  }
  // Sum of the whole kernel: interior points divide by it, end points by the part that exists.
  double full = kernel[0];
  for (std::ptrdiff_t k = 1; k <= half; ++k) full += 2.0 * kernel[static_cast<size_t>(k)];
  const double* z = z_um.data();
  const double* kw = kernel.data();
  for (std::ptrdiff_t i = 0; i < n; ++i) {
    // Four interior points at once: independent sums, each over the same terms in the same
    // order as alone (the same results; the four chains of additions overlap instead of each
    // waiting on its previous addition).
    while (i - half >= 0 && i + 3 + half < n) {
      double a0 = kw[0] * z[i], a1 = kw[0] * z[i + 1], a2 = kw[0] * z[i + 2], a3 = kw[0] * z[i + 3];
      for (std::ptrdiff_t k = 1; k <= half; ++k) {
        a0 += kw[k] * (z[i - k] + z[i + k]);
        a1 += kw[k] * (z[i + 1 - k] + z[i + 1 + k]);
        a2 += kw[k] * (z[i + 2 - k] + z[i + 2 + k]);
        a3 += kw[k] * (z[i + 3 - k] + z[i + 3 + k]);
      }
      out[static_cast<size_t>(i)] = a0 / full;
      out[static_cast<size_t>(i + 1)] = a1 / full;
      out[static_cast<size_t>(i + 2)] = a2 / full;
      out[static_cast<size_t>(i + 3)] = a3 / full;
      i += 4;
    }
    if (i >= n) break;
    const std::ptrdiff_t lo = std::max<std::ptrdiff_t>(0, i - half);
    const std::ptrdiff_t hi = std::min<std::ptrdiff_t>(n - 1, i + half);
    double acc = kernel[0] * z[i];
    double wsum = kernel[0];
    const bool interior = (i - half >= 0) && (i + half < n);
    if (interior) {
      for (std::ptrdiff_t k = 1; k <= half; ++k)
        acc += kernel[static_cast<size_t>(k)] * (z[i - k] + z[i + k]);
      wsum = full;
    } else {
      for (std::ptrdiff_t j = lo; j <= hi; ++j) {
        if (j == i) continue;
        const double w = kernel[static_cast<size_t>(j > i ? j - i : i - j)];
        acc += w * z[j];
        wsum += w;
      }
    }
    out[static_cast<size_t>(i)] = acc / wsum;
  }
  return out;
}

}  // namespace cuspmap

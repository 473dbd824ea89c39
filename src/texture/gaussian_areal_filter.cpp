// Separable, NaN-aware areal Gaussian filter.
// Inputs: heightfield, nesting index; output: filtered heightfield. Cost O(cells * taps).
// Method: ISO 16610-61:2015 Gaussian areal filter; normalised convolution of z*m and m.
#include "texture/gaussian_areal_filter.h"

#include <algorithm>
#include <cmath>
#include <cstdlib>
#include <vector>

#include "texture/gaussian_profile_filter.h"

namespace cuspmap {
namespace {

// One pass along rows (stride 1) or columns (stride nx): out = conv(in) with the sampled kernel.
void convolve(const std::vector<double>& in, std::vector<double>& out, int n_lines, int n_along,
              int stride_line, int stride_along, const std::vector<double>& kernel) {
  const int half = static_cast<int>(kernel.size()) - 1;
  for (int l = 0; l < n_lines; ++l) {
    const size_t base = static_cast<size_t>(l) * stride_line;
    for (int a = 0; a < n_along; ++a) {
      double acc = 0.0;
      const int lo = std::max(0, a - half), hi = std::min(n_along - 1, a + half);
      for (int b = lo; b <= hi; ++b) {
        acc += kernel[static_cast<size_t>(std::abs(b - a))] *
               in[base + static_cast<size_t>(b) * stride_along];
      }
      out[base + static_cast<size_t>(a) * stride_along] = acc;
    }
  }
}

}  // namespace

Heightfield gaussian_areal_filter(const Heightfield& hf, double nesting_index_mm) {
  Heightfield out = hf;
  const int half =
      static_cast<int>(std::lround(kGaussianTruncationCutoffs * nesting_index_mm / hf.cell_mm));
  if (half < 1) return out;
  std::vector<double> kernel(static_cast<size_t>(half) + 1);
  for (int k = 0; k <= half; ++k)
    kernel[static_cast<size_t>(k)] = gaussian_weight(k * hf.cell_mm, nesting_index_mm);
  const size_t n = static_cast<size_t>(hf.cells());
  std::vector<double> zm(n), m(n), tmp(n);
  for (size_t k = 0; k < n; ++k) {
    const float v = hf.z_um.data()[k];
    m[k] = std::isnan(v) ? 0.0 : 1.0;
    zm[k] = std::isnan(v) ? 0.0 : v;
  }
  // Rows (along X), then columns (along Y), for both the weighted heights and the weights.
  convolve(zm, tmp, hf.ny, hf.nx, hf.nx, 1, kernel);
  convolve(tmp, zm, hf.nx, hf.ny, 1, hf.nx, kernel);
  convolve(m, tmp, hf.ny, hf.nx, hf.nx, 1, kernel);
  convolve(tmp, m, hf.nx, hf.ny, 1, hf.nx, kernel);
  for (size_t k = 0; k < n; ++k) {
    float& v = out.z_um.data()[k];
    if (!std::isnan(v) && m[k] > 0.0) v = static_cast<float>(zm[k] / m[k]);
  }
  return out;
}

}  // namespace cuspmap

// Least-squares line removal from a profile, in centred index coordinates for conditioning.
// Inputs/outputs: heights um. Cost O(n).
// Method: ordinary least squares, closed form for a straight line.
#include "texture/remove_least_squares_line.h"

namespace cuspmap {

void remove_least_squares_line(std::span<double> z_um) {
  const size_t n = z_um.size();
  if (n == 0) return;
  const double xc = 0.5 * static_cast<double>(n - 1);
  double sz = 0.0, sxz = 0.0, sxx = 0.0;
  for (size_t i = 0; i < n; ++i) {
    const double x = static_cast<double>(i) - xc;
    sz += z_um[i];
    sxz += x * z_um[i];
    sxx += x * x;
  }
  const double mean = sz / static_cast<double>(n);
  const double slope = sxx > 0.0 ? sxz / sxx : 0.0;
  for (size_t i = 0; i < n; ++i) z_um[i] -= mean + slope * (static_cast<double>(i) - xc);
}

}  // namespace cuspmap

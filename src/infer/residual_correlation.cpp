// m / m_eff of residuals on a grid: autocorrelation time along each axis, multiplied.
// Inputs: grid, indices, residuals; output: factor. Cost O(samples x lags).
// Method: Box & Jenkins §2.1.6; Geyer 1992's initial positive sequence.
#include "infer/residual_correlation.h"

#include <cmath>
#include <limits>

namespace cuspmap {

double residual_correlation(int nx, int ny, const std::vector<int>& index, const Eigen::VectorXd& r,
                            int max_lags) {
  std::vector<double> grid(static_cast<size_t>(nx) * ny, std::numeric_limits<double>::quiet_NaN());
  for (size_t k = 0; k < index.size(); ++k) grid[index[k]] = r[static_cast<Eigen::Index>(k)];
  double r0 = 0.0;
  for (double v : grid) {
    if (std::isfinite(v)) r0 += v * v;
  }
  if (r0 <= 0.0) return 1.0;
  const double var = r0 / static_cast<double>(index.size());
  double factor = 1.0;
  for (const bool along_x : {true, false}) {
    double tau = 1.0;
    const int dx = along_x ? 1 : 0, dy = along_x ? 0 : 1;
    for (int lag = 1; lag <= max_lags; ++lag) {
      double sum = 0.0, pairs = 0.0;
      for (int b = 0; b + dy * lag < ny; ++b) {
        for (int a = 0; a + dx * lag < nx; ++a) {
          const double u = grid[static_cast<size_t>(b) * nx + a];
          const double v = grid[static_cast<size_t>(b + dy * lag) * nx + a + dx * lag];
          if (std::isfinite(u) && std::isfinite(v)) sum += u * v, pairs += 1.0;
        }
      }
      if (pairs <= 0.0) break;
      const double rho = sum / pairs / var;
      if (rho <= 0.0) break;
      tau += 2.0 * rho;
    }
    factor *= tau;
  }
  return factor;
}

}  // namespace cuspmap

// Residual statistics of the inverse simulation: autocorrelation time on the window grid and
// the variance through the lines along the lay. Inputs/outputs: see header. Cost O(m x lags).
// Method: Box & Jenkins §2.1.6; Geyer 1992; least squares through line means (derived).
#include "infer/residual_correlation.h"

#include <algorithm>
#include <cmath>
#include <limits>

namespace cuspmap {

// m / m_eff of residuals r at the window's finite samples: the product over the two axes of
// 1 + 2 sum_k rho(k), summed over the initial positive run of lags (Geyer 1992's initial
// positive sequence), at most kMaxCorrelationLags samples.
double correlation_factor(int nx, int ny, const std::vector<int>& index,
                          const Eigen::VectorXd& r) {
  std::vector<double> grid(static_cast<size_t>(nx) * ny, std::numeric_limits<double>::quiet_NaN());
  for (size_t k = 0; k < index.size(); ++k) grid[index[k]] = r[static_cast<int>(k)];
  double factor = 1.0;
  for (const bool along_x : {true, false}) {
    double tau = 1.0, r0 = 0.0;
    for (double v : grid) {
      if (std::isfinite(v)) r0 += v * v;
    }
    if (r0 <= 0.0) continue;
    const double n0 = static_cast<double>(index.size());
    for (int lag = 1; lag <= kMaxCorrelationLags; ++lag) {
      double sum = 0.0, pairs = 0.0;
      for (int b = 0; b + (along_x ? 0 : lag) < ny; ++b) {
        for (int a = 0; a + (along_x ? lag : 0) < nx; ++a) {
          const double u = grid[static_cast<size_t>(b) * nx + a];
          const double v = grid[static_cast<size_t>(b + (along_x ? 0 : lag)) * nx + a +
                                (along_x ? lag : 0)];
          if (std::isfinite(u) && std::isfinite(v)) sum += u * v, pairs += 1.0;
        }
      }
      if (pairs <= 0.0) break;
      const double rho = (sum / pairs) / (r0 / n0);
      if (rho <= 0.0) break;
      tau += 2.0 * rho;
    }
    factor *= tau;
  }
  return factor;
}

// Per-sample variance seen through the lines along the lay. The envelope is constant along the
// lay, so the parameters depend on the samples only through the residual's mean along each line
// (least squares, derived); a model error the same along a line (the mean profile of tooth
// marks, which the envelope lacks) does not average out there, where noise does. With n_b
// samples in line b and mean residual rb: sum n_b rb^2 / (lines - p - 3) estimates sigma^2 for
// noise (var(rb) = sigma^2 / n_b) and grows with such an error; the lines' own correlation
// across the lay is counted as in correlation_factor (Geyer 1992). Lines are bins one window
// sample wide across the lay.
double line_mean_variance(const std::vector<double>& v_mm, double bin_mm,
                          const Eigen::VectorXd& r, int params) {
  if (v_mm.empty()) return 0.0;
  const double v_lo = *std::min_element(v_mm.begin(), v_mm.end());
  const double bin = bin_mm;
  std::vector<double> sum, count;
  for (size_t k = 0; k < v_mm.size(); ++k) {
    const size_t b = static_cast<size_t>(std::floor((v_mm[k] - v_lo) / bin));
    if (b >= sum.size()) sum.resize(b + 1, 0.0), count.resize(b + 1, 0.0);
    sum[b] += r[static_cast<Eigen::Index>(k)];
    count[b] += 1.0;
  }
  std::vector<double> mean;
  double weighted = 0.0;
  for (size_t b = 0; b < sum.size(); ++b) {
    if (count[b] <= 0.0) continue;
    mean.push_back(sum[b] / count[b]);
    weighted += count[b] * mean.back() * mean.back();
  }
  const int lines = static_cast<int>(mean.size());
  double r0 = 0.0;
  for (double m : mean) r0 += m * m;
  double tau = 1.0;
  for (int lag = 1; lag <= kMaxCorrelationLags && lag < lines && r0 > 0.0; ++lag) {
    double c = 0.0;
    for (int b = 0; b + lag < lines; ++b) c += mean[b] * mean[b + lag];
    const double rho = (c / (lines - lag)) / (r0 / lines);
    if (rho <= 0.0) break;
    tau += 2.0 * rho;
  }
  return weighted / std::max(1, lines - params - 3) * tau;
}

}  // namespace cuspmap

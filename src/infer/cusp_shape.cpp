// Cusp shape by phase folding and a least-squares parabola about the valley.
// Inputs: traces, period; output: CuspShape. Cost O(samples).
// Method: see cusp_shape.h.
#include "infer/cusp_shape.h"

#include <Eigen/Dense>
#include <algorithm>
#include <cmath>
#include <utility>
#include <vector>

#include "core/units.h"
#include "infer/periodic_trend.h"

namespace cuspmap {
namespace {

// Iterations of the circle correction below (each multiplies the radius by the ratio of the
// parabola's curvature on the trial circle to the measured one: the error falls by ~(w / R)^2
// per step, derived; 8 leave it under 1e-12 for w < R / 2).
constexpr int kCircleIterations = 8;

}  // namespace

CuspShape cusp_shape(const std::vector<ProfileTrace>& traces, double period_mm, bool detrend) {
  CuspShape c;
  if (traces.empty()) return c;
  const double dx = traces.front().spacing_mm;
  const int bins = std::max(4, static_cast<int>(std::lround(period_mm / dx)));
  c.bin_mm = period_mm / bins;
  c.period_mm = period_mm;
  std::vector<double> sum(bins, 0.0), count(bins, 0.0);
  // Each bin's samples as (height, phase): the valley is fitted at the phases of the samples
  // it keeps, not at the bin centres (see below).
  std::vector<std::vector<std::pair<double, double>>> values(bins);
  std::vector<double> z;
  for (const ProfileTrace& t : traces) {
    if (t.z_um.size() < 3) continue;
    // A measured trace's own slope: the line plus the periodic cusps (periodic_trend), not a
    // least-squares line, which the cusps tilt when the trace is no whole number of periods.
    ProfileTrace level = t;
    if (detrend) remove_periodic_trend(level, period_mm, bins);
    z = level.z_um;
    for (size_t i = 0; i < z.size(); ++i) {
      const double x = t.start_mm + static_cast<double>(i) * t.spacing_mm;
      double phase = std::fmod(x, period_mm);
      if (phase < 0.0) phase += period_mm;
      const int b = std::min(bins - 1, static_cast<int>(phase / c.bin_mm));
      sum[b] += z[i];
      count[b] += 1.0;
      values[b].emplace_back(z[i], phase);
    }
  }
  std::vector<double> mean(bins, 0.0);
  for (int b = 0; b < bins; ++b) mean[b] = count[b] > 0.0 ? sum[b] / count[b] : 0.0;
  const int low = static_cast<int>(std::min_element(mean.begin(), mean.end()) - mean.begin());
  c.valley_phase_mm = (low + 0.5) * c.bin_mm;
  c.mean_um.resize(bins);
  for (int b = 0; b < bins; ++b) c.mean_um[b] = mean[(low + b) % bins];
  c.cusp_um = *std::max_element(mean.begin(), mean.end()) - mean[low];
  // The valley's shape is the cutter's where the marks along the lay are deepest: a low quantile
  // per bin follows the tool's swept circle under the feed marks (their bottoms lie on it).
  // The quantile's sample keeps its own phase: a bin's samples lie anywhere across its width,
  // and its lowest ones are those nearest the valley, so placing them at the bin centre reads
  // (|u| - bin / 2)^2 for u^2, a valley flatter by up to 1.875 (bin / 2) / window (derived:
  // regression of |u| on u^2 over |u| <= w, 15 / 16w); a 4.7 mm ball's trace read 4.96 mm
  // (random round trips, tools/diagnose_campaign.py seed 2028 rs17).
  std::vector<std::pair<double, double>> low_q(bins, {0.0, 0.0});  // (height, phase)
  for (int b = 0; b < bins; ++b) {
    std::vector<std::pair<double, double>>& v = values[b];
    if (v.empty()) {
      low_q[b] = {0.0, (b + 0.5) * c.bin_mm};
      continue;
    }
    const size_t k = static_cast<size_t>(kValleyQuantile * static_cast<double>(v.size() - 1));
    std::nth_element(v.begin(), v.begin() + static_cast<std::ptrdiff_t>(k), v.end());
    low_q[b] = v[k];
  }
  // Parabola over the valley window, positions u from the lowest bin's centre (mm), heights mm.
  const int half = std::max(2, static_cast<int>(kValleyWindow * bins));
  const int m = 2 * half + 1;
  Eigen::MatrixXd a(m, 3);
  Eigen::VectorXd h(m);
  for (int k = -half; k <= half; ++k) {
    const int b = (((low + k) % bins) + bins) % bins;
    const double u = k * c.bin_mm + (low_q[b].second - (b + 0.5) * c.bin_mm);
    a.row(k + half) << 1.0, u, u * u;
    h(k + half) = low_q[b].first / kUmPerMm;
  }
  const Eigen::Vector3d coef = a.colPivHouseholderQr().solve(h);
  if (coef(2) <= 0.0) return c;
  c.curved = true;
  c.radius_mm = 1.0 / (2.0 * coef(2));
  const Eigen::VectorXd res = h - a * coef;
  const double var = res.squaredNorm() / std::max(1, m - 3);
  const Eigen::Matrix3d cov = var * (a.transpose() * a).inverse();
  // dR/dc2 = -1 / (2 c2^2).
  c.radius_sigma_mm = std::sqrt(std::max(0.0, cov(2, 2))) / (2.0 * coef(2) * coef(2));
  // The parabola's own error on a circular valley: least squares of c0 + c2 u^2 against
  // u^2 / 2R + u^4 / 8R^3 over |u| <= w (uniform) give c2 = (1 + 0.214 (w / R)^2) / 2R, so
  // 1 / 2 c2 reads the radius short by 0.214 (w / R)^2 R (derived; regression of u^4 on u^2:
  // 6 w^2 / 7), a bias of the estimator, not a scatter: a noise-free 8.5 mm ball's trace read
  // 0.14 % short at a fit sigma of 0.001 % (random round trips, tools/diagnose_campaign.py
  // seed 2029 rs17). The radius reported is the circle whose parabola, fitted at these same
  // phases, has the measured curvature: R <- R c2(R) / c2 until it settles, c2(R) the fit's
  // curvature on R - sqrt(R^2 - u^2) (exact for a circle at every order; derived).
  const Eigen::MatrixXd solve = a.colPivHouseholderQr().solve(Eigen::MatrixXd::Identity(m, m));
  const double u_max = a.col(1).cwiseAbs().maxCoeff();
  double r = c.radius_mm;
  for (int it = 0; it < kCircleIterations && u_max < r; ++it) {
    Eigen::VectorXd circle(m);
    for (int k = 0; k < m; ++k) circle(k) = r - std::sqrt(r * r - a(k, 1) * a(k, 1));
    const double c2 = solve.row(2).dot(circle);
    if (!(c2 > 0.0)) break;
    r *= c2 / coef(2);
  }
  if (u_max < r && std::isfinite(r)) {
    c.radius_sigma_mm *= r / c.radius_mm;  // the correction scales the radius (to first order)
    c.radius_mm = r;
  }
  return c;
}

}  // namespace cuspmap

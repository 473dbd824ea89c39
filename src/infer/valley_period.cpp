// Period from valley vertices (see valley_period.h).
// Inputs: runs, first period, valley phase; output: ValleyPeriod. Cost O(samples).
// Method: local least-squares parabolas; least-squares line of vertex on index.
#include "infer/valley_period.h"

#include <Eigen/Dense>
#include <algorithm>
#include <cmath>
#include <utility>
#include <vector>

namespace cuspmap {

ValleyPeriod valley_period(const std::vector<ProfileTrace>& runs, double period_mm,
                           double valley_mm, double window) {
  ValleyPeriod v;
  if (runs.empty() || period_mm <= 0.0) return v;
  const double dx = runs.front().spacing_mm;
  const int half = std::max(2, static_cast<int>(window * period_mm / dx));
  const int search = std::max(1, static_cast<int>(0.25 * period_mm / dx));
  std::vector<std::pair<double, double>> vertex;  // (valley index, position mm)
  std::vector<double> height;                     // vertex height, um
  std::vector<int> run_of;                        // the run each vertex lies in
  for (const ProfileTrace& r : runs) {
    const int n = static_cast<int>(r.z_um.size());
    if (n < 2 * half + 1) continue;
    const double x0 = r.start_mm, x1 = r.start_mm + (n - 1) * dx;
    const long k_lo = static_cast<long>(std::ceil((x0 - valley_mm) / period_mm));
    const long k_hi = static_cast<long>(std::floor((x1 - valley_mm) / period_mm));
    for (long k = k_lo; k <= k_hi; ++k) {
      const int c = static_cast<int>(std::lround((valley_mm + k * period_mm - x0) / dx));
      const int lo = std::max(0, c - search), hi = std::min(n - 1, c + search);
      if (lo > hi) continue;
      const int i = static_cast<int>(std::min_element(r.z_um.begin() + lo, r.z_um.begin() + hi + 1) -
                                     r.z_um.begin());
      // The lowest sample must be the valley, not the edge of the search on a flank, and its
      // parabola must lie inside the run.
      if (i == lo || i == hi || i - half < 0 || i + half >= n) continue;
      Eigen::MatrixXd a(2 * half + 1, 3);
      Eigen::VectorXd h(2 * half + 1);
      for (int j = -half; j <= half; ++j) {
        const double u = j * dx;
        a.row(j + half) << 1.0, u, u * u;
        h(j + half) = r.z_um[static_cast<size_t>(i + j)];
      }
      const Eigen::Vector3d coef = a.colPivHouseholderQr().solve(h);
      if (!(coef(2) > 0.0)) continue;
      const double du = -coef(1) / (2.0 * coef(2));
      if (std::abs(du) > half * dx) continue;
      vertex.emplace_back(static_cast<double>(k), x0 + i * dx + du);
      height.push_back(coef(0) + du * (coef(1) + du * coef(2)));
      run_of.push_back(static_cast<int>(&r - runs.data()));
    }
  }
  const int m = static_cast<int>(vertex.size());
  if (m < kMinValleys) return v;
  double sk = 0.0, sx = 0.0;
  for (const auto& [k, x] : vertex) sk += k, sx += x;
  const double mk = sk / m, mx = sx / m;
  double skk = 0.0, skx = 0.0;
  for (const auto& [k, x] : vertex) skk += (k - mk) * (k - mk), skx += (k - mk) * (x - mx);
  if (skk <= 0.0) return v;
  v.period_mm = skx / skk;
  double rss = 0.0;
  for (const auto& [k, x] : vertex) {
    const double e = x - mx - v.period_mm * (k - mk);
    rss += e * e;
  }
  v.sigma_mm = std::sqrt(rss / std::max(1, m - 2) / skk);
  v.valleys = m;
  v.found = v.period_mm > 0.0;
  // The trend: heights on positions, each run keeping its own mean.
  double num = 0.0, den = 0.0;
  int used = 0;
  for (int run = 0; run < static_cast<int>(runs.size()); ++run) {
    double n = 0.0, px = 0.0, pz = 0.0;
    for (int q = 0; q < m; ++q) {
      if (run_of[static_cast<size_t>(q)] != run) continue;
      n += 1.0, px += vertex[static_cast<size_t>(q)].second, pz += height[static_cast<size_t>(q)];
    }
    if (n < 2.0) continue;
    px /= n, pz /= n;
    for (int q = 0; q < m; ++q) {
      if (run_of[static_cast<size_t>(q)] != run) continue;
      const double ex = vertex[static_cast<size_t>(q)].second - px;
      num += ex * (height[static_cast<size_t>(q)] - pz);
      den += ex * ex;
      ++used;
    }
  }
  if (used >= kMinValleys && den > 0.0) {
    v.slope_um_per_mm = num / den;
    v.slope_found = true;
  }
  return v;
}

}  // namespace cuspmap

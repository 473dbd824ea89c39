// Pass axis from the marks' phase across the lay (matched filter, see the header).
// Inputs: Heightfield, lay, stepover, rim radius, fz, Z; output: MarksPassOffset. Cost: one pass
// over the cells, then per trial axis O(passes x lines + lowest-point trials x passes).
// Method: per-line Fourier coefficient of the plane-removed heights (least-squares plane) at the
// marks' period; a pass with its axis at c leaves its leading rim's marks at line y shifted by
// sqrt(a^2 - (y - c)^2) along the lay (trailing: the opposite sign), which turns the line's
// coefficient by 2 pi sqrt(...) / period (derived); per pass the turned-back coefficients of the
// lines it cuts add coherently only at the right axis.
#include "infer/tooth_pass_offset.h"

#include <algorithm>
#include <cmath>
#include <complex>
#include <numbers>
#include <vector>
#include <Eigen/Dense>

namespace cuspmap {

MarksPassOffset marks_pass_offset(const Heightfield& hf, double lay_deg, double stepover_mm,
                                  double rim_mm, double fz_mm, int teeth) {
  MarksPassOffset out;
  const double cell = hf.cell_mm, s = stepover_mm, a = rim_mm;
  if (!(s > 0.0) || !(a > 0.0) || !(fz_mm > 0.0) || teeth < 1 || !(cell > 0.0)) return out;
  constexpr double kTwoPi = 2.0 * std::numbers::pi;
  const double ang = lay_deg * std::numbers::pi / 180.0;
  const double ux = std::cos(ang), uy = std::sin(ang);
  // Finite samples, their along / across coordinates and the least-squares plane.
  std::vector<double> al, ac, zs;
  for (int j = 0; j < hf.ny; ++j) {
    for (int i = 0; i < hf.nx; ++i) {
      const double z = hf.z_um(j, i);
      if (!std::isfinite(z)) continue;
      const double x = hf.x_mm(i), y = hf.y_mm(j);
      al.push_back(x * ux + y * uy);
      ac.push_back(-x * uy + y * ux);
      zs.push_back(z);
    }
  }
  const Eigen::Index n = static_cast<Eigen::Index>(zs.size());
  if (n < 16) return out;
  Eigen::MatrixXd basis(n, 3);
  for (Eigen::Index k = 0; k < n; ++k) basis.row(k) << 1.0, al[k], ac[k];
  const Eigen::VectorXd zv = Eigen::Map<const Eigen::VectorXd>(zs.data(), n);
  const Eigen::VectorXd level = zv - basis * basis.colPivHouseholderQr().solve(zv);
  const double lo = *std::min_element(ac.begin(), ac.end());
  const int lines = static_cast<int>(std::lround((*std::max_element(ac.begin(), ac.end()) - lo) /
                                                 cell)) + 1;
  auto line_y = [&](int l) { return lo + l * cell; };
  // Trial axes every half cell over one stepover, lowest points every two cells within the rim.
  const int axes = std::max(4, static_cast<int>(std::ceil(2.0 * s / cell)));
  const int lows = std::max(1, static_cast<int>(std::ceil(a / cell)));
  const double best_init = -1.0;
  double best_all = best_init;
  for (const double period : {fz_mm, teeth * fz_mm}) {
    std::vector<std::complex<double>> coef(static_cast<size_t>(lines));
    for (Eigen::Index k = 0; k < n; ++k) {
      const int l = std::clamp(static_cast<int>(std::lround((ac[k] - lo) / cell)), 0, lines - 1);
      coef[static_cast<size_t>(l)] += level[k] * std::polar(1.0, -kTwoPi * al[k] / period);
    }
    double sum = 0.0, top = best_init, top_axis = 0.0, top_low = 0.0;
    long count = 0;
    // Per trial axis c: for each pass k whose rim reaches the lines, prefix sums over the lines
    // of the coefficients turned back by the leading and the trailing rim's circle.
    std::vector<std::complex<double>> lead(static_cast<size_t>(lines) + 1),
        trail(static_cast<size_t>(lines) + 1);
    for (int t = 0; t < axes; ++t) {
      const double c = lo + s * t / axes;
      const int k_lo = static_cast<int>(std::floor((lo - a - c) / s));
      const int k_hi = static_cast<int>(std::ceil((line_y(lines - 1) + a - c) / s));
      std::vector<double> score(static_cast<size_t>(2 * lows + 1), 0.0);
      for (int k = k_lo; k <= k_hi; ++k) {
        const double axis = c + k * s;
        for (int l = 0; l < lines; ++l) {
          const double d = line_y(l) - axis;
          std::complex<double> f(0.0, 0.0), b(0.0, 0.0);
          if (std::abs(d) < a) {
            const double lag = kTwoPi * std::sqrt(a * a - d * d) / period;
            f = coef[static_cast<size_t>(l)] * std::polar(1.0, -lag);
            b = coef[static_cast<size_t>(l)] * std::polar(1.0, lag);
          }
          lead[static_cast<size_t>(l) + 1] = lead[static_cast<size_t>(l)] + f;
          trail[static_cast<size_t>(l) + 1] = trail[static_cast<size_t>(l)] + b;
        }
        // Pass k cuts the lines within half a stepover of its lowest point's track.
        for (int q = -lows; q <= lows; ++q) {
          const double track = axis + q * a / lows;
          const int l0 = std::clamp(static_cast<int>(std::ceil((track - 0.5 * s - lo) / cell)), 0,
                                    lines);
          const int l1 = std::clamp(static_cast<int>(std::ceil((track + 0.5 * s - lo) / cell)), 0,
                                    lines);
          if (l1 <= l0) continue;
          score[static_cast<size_t>(q + lows)] +=
              std::max(std::abs(lead[static_cast<size_t>(l1)] - lead[static_cast<size_t>(l0)]),
                       std::abs(trail[static_cast<size_t>(l1)] - trail[static_cast<size_t>(l0)]));
        }
      }
      for (int q = -lows; q <= lows; ++q) {
        const double v = score[static_cast<size_t>(q + lows)];
        sum += v, ++count;
        if (v > top) top = v, top_axis = c, top_low = q * a / lows;
      }
    }
    const double contrast = count > 0 && sum > 0.0 ? top / (sum / count) : 0.0;
    if (contrast > best_all) {
      best_all = contrast;
      out.axis_mm = top_axis;
      out.lowest_mm = top_low;
      out.contrast = contrast;
      out.period_mm = period;
    }
  }
  out.found = out.contrast > 1.0;
  return out;
}

}  // namespace cuspmap

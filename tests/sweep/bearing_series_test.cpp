// Tests of sweep/bearing_series: the closed-form tooth crossing along a line against a bisection
// of the bearing equation F(x) = atan2(w, x) + kappa x (derived).
#include "sweep/bearing_series.h"

#include <cmath>
#include <numbers>
#include <random>

#include "test_support.h"

namespace cuspmap {

TEST_CASE("bearing_series_root: a returned root meets its bound; out-of-window roots are refused",
          "[sweep]") {
  std::mt19937 rng(15);
  std::uniform_real_distribution<double> unit(0.0, 1.0);
  constexpr double kTolMm = 1e-10;
  int accepted = 0;
  for (int run = 0; run < 2000; ++run) {
    const double w = (unit(rng) < 0.5 ? -1.0 : 1.0) * (0.01 + 3.0 * unit(rng));
    const double kappa = (unit(rng) < 0.5 ? -1.0 : 1.0) * (5.0 + 80.0 * unit(rng));
    const double x0 = -3.0 + 6.0 * unit(rng);
    const double period = 2.0 * std::numbers::pi / (1 + run % 4);
    auto f = [&](double x) { return std::atan2(w, x) + kappa * x; };
    const BearingSeries s = bearing_series(w, kappa, x0, period);
    const double delta = (unit(rng) - 0.5) * 2.0 * period;
    const double h = bearing_series_root(s, delta, kTolMm);
    if (!(h == h)) continue;
    ++accepted;
    // Bisection for the root of F(x0 + h) = F(x0) + delta on the window (F is monotone there:
    // the series is used only while |F'| stays above half its value).
    double lo = x0 - s.window_mm, hi = x0 + s.window_mm;
    const double target = f(x0) + delta;
    const bool rising = s.a > 0.0;
    for (int it = 0; it < 200; ++it) {
      const double mid = 0.5 * (lo + hi);
      ((f(mid) < target) == rising ? lo : hi) = mid;
    }
    CAPTURE(w, kappa, x0, delta, h);
    // The bound plus the bisection's and the arithmetic's own rounding (derived).
    REQUIRE_NEAR(x0 + h, 0.5 * (lo + hi), kTolMm + 1e-12);
  }
  REQUIRE(accepted > 500);
  // A root beyond two periods is outside the window: refused.
  const BearingSeries s = bearing_series(1.0, 40.0, 2.5, 2.0 * std::numbers::pi);
  REQUIRE(std::isnan(bearing_series_root(s, 3.0 * 2.0 * std::numbers::pi, kTolMm)));
}

}  // namespace cuspmap

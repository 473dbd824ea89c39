// Series reversion of the line bearing equation with an error bound (see bearing_series.h).
// Inputs: w, kappa, x0 (mm, rad/mm), delta (rad); output: root offset mm or NaN.
// Method: Taylor coefficients from powers of 1/(x0 + i w); reversion to 4th order.
#include "sweep/bearing_series.h"

#include <algorithm>
#include <cmath>
#include <complex>

namespace cuspmap {
namespace {

// The window covers roots up to two lattice periods away (the nearest crossing lies within one).
constexpr double kWindowPeriods = 2.0;
// The series is used only while F' stays above half its value at x0 over the window, so the
// error bound stays tight.
constexpr double kMinSlopeFraction = 0.5;

}  // namespace

BearingSeries bearing_series(double w_mm, double kappa, double x0_mm, double period_rad) {
  BearingSeries s;
  const double d2 = w_mm * w_mm + x0_mm * x0_mm;
  if (!(d2 > 0.0)) return s;
  // u = 1 / (x0 + i w); F' = kappa + Im u, F'' = -Im u^2, F''' = 2 Im u^3, F'''' = -6 Im u^4.
  const std::complex<double> u(x0_mm / d2, -w_mm / d2);
  const std::complex<double> u2 = u * u, u3 = u2 * u, u4 = u3 * u;
  s.a = kappa + u.imag();
  s.b = -0.5 * u2.imag();
  s.c = u3.imag() / 3.0;
  s.d = -0.25 * u4.imag();
  if (s.a == 0.0) return s;
  s.window_mm = kWindowPeriods * period_rad / std::abs(s.a);
  const double x_near = std::max(0.0, std::abs(x0_mm) - s.window_mm);
  s.d_min_mm = std::sqrt(w_mm * w_mm + x_near * x_near);
  // |F''| <= 1 / d^2 over the window.
  const double slope = std::abs(s.a) - s.window_mm / (s.d_min_mm * s.d_min_mm);
  if (!(slope > kMinSlopeFraction * std::abs(s.a))) return s;
  s.min_slope = slope;
  s.inv_min_slope = 1.0 / slope;
  s.inv_a = 1.0 / s.a;
  // Reversion of a h + b h^2 + c h^3 + d h^4 = delta: h = t - B t^2 + (2B^2 - C) t^3 +
  // (5BC - D - 5B^3) t^4, t = delta / a, B = b/a, C = c/a, D = d/a.
  const double bb = s.b * s.inv_a, cc = s.c * s.inv_a, dd = s.d * s.inv_a;
  s.k2 = -bb;
  s.k3 = 2.0 * bb * bb - cc;
  s.k4 = 5.0 * bb * cc - dd - 5.0 * bb * bb * bb;
  const double dm2 = s.d_min_mm * s.d_min_mm;
  s.rem = 1.0 / (5.0 * dm2 * dm2 * s.d_min_mm);
  return s;
}

}  // namespace cuspmap

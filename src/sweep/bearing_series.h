// A tooth crossing next to a chord point in closed form: the bearing of a cell seen from an axis
// moving along a line, F(x) = atan2(w, x) + kappa x, expanded to 4th order about x0 and
// inverted by series reversion, with a rigorous bound of the root's error. Lengths mm, rad.
// Method: Taylor remainder with |d^n/dx^n atan2(w, x)| <= (n-1)! / d^n (the n-th derivative is
// Im((-1)^(n-1) (n-1)! / (x + i w)^n)); series reversion (Abramowitz & Stegun 3.6.25); the root
// error is the residual over the least slope (mean value theorem). Derived.
#pragma once

#include <cmath>
#include <limits>

namespace cuspmap {

/// Taylor data of F about x0, prepared once per chord point.
struct BearingSeries {
  double a = 0.0;          ///< F'(x0), rad/mm
  double b = 0.0;          ///< F''(x0) / 2
  double c = 0.0;          ///< F'''(x0) / 6
  double d = 0.0;          ///< F''''(x0) / 24
  double window_mm = 0.0;  ///< |h| up to which the bound holds
  double d_min_mm = 0.0;   ///< least distance from the axis over x0 +- window
  double min_slope = 0.0;  ///< lower bound of |F'| over the window; 0 = series not usable
  double inv_a = 0.0;      ///< 1 / a
  double k2 = 0.0, k3 = 0.0, k4 = 0.0;  ///< reversion coefficients of t^2, t^3, t^4 (t = delta/a)
  double inv_min_slope = 0.0;  ///< 1 / min_slope
  double rem = 0.0;            ///< 1 / (5 d_min^5): Taylor remainder per |h|^5
};

/// Prepares the series of F(x) = atan2(w, x) + kappa x about x0 for roots up to about two
/// lattice periods away.
/// @param[in] w_mm       lateral offset of the cell (non-zero)
/// @param[in] kappa      tooth angle per mm of travel (rad/mm, signed)
/// @param[in] x0_mm      the chord point
/// @param[in] period_rad lattice period (2 pi / Z or 2 pi)
BearingSeries bearing_series(double w_mm, double kappa, double x0_mm, double period_rad);

/// Offset h with F(x0 + h) = F(x0) + delta, from the series; NaN when the bound on its error
/// exceeds tol_mm or the root lies outside the window (the caller then iterates). Inline: it
/// runs once per tooth crossing, a few multiplications.
inline double bearing_series_root(const BearingSeries& s, double delta_rad, double tol_mm) {
  if (s.min_slope == 0.0) return std::numeric_limits<double>::quiet_NaN();
  const double t = delta_rad * s.inv_a;
  const double h = t + t * t * (s.k2 + t * (s.k3 + t * s.k4));
  const double ah = std::abs(h);
  // F(x0 + h) - F(x0) - delta = quartic residual + Taylor remainder, |remainder| <=
  // max |F^(5)| h^5 / 120 <= h^5 / (5 d_min^5); the root lies within that over min |F'|.
  const double residual = h * (s.a + h * (s.b + h * (s.c + h * s.d))) - delta_rad;
  const double h2 = ah * ah;
  const double err = (std::abs(residual) + h2 * h2 * ah * s.rem) * s.inv_min_slope;
  if (!(err <= tol_mm) || !(ah + err < s.window_mm)) {
    return std::numeric_limits<double>::quiet_NaN();
  }
  return h;
}

}  // namespace cuspmap

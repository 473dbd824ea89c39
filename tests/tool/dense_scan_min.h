// Test oracle: the minimum of a 1-D function on [a, b] by a dense scan, then a golden-section
// refinement of the best sample's bracket, keeping the lowest value seen (so that a +infinity
// just past an edge, as at a cutter's rim, cannot lose it). Independent of src/ on purpose.
// Cost: samples + 1 + 2 x 100 evaluations.
// Method: golden-section search (Kiefer 1953; Numerical Recipes 3rd ed., §10.2).
#pragma once

#include <algorithm>
#include <limits>

namespace cuspmap::test {

/// Lowest value of f on [a, b].
/// @param[in] f        callable double -> double (+infinity allowed)
/// @param[in] samples  scan intervals (>= 2); the true minimum must lie in the bracket of the
///                     best sample, i.e. f has no narrower dip than two intervals
template <class F>
double dense_scan_min(const F& f, double a, double b, int samples) {
  int best_i = 0;
  double best = std::numeric_limits<double>::infinity();
  for (int i = 0; i <= samples; ++i) {
    const double v = f(a + (b - a) * i / samples);
    if (v < best) {
      best = v;
      best_i = i;
    }
  }
  double lo = a + (b - a) * std::max(0, best_i - 1) / samples;
  double hi = a + (b - a) * std::min(samples, best_i + 1) / samples;
  for (int it = 0; it < 100; ++it) {
    const double x1 = hi - 0.6180339887498949 * (hi - lo);
    const double x2 = lo + 0.6180339887498949 * (hi - lo);
    const double v1 = f(x1), v2 = f(x2);
    best = std::min({best, v1, v2});
    if (v1 <= v2) {
      hi = x2;
    } else {
      lo = x1;
    }
  }
  return best;
}

}  // namespace cuspmap::test

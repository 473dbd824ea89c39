// Golden-section search for the minimum of a function on a bracket known to hold one dip.
// Inputs: callable f(x), bracket [a, b], iteration count; output: argmin and the lowest value.
// Cost: iterations + 2 evaluations; the bracket shrinks by 0.618 per iteration.
// Method: Kiefer, Sequential minimax search for a maximum, Proc. AMS 4 (1953); Press et al.,
// Numerical Recipes 3rd ed. (2007), §10.2.
#pragma once

namespace cuspmap {

/// Where f is lowest on [a, b] (f unimodal there), to 0.618^iterations of the bracket.
/// @param[in] f           callable double -> double; +infinity is allowed (it counts as high)
/// @param[in] a, b        bracket, a <= b
/// @param[in] iterations  golden steps (40 shrink the bracket by ~4e-9)
/// @param[out] lowest     the lowest value of f evaluated at the returned point's final pair
/// @return the argument of the lower of the final two probes
template <class F>
double golden_section_min(const F& f, double a, double b, int iterations, double& lowest) {
  constexpr double kInvPhi = 0.6180339887498949;  // (sqrt 5 - 1) / 2
  double x1 = b - kInvPhi * (b - a), x2 = a + kInvPhi * (b - a);
  double f1 = f(x1), f2 = f(x2);
  for (int it = 0; it < iterations; ++it) {
    if (f1 <= f2) {
      b = x2;
      x2 = x1;
      f2 = f1;
      x1 = b - kInvPhi * (b - a);
      f1 = f(x1);
    } else {
      a = x1;
      x1 = x2;
      f1 = f2;
      x2 = a + kInvPhi * (b - a);
      f2 = f(x2);
    }
  }
  lowest = f1 <= f2 ? f1 : f2;
  return f1 <= f2 ? x1 : x2;
}

}  // namespace cuspmap

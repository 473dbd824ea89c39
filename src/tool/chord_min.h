// Lowest point of a revolved profile along a straight chord, with a linear term:
// f(x) = q(sqrt(w^2 + x^2)) - k x over an interval of x (mm). This is the height a cell at
// lateral offset w receives from a straight move whose axis passes it at offsets x, when the
// tip height changes along the move (a ramp) or the axis is tilted (both add k x).
// Cost O(pieces) closed forms; a few Newton steps on torus pieces.
// Method: convexity of each piece seen along the chord (DESIGN.md "Geometry": ball and torus are
// convex, the dish cone is concave), so each piece's minimum is a closed form, a bracketed
// Newton root of f', or an end point (Press et al., Numerical Recipes 3rd ed., §9.4 rtsafe).
#pragma once

#include <array>

#include "tool/revolved_profile.h"

namespace cuspmap {

/// One candidate minimum of f along the chord.
struct ChordPoint {
  double x_mm = 0.0;      ///< chord position (offset of the cell ahead of the axis), mm
  double value_mm = 0.0;  ///< f there, mm
};

/// Most candidates chord_min reports (one or two per piece of the chord).
inline constexpr int kMaxChordCandidates = 16;

/// Result of chord_min.
struct ChordMin {
  double x_mm = 0.0;      ///< where f is lowest, mm
  double value_mm = 0.0;  ///< the lowest f, mm; +infinity when the interval misses the profile
  int count = 0;          ///< candidates filled
  std::array<ChordPoint, kMaxChordCandidates> candidates{};  ///< local minima of f, any order
};

/// Minimises f(x) = q(sqrt(w^2 + x^2)) - k x over [x_lo, x_hi] clipped to |x| <= sqrt(reach^2 -
/// w^2). Exact up to floating point for line pieces and centred circles (closed forms); torus
/// pieces converge to 1e-10 mm in x.
/// @param[in] q       revolved profile (mm)
/// @param[in] w_mm    lateral offset of the chord from the axis, any sign
/// @param[in] k       slope of the linear term (mm per mm of x), |k| small (ramps, tilt)
/// @param[in] x_lo_mm, x_hi_mm  the interval of x; empty or out of reach gives value +infinity
/// @param[in] local_minima_only  when true, candidates holds only points that are local minima of
///            f (what the tooth-resolved sweep searches around); otherwise every piece's minimum
ChordMin chord_min(const RevolvedProfile& q, double w_mm, double k, double x_lo_mm, double x_hi_mm,
                   bool local_minima_only);

}  // namespace cuspmap

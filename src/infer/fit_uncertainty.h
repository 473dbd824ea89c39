// Fitted machine errors in the machinist's terms, each with its standard error: tilt magnitude
// and direction (machine frame), its components along and across the feed, stepover, pass
// offset, setup plane; and which of them the floor resolves (value > 3 sigma) or only bounds.
// Inputs: FloorFit (parameters, covariance at the optimum); output: FittedErrors (deg, mm, um).
// Method: first-order propagation of the covariance, var(g(p)) = grad g^T C grad g (GUM,
// JCGM 100:2008 §5.1.2).
#pragma once

#include "infer/floor_fit.h"

namespace cuspmap {

/// A value is resolved when it exceeds this many standard errors; otherwise only its bound
/// |value| + kBoundSigmas sigma is reported (common practice, no source: 3 sigma detection,
/// 2 sigma bounds ~ 95 %).
inline constexpr double kResolvedSigmas = 3.0;
inline constexpr double kBoundSigmas = 2.0;

/// Share of the window's variance the model must explain for its values to stand on their own;
/// below it the marks are faint against noise and neighbouring parameter sets fit about as well
/// (common practice, no source; measured: a 0.5 um step under 0.02 um noise is 82 % explained
/// and recovered within 1 %, a 0.04 um cusp under 0.01 um noise 64 % with a tilt 20 % off).
inline constexpr double kWellExplained = 0.75;

/// One fitted number.
struct FittedValue {
  double value = 0.0;  ///< best fit
  double sigma = 0.0;  ///< standard error (infinite when the floor does not show it)
  bool fitted = false; ///< was a free parameter (or derived from free ones)
  bool resolved = false;  ///< |value| > kResolvedSigmas sigma
  double bound = 0.0;  ///< |value| + kBoundSigmas sigma: upper bound when not resolved
};

/// The fit in the machinist's terms.
struct FittedErrors {
  FittedValue tilt_deg;           ///< spindle tilt magnitude (tram error), deg
  FittedValue tilt_toward_deg;    ///< direction of the end face's lowest point, deg from +X
  double tilt_toward_alt_deg = 0.0;  ///< the other candidate (lowest point behind, not ahead)
  bool along_sign_known = false;  ///< the floor tells ahead from behind (never with the
                                  ///< revolving envelope: it is the same both ways)
  FittedValue tilt_along_deg;     ///< component along the feed, folded >= 0, deg
  FittedValue tilt_across_deg;    ///< component across the feed (+ toward lay + 90), deg
  FittedValue stepover_mm;        ///< distance between passes
  FittedValue offset_mm;          ///< a pass centre's across-lay position from the window centre
  FittedValue setup_gx_um_per_mm; ///< setup plane slope along X
  FittedValue setup_gy_um_per_mm; ///< setup plane slope along Y
};

/// A value with its variance (infinite: the floor does not move it) as a FittedValue: sigma,
/// resolved (|v| > kResolvedSigmas sigma) and bound (|v| + kBoundSigmas sigma).
FittedValue fitted_value(double v, double var, bool fitted);

/// Propagates the covariance to the reported values.
FittedErrors fitted_errors(const FloorFit& fit);

}  // namespace cuspmap

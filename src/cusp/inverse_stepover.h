// The largest stepover (or turning feed) meeting a target cusp, Ra or Rz: closed-form inverses
// where they exist, else bisection on the exact forward model to 1e-12; the approximation's
// stepover beside it. Lengths mm, heights um.
// Method: inverses of scallop_ball.h, scallop_bullnose.h, scallop_curved.h, feed_mark.h forms.
#pragma once

#include "cusp/cusp_setup.h"

namespace cuspmap {

/// The quantity a stepover is chosen for.
enum class FinishTarget {
  Scallop,  ///< cusp height along the normal
  Ra,       ///< Ra of the ideal profile
  Rz,       ///< Rz of the ideal profile (= the cusp height for a periodic profile)
};

/// A stepover found for a target.
struct StepoverSolution {
  bool reachable = false;           ///< false: no stepover inside the model gives the target
  double stepover_mm = 0.0;         ///< exact stepover (plan view on planes; along the surface
                                    ///< on cylinders; feed per revolution for turning)
  double stepover_approx_mm = 0.0;  ///< stepover the small-stepover approximation gives;
                                    ///< 0 when the approximation never reaches the target
  double max_target_um = 0.0;       ///< largest value of the target inside the model
  CuspResult cusp;                  ///< forward result at stepover_mm (when reachable)
};

/// The stepover whose exact cusp gives `target_um` of `target`.
/// @param[in] setup      validated (cylinders only with a ball)
/// @param[in] target     quantity to meet
/// @param[in] target_um  value > 0, um
/// @return reachable = false with max_target_um when the target is at or beyond the model's
///         largest value (a bull-nose's corner, a flat end mill on a level floor, a concave radius
///         the ball cannot follow).
StepoverSolution inverse_stepover(const CuspSetup& setup, FinishTarget target, double target_um);

/// The mark spacing (turning feed per revolution, or feed per tooth) of a circle of radius r that
/// gives `target_um`: exact f = 2 sqrt(h (2r - h)) for a height, bisection for Ra; the
/// approximation f = sqrt(8 r h), f = sqrt(18 sqrt(3) r Ra) (Boothroyd & Knight) beside it.
/// @param[in] radius_mm  r > 0
StepoverSolution inverse_feed_mark(double radius_mm, FinishTarget target, double target_um);

}  // namespace cuspmap

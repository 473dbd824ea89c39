// The largest raster stepover whose floor meets a target Sa once the marks along the feed count
// too: the cross-feed profile's closed form brackets it, then bisection on windows swept tooth
// by tooth (simulated_cusp_heights: ISO 25178-2 Sa after least-squares plane removal).
// Inputs: Cutter (teeth, runout, tilt), feed per tooth mm, direction; target Sa um. Output mm, um.
#pragma once

#include "path/path_spec.h"
#include "tool/cutter.h"

namespace cuspmap {

/// A stepover designed for an areal target.
struct ArealStepover {
  bool reachable = false;          ///< false: the feed marks alone leave more than the target
  double stepover_mm = 0.0;        ///< largest stepover found whose simulated Sa <= target
  double sa_um = 0.0;              ///< simulated Sa at stepover_mm (reachable) or at the
                                   ///< smallest stepover tried (unreachable)
  double profile_stepover_mm = 0.0;  ///< the stepover the cross-feed profile alone allows
                                     ///< (closed form, marks along the feed ignored)
  double smallest_tried_mm = 0.0;  ///< smallest stepover simulated
  int windows = 0;                 ///< windows simulated
};

/// Relative width of the final stepover bracket.
inline constexpr double kArealStepoverTolerance = 0.005;

/// @param[in] cutter             validated cutter (teeth, runout, tilt, dish all simulated)
/// @param[in] feed_per_tooth_mm  fz > 0
/// @param[in] direction          one-way or zigzag passes
/// @param[in] target_sa_um       > 0
/// @return the stepover, or reachable = false when Sa at a third of the profile's stepover is
///         still above the target (the marks along the feed set the finish: reduce fz).
ArealStepover stepover_for_sa(const Cutter& cutter, double feed_per_tooth_mm,
                              RasterDirection direction, double target_sa_um);

}  // namespace cuspmap

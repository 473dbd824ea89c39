// The across-lay beat of neighbouring passes' tooth arcs: a flat or bull-nose rim of radius a
// leaves arcs f apart along the lay; two passes s apart meet at an along-lay phase that turns by
// s / sqrt(a^2 - s^2/4) per mm across the lay, so their lower envelope, averaged along the lay,
// repeats every ~ a f / s across it (derived; measured on simulated heel-lifted floors).
// Inputs: the across-lay repeat and the feed marks' spacing (mm), the known cutter; output:
// ArcBeat. Method: small-angle circle geometry; cost O(1).
#pragma once

#include "tool/cutter.h"

namespace cuspmap {

/// Whether an across-lay repeat may be the beat of tooth arcs rather than the passes.
struct ArcBeat {
  bool possible = false;            ///< repeat < sqrt(a f): the short member of a beat pair
  double rim_radius_mm = 0.0;       ///< a: radius of the rim that leaves the arcs
  double limit_mm = 0.0;            ///< sqrt(a f): repeats under it may be a beat
  double partner_stepover_mm = 0.0; ///< a f / repeat: passes this far apart would beat so
};

/// Tests an across-lay repeat against the beat of the arcs a flat or bull-nose rim leaves f
/// apart along the lay (never possible for a ball, or without feed marks).
/// @param[in] repeat_mm     across-lay repeat read from the floor (> 0)
/// @param[in] mark_step_mm  along-lay spacing of the feed marks (0 = none read)
/// @param[in] cutter        the known tool
ArcBeat arc_beat(double repeat_mm, double mark_step_mm, const Cutter& cutter);

}  // namespace cuspmap

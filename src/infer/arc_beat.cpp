// Beat of neighbouring passes' tooth arcs across the lay (see the header for the derivation).
// Inputs: repeat and mark spacing (mm), cutter; output: ArcBeat. Cost O(1).
// Method: passes s apart leave rim arcs of radius a whose along-lay positions at an across-lay
// offset y differ by sqrt(a^2 - (y - s)^2) - sqrt(a^2 - y^2); their slope s / sqrt(a^2 - s^2/4)
// midway (~ s / a) turns the two mark trains through one spacing f every ~ a f / s mm (derived).
#include "infer/arc_beat.h"

#include <cmath>

namespace cuspmap {

ArcBeat arc_beat(double repeat_mm, double mark_step_mm, const Cutter& cutter) {
  ArcBeat b;
  if (cutter.shape == CutterShape::Ball || !(repeat_mm > 0.0) || !(mark_step_mm > 0.0)) {
    return b;
  }
  // The flat part's edge: a flat's rim, a bull-nose's torus bottom circle.
  b.rim_radius_mm = cutter.flat_radius_mm();
  if (!(b.rim_radius_mm > 0.0)) return b;
  const double pair = b.rim_radius_mm * mark_step_mm;  // repeat x partner of one beat pair
  b.limit_mm = std::sqrt(pair);
  b.partner_stepover_mm = pair / repeat_mm;
  b.possible = repeat_mm < b.limit_mm;
  return b;
}

}  // namespace cuspmap

// Circle marks: milling feed-per-tooth marks and turning feed marks, exact and approximate.
// Inputs: circle radius and spacing (mm); output: CuspResult (um).
// Method: Boothroyd & Knight (ideal surface roughness, round-nosed tool): Rt = f^2/(8r) and
// Ra = f^2/(18 sqrt 3 r) are the parabolic forms of the exact arc profile computed here.
#include "cusp/feed_mark.h"

#include <cassert>

#include "core/units.h"
#include "cusp/scallop_ball.h"

namespace cuspmap {

CuspResult feed_mark(double radius_mm, double spacing_mm) {
  assert(radius_mm > 0.0 && spacing_mm > 0.0 && spacing_mm <= 2.0 * radius_mm &&
         "circle marks need r > 0 and 0 < f <= 2r");
  CuspResult r;
  r.stepover_mm = spacing_mm;
  r.chord_mm = spacing_mm;
  r.scallop_um = scallop_ball_mm(radius_mm, spacing_mm) * kUmPerMm;
  r.stats = arc_cusp_stats(radius_mm, 0.5 * spacing_mm, 0.0);
  r.scallop_approx_um = spacing_mm * spacing_mm / (8.0 * radius_mm) * kUmPerMm;
  r.stats_approx = parabolic_cusp_stats(r.scallop_approx_um);
  r.effective_radius_mm = radius_mm;
  return r;
}

}  // namespace cuspmap

// Bull-nose and flat end-mill cusp on a level floor, closed form.
// Inputs: R, rc, stepover (mm); output: CuspResult (um).
// Method: the swept section of a bull-nose is a flat of half-width R - rc between two corner
// arcs of radius rc; neighbouring sections meet on their arcs once s/2 exceeds R - rc.
#include "cusp/scallop_bullnose.h"

#include <algorithm>
#include <cassert>
#include <cmath>

#include "core/units.h"
#include "cusp/scallop_ball.h"

namespace cuspmap {

double scallop_bullnose_mm(double radius_mm, double corner_radius_mm, double stepover_mm) {
  assert(corner_radius_mm >= 0.0 && corner_radius_mm <= radius_mm && stepover_mm > 0.0 &&
         stepover_mm <= 2.0 * radius_mm && "bull-nose domain");
  const double reach = 0.5 * stepover_mm - (radius_mm - corner_radius_mm);
  if (reach <= 0.0 || corner_radius_mm == 0.0) return 0.0;
  return scallop_ball_mm(corner_radius_mm, std::min(2.0 * reach, 2.0 * corner_radius_mm));
}

double bullnose_stepover_for_scallop_mm(double radius_mm, double corner_radius_mm,
                                        double scallop_mm) {
  assert(scallop_mm >= 0.0 && scallop_mm <= corner_radius_mm && "bull-nose cusp domain");
  return 2.0 * (radius_mm - corner_radius_mm) +
         ball_chord_for_scallop_mm(corner_radius_mm, scallop_mm);
}

CuspResult scallop_bullnose(double radius_mm, double corner_radius_mm, double stepover_mm) {
  assert(stepover_mm > 0.0 && stepover_mm < 2.0 * radius_mm && "overlapping passes");
  CuspResult r;
  r.stepover_mm = stepover_mm;
  r.chord_mm = stepover_mm;
  r.scallop_um = scallop_bullnose_mm(radius_mm, corner_radius_mm, stepover_mm) * kUmPerMm;
  const double reach = 0.5 * stepover_mm - (radius_mm - corner_radius_mm);
  if (reach > 0.0 && corner_radius_mm > 0.0) {
    // Half-chord of each corner arc, and the flat each pass leaves between them.
    r.stats = arc_cusp_stats(corner_radius_mm, reach, stepover_mm - 2.0 * reach);
  }
  return r;
}

}  // namespace cuspmap

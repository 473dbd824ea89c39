// Ball end-mill cusp on level and sloped floors, closed form.
// Inputs: ball radius, plan-view stepover (mm), slope (deg); output: CuspResult (um).
// Method: circle geometry of neighbouring ball sections (handbook cusp formula); the contacts
// lie stepover / cos(slope) apart along a sloped floor because the ball centres stay R above it.
#include "cusp/scallop_ball.h"

#include <algorithm>
#include <cassert>
#include <cmath>
#include <numbers>

#include "core/units.h"

namespace cuspmap {

double scallop_ball_mm(double radius_mm, double chord_mm) {
  assert(radius_mm > 0.0 && chord_mm >= 0.0 && chord_mm <= 2.0 * radius_mm && "circle cusp");
  const double half = 0.5 * chord_mm;
  return half * half / (radius_mm + std::sqrt(std::max(0.0, radius_mm * radius_mm - half * half)));
}

double ball_chord_for_scallop_mm(double radius_mm, double scallop_mm) {
  assert(radius_mm > 0.0 && scallop_mm >= 0.0 && scallop_mm <= radius_mm && "circle cusp");
  return 2.0 * std::sqrt(scallop_mm * (2.0 * radius_mm - scallop_mm));
}

double ball_sphere_limit_mm(double radius_mm, double slope_deg) {
  // The cusp sits at angle alpha + theta from the ball's lowest point, sin(theta) = c / (2R);
  // it stays below the equator while alpha + theta <= 90 deg, i.e. c <= 2R cos(alpha).
  const double c = std::cos(slope_deg * std::numbers::pi / 180.0);
  return 2.0 * radius_mm * c * c;
}

CuspResult scallop_ball(double radius_mm, double stepover_mm, double slope_deg) {
  assert(stepover_mm > 0.0 &&
         stepover_mm <= ball_sphere_limit_mm(radius_mm, slope_deg) * (1.0 + 1e-12) &&
         "closed form holds while the cusp lies on the sphere");
  CuspResult r;
  r.stepover_mm = stepover_mm;
  r.chord_mm =
      std::min(2.0 * radius_mm, stepover_mm / std::cos(slope_deg * std::numbers::pi / 180.0));
  r.scallop_um = scallop_ball_mm(radius_mm, r.chord_mm) * kUmPerMm;
  r.stats = arc_cusp_stats(radius_mm, 0.5 * r.chord_mm, 0.0);
  return r;
}

}  // namespace cuspmap

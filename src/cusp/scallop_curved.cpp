// Ball end-mill cusp on convex and concave cylinders, exact circle intersection.
// Inputs: R, rho, stepover along the surface (mm); output: CuspResult (um).
// Method: a ray at angle delta from a tool's contact meets its circle (centre on radius A) where
// h^2 -+ 2 B h + c0 = 0 (see scallop_curved.h); the cusp is at delta = phi / 2.
#include "cusp/scallop_curved.h"

#include <algorithm>
#include <cassert>
#include <cmath>
#include <limits>
#include <numbers>
#include <vector>

#include "core/units.h"

namespace cuspmap {
namespace {

// At the reach the discriminant is zero in exact arithmetic; rounding may leave it a few ulps
// negative, which this fraction of B^2 absorbs (far below any cusp that matters).
constexpr double kDiscRelTol = 1e-12;

// Height along the normal at angle delta from one tool's contact, mm: the near intersection of
// the ray with the tool circle (convex) or the far one (concave). Infinite where the ray misses.
double ray_height_mm(double big_r, double rho, bool convex, double delta) {
  const double centre = convex ? rho + big_r : rho - big_r;
  const double sh = std::sin(0.5 * delta);
  const double sigma = sh * sh;
  const double c0 = 4.0 * rho * centre * sigma;
  const double b = convex ? big_r - 2.0 * centre * sigma : big_r + 2.0 * centre * sigma;
  const double disc = b * b - c0;
  if (disc < -kDiscRelTol * b * b) return std::numeric_limits<double>::infinity();
  return c0 / (b + std::sqrt(std::max(0.0, disc)));
}

}  // namespace

double curved_reach_mm(double radius_mm, double surface_radius_mm, bool convex) {
  const double rho = surface_radius_mm;
  if (convex) return 2.0 * rho * std::asin(radius_mm / (rho + radius_mm));
  assert(rho > radius_mm && "a ball fits a concave radius only when rho > R");
  const double ratio = radius_mm / (rho - radius_mm);
  return 2.0 * rho * (ratio >= 1.0 ? 0.5 * std::numbers::pi : std::asin(ratio));
}

double scallop_curved_mm(double radius_mm, double surface_radius_mm, bool convex,
                         double stepover_mm) {
  assert(radius_mm > 0.0 && surface_radius_mm > 0.0 && stepover_mm >= 0.0 && "curved domain");
  const double delta =
      std::min(stepover_mm, curved_reach_mm(radius_mm, surface_radius_mm, convex)) /
      (2.0 * surface_radius_mm);
  return ray_height_mm(radius_mm, surface_radius_mm, convex, delta);
}

double curved_stepover_for_scallop_mm(double radius_mm, double surface_radius_mm, bool convex,
                                      double scallop_mm) {
  const double big_r = radius_mm, rho = surface_radius_mm, h = scallop_mm;
  const double centre = convex ? rho + big_r : rho - big_r;
  const double sigma = h * (2.0 * big_r - h) / (4.0 * centre * (convex ? rho + h : rho - h));
  assert(sigma >= 0.0 && sigma <= 1.0 && "target within the circles' reach");
  return 4.0 * rho * std::asin(std::sqrt(sigma));
}

CuspResult scallop_curved(double radius_mm, double surface_radius_mm, bool convex,
                          double stepover_mm) {
  assert(stepover_mm > 0.0 && "stepover must be positive");
  CuspResult r;
  r.stepover_mm = stepover_mm;
  r.chord_mm = stepover_mm;
  const double big_r = radius_mm, rho = surface_radius_mm;
  if (!convex && rho <= big_r) {
    r.limit = CuspLimit::ToolTooLargeForConcave;
    return r;
  }
  const double reach = curved_reach_mm(big_r, rho, convex);
  if (stepover_mm > reach) r.limit = CuspLimit::PassesDoNotOverlap;
  // Half a period: tool 0's arc from its contact up to the cusp (or to the reach, then the
  // uncut strip at that height when the circles no longer meet).
  const double half = 0.5 * stepover_mm, half_reach = 0.5 * std::min(stepover_mm, reach);
  auto arc = [big_r, rho, convex](double x) { return ray_height_mm(big_r, rho, convex, x / rho); };
  const double top = arc(half_reach);
  std::vector<CuspArcPiece> pieces{{0.0, half_reach, 0.0, top, arc}};
  if (half > half_reach)
    pieces.push_back({half_reach, half, top, top, [top](double) { return top; }});
  r.scallop_um = top * kUmPerMm;
  r.stats = periodic_profile_stats(pieces, 1.0, 0.0);
  return r;
}

}  // namespace cuspmap

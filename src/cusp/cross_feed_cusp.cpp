// Dispatch of the cross-feed cusp to its exact closed form or the sloped-plane solver, plus the
// small-stepover approximation. Inputs: CuspSetup, stepover (mm); output: CuspResult (um).
// Method: see cross_feed_cusp.h; each branch names its source in the file it calls.
#include "cusp/cross_feed_cusp.h"

#include <algorithm>
#include <cassert>
#include <cmath>
#include <numbers>

#include "core/units.h"
#include "cusp/scallop_ball.h"
#include "cusp/scallop_bullnose.h"
#include "cusp/scallop_curved.h"
#include "cusp/scallop_plane.h"
#include "cusp/scallop_tilted.h"

namespace cuspmap {
namespace {

CuspResult exact_on_plane(const Cutter& c, double s, double slope_deg) {
  const double big_r = c.radius_mm();
  if (c.shape == CutterShape::Ball) {
    if (s <= ball_sphere_limit_mm(big_r, slope_deg) && s < 2.0 * big_r) {
      return scallop_ball(big_r, s, slope_deg);
    }
    return scallop_on_plane(c, s, slope_deg);
  }
  if (slope_deg == 0.0 && s < 2.0 * big_r) {
    return scallop_bullnose(big_r, c.effective_corner_mm(), s);
  }
  return scallop_on_plane(c, s, slope_deg);
}

// Small-stepover approximation and effective radius on a plane.
void approximate_on_plane(const Cutter& c, double slope_deg, CuspResult& r) {
  const double big_r = c.radius_mm(), rc = c.effective_corner_mm();
  const double s = r.stepover_mm, chord = r.chord_mm;
  if (c.shape == CutterShape::Ball) {
    r.effective_radius_mm = big_r;
    r.scallop_approx_um = chord * chord / (8.0 * big_r) * kUmPerMm;
    r.stats_approx = parabolic_cusp_stats(r.scallop_approx_um);
    return;
  }
  if (slope_deg == 0.0) {
    // Level floor: the corner arcs meet only beyond the flat width 2(R - rc).
    const double reach = 0.5 * s - (big_r - rc);
    if (reach <= 0.0 || rc == 0.0) return;  // the flat faces finish the floor
    r.effective_radius_mm = rc;
    r.scallop_approx_um = reach * reach / (2.0 * rc) * kUmPerMm;
    r.stats_approx = parabolic_cusp_stats(r.scallop_approx_um, std::min(1.0, 2.0 * reach / s));
    return;
  }
  if (rc == 0.0) {
    // A sharp corner on a slope leaves a saw-tooth of height s sin(slope): linear in s, exact,
    // no small-stepover series to show beside it.
    r.effective_radius_mm = 0.0;
    r.scallop_approx_um = r.scallop_um;
    r.stats_approx = r.stats;
    return;
  }
  // On a slope the contact lies on the corner arc, so the arcs of radius rc form small cusps.
  r.effective_radius_mm = rc;
  r.scallop_approx_um = chord * chord / (8.0 * rc) * kUmPerMm;
  r.stats_approx = parabolic_cusp_stats(r.scallop_approx_um);
}

}  // namespace

CuspResult cross_feed_cusp(const CuspSetup& setup, double stepover_mm) {
  assert(stepover_mm > 0.0 && "stepover must be positive");
  const Cutter& c = setup.cutter;
  if (c.tilt_deg != 0.0) {
    assert(setup.surface == SurfaceKind::Plane && setup.slope_deg == 0.0 &&
           "a tilted cutter's cusp is modelled on a level floor");
    return scallop_tilted(c, stepover_mm);
  }
  if (setup.surface == SurfaceKind::Plane) {
    CuspResult r = exact_on_plane(c, stepover_mm, setup.slope_deg);
    approximate_on_plane(c, setup.slope_deg, r);
    return r;
  }
  assert(c.shape == CutterShape::Ball && "cylinder closed forms hold for ball cutters");
  const bool convex = setup.surface == SurfaceKind::Convex;
  const double big_r = c.radius_mm(), rho = setup.surface_radius_mm;
  CuspResult r = scallop_curved(big_r, rho, convex, stepover_mm);
  if (r.limit == CuspLimit::ToolTooLargeForConcave) return r;
  const double curvature = 1.0 / big_r + (convex ? 1.0 : -1.0) / rho;
  r.effective_radius_mm = 1.0 / curvature;  // R rho / (rho +- R)
  r.scallop_approx_um = stepover_mm * stepover_mm / 8.0 * curvature * kUmPerMm;
  r.stats_approx = parabolic_cusp_stats(r.scallop_approx_um);
  return r;
}

}  // namespace cuspmap

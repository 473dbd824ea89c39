// Exact cusp of any revolving end mill (ball, bull-nose, flat; vertical axis) on a plane sloped
// across the pass, at any plan-view stepover: height along the normal, Ra/Rq/Rz, limits. mm, um.
// Method: swept-section crossing (DESIGN.md "Geometry"), bisection to 1e-15 of the stepover.
// Cost: ~60 section evaluations for the height, ~10^4 for the statistics.
#pragma once

#include "cusp/cusp_setup.h"
#include "tool/cutter.h"

namespace cuspmap {

// The swept section of a revolving cutter is its lower profile p(|y|) (the dish does not change
// it: the lowest ring sweeps every chord) with vertical sides at |y| = R. Relative to the surface
// line its height is convex with its minimum at the contact, so the cusp is the unique crossing
// of two neighbouring sections.

/// Exact cusp between neighbouring straight passes of `cutter` on a plane of slope `slope_deg`.
/// Fills stepover, chord, scallop, stats, limit (PassesDoNotOverlap when s >= D: the height is
/// then the lower bound set by the sections' rims), side_forms_cusp and profile_overhangs.
/// @param[in] cutter       shape, diameter, corner radius (validated); dish, teeth ignored
/// @param[in] stepover_mm  plan-view stepover s > 0
/// @param[in] slope_deg    |slope| < 90 (the sign does not matter)
/// @return a zero cusp when the flat faces of neighbouring passes overlap on a level floor.
CuspResult scallop_on_plane(const Cutter& cutter, double stepover_mm, double slope_deg);

}  // namespace cuspmap

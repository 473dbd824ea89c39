// Cross-feed cusp of straight parallel passes of a tilted (trammed-off) end mill on a level floor:
// the swept section across the feed is the lower edge of the tilted lowest ring's projection, an
// ellipse of semi-axes a and a tan(tau)|cos(phi)| sheared by tan(tau) sin(phi) y (a = R flat end,
// R - rc bull-nose), joined to the corner's own sections. Inputs mm, deg; output CuspResult (um).
// Method: first-order tilt p(|v|) - tan(tau) v.n (DESIGN.md "Geometry"), chord minimum per lateral
// offset (tool/chord_min), crossing of neighbouring sections by bisection; derived here.
#pragma once

#include "cusp/cusp_setup.h"
#include "tool/cutter.h"

namespace cuspmap {

/// Height of the swept section of one straight pass of the tilted cutter at lateral offset y
/// (to the left of the feed), relative to the untilted tip height, mm; +infinity for |y| > R.
/// @param[in] cutter  validated; tilt_toward_deg is measured from the feed direction, ccw
/// @param[in] y_mm    lateral offset from the pass axis
double tilted_section_mm(const Cutter& cutter, double y_mm);

/// Exact cusp (peak-to-valley of the periodic floor across the passes) of a tilted cutter and
/// the Ra/Rq/Rz of that profile; the approximation beside it is the parabola of the section's
/// curvature at the floor's lowest point (effective radius a cos^2(phi)/tan(tau) on the rim
/// ellipse), absent when the lowest point is at the rim (a saw-tooth across the feed).
/// One-way and zigzag passes leave the same section (reversing the feed keeps |cos(phi)| and the
/// lateral term).
/// @param[in] cutter       validated, tilt_deg != 0; tilt_toward_deg from the feed direction
/// @param[in] stepover_mm  0 < s <= D (s >= D sets limit PassesDoNotOverlap; beyond D the
///                         height is left 0: uncut strips, no cusp)
CuspResult scallop_tilted(const Cutter& cutter, double stepover_mm);

}  // namespace cuspmap

// Cusp of a ball end mill on a convex or concave cylinder (axis along the feed, stepover along the
// surface): where neighbouring tool circles (centres on rho + R or rho - R) meet, height along
// the normal from the nominal radius. Lengths mm, heights um.
// Method: circle-intersection scallop geometry (Lin & Koren 1996, Int. J. Mach. Tools Manuf.).
#pragma once

#include "cusp/cusp_setup.h"

namespace cuspmap {

// The ball is treated as a full sphere: valid where the cusp lies on the ball's lower half (near
// the crown, or with the tool axis along the surface normal as on five-axis machines).

/// Exact cusp height, mm, of a ball on a cylinder, between contacts `stepover_mm` apart along the
/// surface. Written as c0 / (B + sqrt(B^2 - c0)), c0 = 4 rho A sin^2(phi/4),
/// B = R -+ 2 A sin^2(phi/4), A = rho +- R, phi = s / rho, so tiny cusps keep full precision.
/// @param[in] radius_mm          R > 0
/// @param[in] surface_radius_mm  rho > 0 (concave: rho > R)
/// @param[in] convex             true: cutter outside the cylinder; false: inside
/// @param[in] stepover_mm        0 < s <= curved_reach_mm(...)
double scallop_curved_mm(double radius_mm, double surface_radius_mm, bool convex,
                         double stepover_mm);

/// Largest stepover along the surface at which neighbouring tool circles still meet:
/// 2 rho asin(R / (rho + R)) convex; 2 rho min(asin(R / (rho - R)), pi/2) concave (rho > R).
double curved_reach_mm(double radius_mm, double surface_radius_mm, bool convex);

/// Closed-form inverse: stepover along the surface that leaves cusp h, from
/// sin^2(phi/4) = h (2R - h) / (4 A (rho + h)) convex, h (2R - h) / (4 A (rho - h)) concave.
/// @param[in] scallop_mm  0 <= h < the cusp at curved_reach_mm (caller checks)
double curved_stepover_for_scallop_mm(double radius_mm, double surface_radius_mm, bool convex,
                                      double scallop_mm);

/// Exact cusp and Ra/Rq/Rz of the profile (radial height against arc length on the nominal
/// cylinder) of a ball on a convex or concave cylinder. Fills stepover, chord, scallop, stats and
/// limit: ToolTooLargeForConcave (rho <= R, zero cusp reported) or PassesDoNotOverlap (beyond
/// curved_reach_mm; the height is then the lower bound at the reach).
CuspResult scallop_curved(double radius_mm, double surface_radius_mm, bool convex,
                          double stepover_mm);

}  // namespace cuspmap

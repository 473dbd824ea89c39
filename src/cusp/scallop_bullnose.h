// Cusp left by a bull-nose end mill (corner radius rc) or a flat end mill (rc = 0) between
// neighbouring passes on a level floor: none while the flat faces overlap, s <= 2(R - rc); beyond,
// the corner arcs meet at h = rc - sqrt(rc^2 - (s/2 - (R - rc))^2). Lengths mm, heights um.
// Method: DESIGN.md "Closed forms" (bull-nose; flat end); corner circle geometry as for a ball.
#pragma once

#include "cusp/cusp_setup.h"

namespace cuspmap {

/// Cusp height on a level floor, mm: 0 for s <= 2(R - rc), else the corner-arc formula.
/// @param[in] radius_mm         R > 0
/// @param[in] corner_radius_mm  rc in [0, R] (0: flat end mill, R: ball)
/// @param[in] stepover_mm       s in (0, 2R]
double scallop_bullnose_mm(double radius_mm, double corner_radius_mm, double stepover_mm);

/// Inverse for h in [0, rc]: s = 2(R - rc) + 2 sqrt(h (2 rc - h)) (the largest stepover that
/// leaves at most h; h = 0 gives the flat width).
double bullnose_stepover_for_scallop_mm(double radius_mm, double corner_radius_mm,
                                        double scallop_mm);

/// Exact cusp of a bull-nose or flat end mill on a level floor, with Ra/Rq/Rz of the profile of
/// corner arcs and flats. Fills stepover, chord, scallop, stats.
/// @param[in] radius_mm, corner_radius_mm  as above
/// @param[in] stepover_mm  0 < s < 2R
CuspResult scallop_bullnose(double radius_mm, double corner_radius_mm, double stepover_mm);

}  // namespace cuspmap

// Cusp of a ball end mill between neighbouring passes on a level or sloped floor,
// h = R - sqrt(R^2 - (c/2)^2) with contact spacing c = stepover / cos(slope), and its inverse.
// Method: handbook cusp-height formula (Machinery's Handbook, ball end mill cusp height);
// slope: DESIGN.md "Closed forms" (s / cos(alpha) along the surface). Lengths mm, heights um.
#pragma once

#include "cusp/cusp_setup.h"

namespace cuspmap {

/// Height of the cusp between two circles of radius R whose lowest points lie c apart on a line:
/// R - sqrt(R^2 - (c/2)^2), evaluated as (c/2)^2 / (R + sqrt(...)) so tiny cusps stay exact.
/// @param[in] radius_mm  R > 0
/// @param[in] chord_mm   c in [0, 2R]
/// @return cusp height, mm
double scallop_ball_mm(double radius_mm, double chord_mm);

/// Inverse of scallop_ball_mm: c = 2 sqrt(h (2R - h)).
/// @param[in] radius_mm   R > 0
/// @param[in] scallop_mm  h in [0, R]
/// @return contact spacing c, mm
double ball_chord_for_scallop_mm(double radius_mm, double scallop_mm);

/// Largest plan-view stepover on a plane of slope alpha for which the cusp still lies on the
/// ball below its equator, 2R cos^2(alpha); beyond it the cutter's cylindrical side bounds the
/// cusp and scallop_on_plane() applies. Equals D on a level floor.
double ball_sphere_limit_mm(double radius_mm, double slope_deg);

/// Exact cusp of a ball end mill (vertical axis) on a plane sloped across the pass: height along
/// the normal and Ra/Rq/Rz of the circular-arc profile. Fills stepover, chord, scallop, stats.
/// @param[in] radius_mm    R > 0
/// @param[in] stepover_mm  plan-view stepover, 0 < s <= ball_sphere_limit_mm(R, slope)
/// @param[in] slope_deg    |slope| < 90
CuspResult scallop_ball(double radius_mm, double stepover_mm, double slope_deg);

}  // namespace cuspmap

// The cross-feed cusp for any supported cutter and surface, exact (closed form or sloped-plane
// solver) with the small-stepover approximation and effective radius beside it. mm in, um out.
// Method: DESIGN.md "Closed forms"; h ~ c^2/(8 R_eff), R_eff = R, rc, R rho/(rho +- R) (Lin &
// Koren 1996 small-stepover limit); bull-nose (s/2 - (R - rc))^2/(2 rc); a tilted cutter on a
// level floor: scallop_tilted.h (the tilted rim's ellipse).
#pragma once

#include "cusp/cusp_setup.h"

namespace cuspmap {

/// Exact cusp and its small-stepover approximation for `setup` at one stepover.
/// @param[in] setup        validated: cylinders only with a ball cutter; |slope| < 90 deg; a
///                         tilted cutter (tilt_deg != 0, direction from the feed) on a level
///                         plane only
/// @param[in] stepover_mm  s > 0 (plan view on planes, along the surface on cylinders)
/// @return all CuspResult fields. A flat end mill on a level floor gives a zero cusp (s < D)
///         and no effective radius; the limit field flags answers outside the model.
CuspResult cross_feed_cusp(const CuspSetup& setup, double stepover_mm);

}  // namespace cuspmap

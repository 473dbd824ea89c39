// Height parameters (Sz, Sv, Sp, Sa, Ra) of the ideal cusp profile a raster of parallel passes
// leaves on a flat floor, in closed form (exact circle arcs, no parabolic approximation).
// Inputs: Cutter (mm, deg), stepover mm; output: SurfaceHeights in um. Cost O(1).
// Method: cusp geometry of DESIGN.md "Closed forms" (handbook scallop h = R - sqrt(R^2-(s/2)^2));
// mean and Ra by integrating the circle arc, int sqrt(c^2-u^2) du = (u sqrt(c^2-u^2) + c^2
// asin(u/c))/2.
#pragma once

#include "finish/surface_heights.h"
#include "tool/cutter.h"

namespace cuspmap {

/// Which closed form describes the cross-feed profile of a cutter.
enum class CuspProfileKind {
  Circle,      ///< ball: circle arcs of radius R
  FlatAndArc,  ///< bull-nose: flat of half-width R - rc (dish makes no difference), arcs of rc
  TiltedRim,   ///< flat end with tilt along the feed: arcs of R scaled by tan(tilt)
  Level,       ///< flat end without tilt: the rim sweeps a level floor, no cross-feed cusp
};

/// The closed form chosen for a cutter: the profile of one period is
/// z(y) = scale * (c - sqrt(c^2 - (|y| - w)^2)) for |y| > w, 0 for |y| <= w, |y| <= s/2.
struct CuspProfile {
  CuspProfileKind kind = CuspProfileKind::Circle;  ///< which closed form
  double flat_half_width_mm = 0.0;  ///< w: half-width of the level band under the pass
  double arc_radius_mm = 0.0;       ///< c: radius of the arcs beyond the band
  double scale = 1.0;               ///< vertical scale: 1, or tan(tilt) for a tilted flat end
};

/// Picks the closed form for a cutter on a flat floor with a vertical axis (ball tilt-invariant;
/// bull-nose tilt ignored; flat-end tilt taken as lying along the feed, the worst direction
/// for the front rim: a tilt across the feed leaves a sawtooth the analytic model does not
/// cover, simulate it).
/// @param[in] cutter  validated cutter
CuspProfile cusp_profile(const Cutter& cutter);

/// Exact height parameters of the periodic cusp profile (extruded along the feed).
/// @param[in] cutter       validated cutter
/// @param[in] stepover_mm  distance between passes, 0 < s <= D (asserted)
/// @return sz = scallop height h; sv = mean - min; sp = h - sv; sa = ra = mean |z - mean|.
///         In the parabolic limit (s << R) for a ball: sv -> h/3, sp -> 2h/3,
///         ra -> 4h/(9 sqrt 3). All zero for a level profile or s <= 2w.
SurfaceHeights cusp_profile_heights(const Cutter& cutter, double stepover_mm);

}  // namespace cuspmap

// Marks of a circle of radius r stepped f apart: the feed-per-tooth marks of a ball (r = R) or a
// bull-nose corner (r = rc) along the feed, and the feed marks a turning insert's nose radius
// leaves per revolution. Exact height r - sqrt(r^2 - (f/2)^2), Ra/Rq of the arc profile, and the
// classical approximations Rt = f^2/(8r), Ra = f^2/(18 sqrt(3) r). Lengths mm, heights um.
// Method: Boothroyd & Knight, Fundamentals of Machining and Machine Tools (ideal roughness of a
// round-nosed tool); ball feed mark as in DESIGN.md "Closed forms".
#pragma once

#include "cusp/cusp_setup.h"

namespace cuspmap {

/// Marks left by a circle of radius r whose successive positions lie f apart.
/// Fills stepover (= f), chord, scallop (exact), stats (exact arc profile), the approximations
/// (f^2/(8r) and its parabolic Ra/Rq) and effective_radius (= r).
/// @param[in] radius_mm   r > 0: ball radius, corner radius or insert nose radius
/// @param[in] spacing_mm  0 < f <= 2r: feed per tooth (milling) or per revolution (turning);
///                        f = 2r is the limit where successive marks just touch (callers
///                        reject it and anything larger as input)
CuspResult feed_mark(double radius_mm, double spacing_mm);

}  // namespace cuspmap

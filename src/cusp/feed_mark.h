// Marks of a circle of radius r stepped f apart: ball (r = R) or bull-nose corner (r = rc) feed
// marks per tooth, turning feed marks per revolution. Exact r - sqrt(r^2 - (f/2)^2) and arc Ra/Rq,
// approximations Rt = f^2/(8r), Ra = f^2/(18 sqrt 3 r). Lengths mm, heights um.
// Method: Boothroyd & Knight, Fundamentals of Machining and Machine Tools (round-nosed tool).
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

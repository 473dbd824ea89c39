// Clips a 2-D segment to an axis-aligned box: the parameter interval [t0, t1] of the part inside.
// Inputs: end points and box (any consistent unit); output: t0, t1 in [0, 1].
// Method: Liang & Barsky, "A new concept and method for line clipping", ACM TOG 3(1), 1984.
#pragma once

namespace cuspmap {

/// @param[in] x0, y0, x1, y1  segment from (x0, y0) at t = 0 to (x1, y1) at t = 1
/// @param[in] lo_x, hi_x, lo_y, hi_y  the box (lo <= hi)
/// @param[out] t0, t1  the visible part, 0 <= t0 <= t1 <= 1, when the result is true
/// @return false when no part of the segment lies in the box
bool clip_segment(double x0, double y0, double x1, double y1, double lo_x, double hi_x,
                  double lo_y, double hi_y, double& t0, double& t1);

}  // namespace cuspmap

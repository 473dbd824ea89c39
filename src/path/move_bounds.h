// Axis-aligned XY bounding box of a move, or of the part of it between two parameters: lines by
// their ends, arcs by their ends plus the quadrant points (0, 90, 180, 270 deg) they pass.
// Inputs mm; output mm. Cost O(1) per move (O(turns) for multi-turn arcs, at most 4 per turn).
// Method: circle geometry (an arc's extreme X and Y lie at its ends or at quadrant points).
#pragma once

#include <Eigen/Core>

#include "path/move.h"

namespace cuspmap {

/// XY box: lo = (min x, min y), hi = (max x, max y).
struct BoxXY {
  Eigen::Vector2d lo_mm{0, 0};  ///< lower-left corner
  Eigen::Vector2d hi_mm{0, 0};  ///< upper-right corner
};

/// Bounding box of the tip's XY path for the parameters t in [t0, t1] (0 <= t0 <= t1 <= 1,
/// the constant-speed parameter of move_point_mm).
/// @param[in] move  line or arc
BoxXY move_bounds_xy(const Move& move, double t0 = 0.0, double t1 = 1.0);

}  // namespace cuspmap

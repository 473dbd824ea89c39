// Machine time of a finishing path: every move at its feed (rapids at their rapid rate) plus a
// fixed overhead per finishing pass for what a constant-feed estimate leaves out (acceleration,
// direction changes, settling). Lengths mm, times s. Cost O(moves).
// Method: time = sum(length / feed) + passes x overhead (DESIGN.md "Finish decisions").
#pragma once

#include "path/move.h"

namespace cuspmap {

/// Per-pass overhead used when the user gives none, s. Default, no source: a plausible half
/// second for deceleration, reversal or lift and acceleration on a small machining centre.
inline constexpr double kDefaultPassOverheadS = 0.5;

/// Machine time of one option's path.
struct MachineTime {
  int passes = 0;               ///< finishing passes (horizontal feed moves along the raster)
  double path_length_mm = 0.0;  ///< length of all moves (feed and rapid), mm
  double cycle_time_s = 0.0;    ///< feed moves at their feed, rapids at their rapid rate, s
  double overhead_s = 0.0;      ///< passes x per-pass overhead, s
  double machine_time_s = 0.0;  ///< cycle_time_s + overhead_s
};

/// Times a raster path.
/// @param[in] path             moves in order (every move's feed > 0)
/// @param[in] pass_angle_deg   direction of the raster passes from +X, ccw, deg; a pass is a
///                             non-rapid straight move at constant Z parallel to it (zigzag links
///                             across the passes, retracts and plunges are not passes)
/// @param[in] pass_overhead_s  overhead per pass, s, >= 0
/// @return all zero for an empty path.
MachineTime toolpath_machine_time(const Toolpath& path, double pass_angle_deg,
                                  double pass_overhead_s);

}  // namespace cuspmap

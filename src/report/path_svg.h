// Draws a toolpath in plan view over the floor outline as SVG: the patch rectangle, the offset
// boundary (when given), feed moves at the cutting height as solid lines and exact arcs, moves
// above the floor (links, retracts, rapids) dashed, and the start marked. Pure text encoder.
// Inputs: Toolpath and Patch in mm; output SVG text (1 user unit = 1 mm, Y up). Cost O(moves).
// Method: SVG 1.1 (W3C Recommendation, 2011) path data, elliptical-arc command for arcs.
#pragma once

#include <Eigen/Core>
#include <string>
#include <vector>

#include "core/heightfield.h"
#include "path/move.h"

namespace cuspmap {

/// The picture. Deterministic text, no external resources.
/// @param[in] path         moves in order (empty: the outline only)
/// @param[in] patch        the floor simulated (outline drawn), mm
/// @param[in] boundary_mm  offset boundary polygon (empty: none drawn)
/// @param[in] floor_z_mm   moves whose tip stays at or below floor_z + 1 um are drawn solid
std::string encode_path_svg(const Toolpath& path, const Patch& patch,
                            const std::vector<Eigen::Vector2d>& boundary_mm, double floor_z_mm);

}  // namespace cuspmap

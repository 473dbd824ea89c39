// Raster finishing path: parallel straight passes, one-way or zigzag, at any angle.
// Inputs: PathSpec (stepover mm, angle deg, direction), CutSpec (feed, depth, retract), Patch,
// Cutter (lead-in/out of R beyond the patch). Output: Toolpath of lines (feed moves + links).
// Method: DESIGN.md raster contract (passes at y = k * stepover from the lower edge,
// k = 0 .. ceil(size_y / stepover), each from x = -R to size_x + R, at angle 0).
#pragma once

#include "core/heightfield.h"
#include "path/move.h"
#include "path/path_spec.h"
#include "tool/cutter.h"

namespace cuspmap {

/// Builds the raster. At angle_deg = 0 passes run along +X at y = origin_y + k * stepover;
/// at other angles the same pattern is rotated about the patch centre and extended so that the
/// passes cover the whole patch plus R. One-way passes are linked by a retract, a rapid back and
/// a plunge; zigzag passes by a feed move along the side, outside the patch.
/// @param[in] spec   kind must be Raster; stepover_mm > 0
/// @param[in] cut    feed (feed moves), rapid rate (links), depth (tip Z = floor_z + depth)
/// @param[in] patch  the floor region, mm
/// @param[in] cutter for the lead-in/out distance R
/// @param[in] margin_passes  >= 0 extra passes on each side of the patch across the lay,
///                           continuing the pattern (raster_margin_passes); 0 = the program
/// @return moves in execution order; rapids flagged.
Toolpath raster_path(const PathSpec& spec, const CutSpec& cut, const Patch& patch,
                     const Cutter& cutter, int margin_passes = 0);

/// Passes a floor window needs on each side across the lay so that its edge cells are cut by
/// every pass that reaches them: 0 when the cutter's lowest point lies on its axis (untilted,
/// no runout, an end that rises from the axis), else ceil((R + runout) / stepover).
/// @param[in] stepover_mm  > 0
int raster_margin_passes(double stepover_mm, const Cutter& cutter);

}  // namespace cuspmap

// Trochoidal finishing path: full-circle loops of a given diameter whose centres advance by a
// given pitch along parallel lanes (one-way or zigzag) at any angle; the floor shows the
// overlapping rim arcs that make such floors look swirled. Inputs mm, deg; output lines and
// arcs. Cost O(lanes x loops) = O(patch area / (stepover x advance)).
// Method: trochoidal milling path (circle + linear advance per loop; e.g. Otkur & Lazoglu,
// "Trajectory generation for trochoidal milling", Int. J. Mach. Tools Manuf. 47, 2007), with
// lanes laid out as DESIGN.md's raster contract.
#pragma once

#include "core/heightfield.h"
#include "path/move.h"
#include "path/path_spec.h"
#include "tool/cutter.h"

namespace cuspmap {

/// Builds the trochoidal path. In the lane frame (u at angle_deg from +X, v = u turned 90 deg
/// ccw), lanes lie at v = v_min + k stepover, k = 0 .. ceil((v_max - v_min) / stepover), where
/// [v_min, v_max] spans the patch's corners (at angle 0: y = origin_y + k stepover, as the
/// raster). Loop centres on a lane run from u_min - (R + rho) to at least u_max + R + rho in
/// steps of advance_mm (rho = loop radius), so the cutter enters and leaves the patch fully.
/// Each loop is one full-circle arc that starts and ends on the loop's side where the
/// connecting line (length advance_mm, along the lane) is tangent to both neighbouring circles.
/// Loops run counter-clockwise for climb milling with an M3 (cw) spindle (the front of each
/// loop, where it meets new material, then has that material on the cutter's right),
/// clockwise for conventional cutting or M4. Lanes are linked like the raster: one-way by
/// retract, rapid and plunge; zigzag by a feed line outside the patch.
/// @param[in] spec  stepover_mm (lane spacing) > 0, loop_diameter_mm (0 = D/2), advance_mm
///                  (0 = D/10), angle_deg, direction, climb
/// @param[in] cut    feed, rapid, depth, retract, spindle
/// @param[in] patch  the floor region; @param[in] cutter  for R and the defaults
/// @throws InputError naming the key when a value is negative or not finite, when lanes are
///         further apart than the swept width 2 (R + rho) (uncut strips), or when the path would
///         exceed kMaxPathMoves moves.
Toolpath trochoidal_path(const PathSpec& spec, const CutSpec& cut, const Patch& patch,
                         const Cutter& cutter);

}  // namespace cuspmap

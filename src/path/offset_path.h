// Offset (contour-parallel) finishing path: rings stepping inward from a boundary (the patch
// rectangle, or a closed polygon from the job), each ring a closed loop of lines and exact
// arcs, linked ring to ring, with centre passes along the spines of what the rings leave, so
// no area is left farther than s/2 from a pass. Inputs mm; output a Toolpath. Cost: see path/offset_rings.h, plus O(loops^2) ordering.
// Method: polygon offsetting with Clipper 6.4 (path/offset_rings.h); cutting direction from the
// up/down-milling geometry of the tooth's engagement (Altintas, Manufacturing Automation, 2nd
// ed. 2012, ch. 2: in down (climb) milling the chip starts thick, in up milling thin).
#pragma once

#include "core/heightfield.h"
#include "path/move.h"
#include "path/path_spec.h"
#include "tool/cutter.h"

namespace cuspmap {

/// Builds the offset path.
/// Rings: ring k is the boundary offset inward by e + k stepover, e = R for a wall edge (ring 0:
/// the tool's edge touches the wall) or 0 for an open edge (ring 0 on the boundary), until
/// nothing is left; corners about reflex boundary vertices are arcs; where rings split, each
/// part is its own ring. Centre passes: the spine (medial axis, path/offset_rings.h) of every
/// part of the tool-centre region farther than s/2 from all rings, as polylines within
/// kOffsetArcToleranceMm.
/// Order: from the boundary inward, depth first (a ring's inner rings follow it before its
/// siblings), each loop starting at its vertex nearest the tool; a ring's centre passes are cut
/// as detours (out, the spine, back) from the ring's vertex nearest to each. Links run as a
/// feed move at cutting depth when the straight link stays inside the tool-centre region
/// (ring 0), otherwise as retract, rapid and plunge.
/// Direction (derivation): a tooth of a cw (M3) spindle, seen from above, sweeps the cutter's
/// left side (relative to travel) from the back to the front, so on that side the chip starts
/// at zero thickness and grows (up, conventional milling), while on the right side it starts
/// thick and thins out (down, climb milling). Stepping inward, the uncut floor lies inside each
/// ring, so climb with M3 puts the inside on the right: rings run clockwise. Conventional
/// cutting, or an M4 spindle, reverses that (both together restore clockwise).
/// @param[in] spec   stepover_mm > 0, climb, boundary_mm (empty = the patch rectangle)
/// @param[in] cut    feed, rapid, depth, retract, spindle
/// @param[in] patch  the floor region (default boundary, floor Z); @param[in] cutter  for R
/// @throws InputError naming path.stepover (not > 0, or too many moves) or path.boundary
///         (fewer than 3 points, not finite, no area, or too narrow for the cutter).
/// Edge: spec.edge = Open puts ring 0's tool centre on the boundary (rings at k s; the cutter
/// overhangs an open face by R, as raster passes do); Wall puts it R inside (rings at R + k s).
/// @param[out] wall_region_mm  when not null and the edge is a wall: the region the tool centre
///                             may visit (cells outside it are the wall band); else left empty
Toolpath offset_path(const PathSpec& spec, const CutSpec& cut, const Patch& patch,
                     const Cutter& cutter,
                     std::vector<std::vector<Eigen::Vector2d>>* wall_region_mm = nullptr);

}  // namespace cuspmap

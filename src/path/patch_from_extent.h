// The patch a G-code program finishes when the job does not give one: the XY bounding box of the
// tip's path wherever a feed move runs on the floor. Inputs mm; output a Patch. Cost O(moves).
// Method: bounding boxes of lines and arcs (path/move_bounds.h), Z linear along each move.
#pragma once

#include "core/heightfield.h"
#include "path/move.h"

namespace cuspmap {

/// A feed move counts as "on the floor" where its tip is at most this far above floor_z. Posts
/// write Z with 3-4 decimals, so a floor pass sits within 0.001 mm of its nominal Z; 0.01 mm
/// adds room for finishing allowances of a few um (common practice, no source).
inline constexpr double kFloorContactBandMm = 0.01;

/// Patch spanning the tip's XY path over the parts of feed moves (rapids excluded) whose tip is
/// at or below floor_z_mm + kFloorContactBandMm. Lines and helices are clipped to that part
/// exactly (Z is linear along them); arcs contribute their ends and the quadrant points they
/// pass. The patch is the tip's box, not the cutter's: its edges are where the tip ran, so the
/// cutter fully covers it. A side shorter than cell_mm (a single straight pass) spans the
/// cutter's whole cut instead, grown by radius_mm each way: the slot the pass leaves, walls
/// included (one row of cells would report a flat floor and Ra 0).
/// @param[in] path        moves in program coordinates
/// @param[in] cell_mm     grid spacing of the result, > 0
/// @param[in] floor_z_mm  the nominal floor in program Z
/// @param[in] radius_mm   the cutter's radius R, > 0
/// @throws InputError "no feed move reaches the floor Z=<z> mm ..." when no move qualifies.
Patch patch_from_extent(const Toolpath& path, double cell_mm, double floor_z_mm,
                        double radius_mm);

}  // namespace cuspmap

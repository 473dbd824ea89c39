// Whether a move can leave marks on the simulated floor: its cutter comes within its own reach
// (the height of its lower end above the tip) of the floor while over the patch. Used to warn
// about rapids that cut. Inputs mm; output a yes/no. Cost O(1) per move.
// Method: DESIGN.md "Geometry" (p(r) lower surface, unimodal on [0, R]); Liang-Barsky segment
// clipping against the patch rectangle grown by the cutter's radius.
#pragma once

#include "core/heightfield.h"
#include "path/move.h"
#include "tool/cutter.h"

namespace cuspmap {

/// How far above its tip the cutter's lower end reaches, mm: max of p(r) over [0, R], which is
/// p(0) or p(R) because p is unimodal (R for a ball, rc for a bull-nose, R tan(dish) for a
/// dished flat), plus R tan|tilt| for a tilted axis.
/// @param[in] cutter  validated cutter
double cutter_reach_mm(const Cutter& cutter);

/// True when the move's tip passes below patch.floor_z_mm + cutter_reach_mm while its axis is
/// within R + runout of the patch rectangle (measured as a box grown by that distance, so a move
/// near a patch corner may count up to (sqrt 2 - 1) R early: a warning errs towards warning).
/// Lines are clipped exactly; arcs use their XY bounding box and their lower end Z (Z is linear
/// along a helix, so its minimum is at an end).
/// @param[in] move  line or arc, program coordinates
/// @param[in] patch  floor region; @param[in] cutter  validated cutter
bool move_reaches_floor(const Move& move, const Patch& patch, const Cutter& cutter);

}  // namespace cuspmap

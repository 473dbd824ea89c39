// Spiral finishing path: an Archimedean-like spiral of constant stepover built from tangent-
// continuous semicircles, from the patch centre out (or from outside in), covering the patch
// plus the cutter radius. Inputs mm, deg; output a Toolpath of arcs. Cost O(patch / stepover).
// Method: two-centre spiral of semicircles (centres a half-stepover apart on one line, radius
// growing by s/2 each half turn: the classic draughting construction of a spiral; see e.g.
// Lockwood, A Book of Curves, 1961, ch. 16 on the spiral of Archimedes).
#pragma once

#include "core/heightfield.h"
#include "path/move.h"
#include "path/path_spec.h"
#include "tool/cutter.h"

namespace cuspmap {

/// Largest radial distance, as a fraction of the stepover, between the two-centre spiral and
/// the Archimedean spiral of the same pitch about the centres' midpoint that passes through
/// the joints (radial distance from the midpoint at equal polar angle), over the whole path.
/// It is largest on the first half turn (0.091 s), falls to 0.060 s by the fourth and tends to
/// max|(1 - cos t)/2 - t/pi| / 2 = 0.0526 s far out (measured numerically; checked in
/// tests/path/spiral_path_test.cpp).
inline constexpr double kSpiralMaxDeviationFraction = 0.092;

/// Builds the spiral. Half turn n (n = 1, 2, ...) is a semicircle of radius n s/2 about
/// centre B = M + (s/4) u for odd n and A = M - (s/4) u for even n, where M is the patch centre
/// and u the unit vector at angle_deg: consecutive semicircles about one centre are concentric
/// and exactly s apart, the joints lie on the line through A and B, and every joint is tangent-
/// continuous (both arcs are perpendicular to that line there). The path starts at A, ends when
/// the last semicircles about both centres reach beyond every patch corner by R, and keeps the
/// cutter at floor_z + depth throughout; it plunges at its start and retracts at its end.
/// Rotation: the spiral runs so the uncut side is on the cutter's right for climb milling with
/// an M3 (cw) spindle: counter-clockwise outward, clockwise inward; conventional cutting or an
/// M4 spindle reverses it (both together restore it).
/// @param[in] spec   stepover_mm > 0, angle_deg (joint line direction), outward, climb
/// @param[in] cut    feed, rapid, depth, retract, spindle
/// @param[in] patch  the floor region; @param[in] cutter  for R
/// @throws InputError when stepover is not a positive finite number or the path would exceed
///         kMaxPathMoves moves.
Toolpath spiral_path(const PathSpec& spec, const CutSpec& cut, const Patch& patch,
                     const Cutter& cutter);

}  // namespace cuspmap

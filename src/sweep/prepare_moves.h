// Moves made ready for the sweep: patch-local XY (mm from the patch's lower-left corner), tip
// heights above the nominal floor, line frames, arc angles, spindle time and phase, reach boxes;
// moves that cannot touch the patch are dropped here. Cost O(moves).
// Method: RS-274 motion at constant programmed feed (NIST RS274NGC v3, Kramer et al. 2000); the
// spindle angle advances omega t through every move, rapids included.
#pragma once

#include <Eigen/Core>
#include <cstdint>
#include <vector>

#include "core/heightfield.h"
#include "path/move.h"
#include "path/path_spec.h"
#include "tool/cutter.h"

namespace cuspmap {

/// One move in the sweep's frame.
struct PreparedMove {
  int index = 0;                      ///< position in the Toolpath
  MoveKind kind = MoveKind::Line;     ///< line or arc
  Eigen::Vector2d a_mm{0, 0};         ///< XY at the start, patch-local
  Eigen::Vector2d b_mm{0, 0};         ///< XY at the end, patch-local
  double z0_mm = 0.0;                 ///< tip height above the floor at the start
  double z1_mm = 0.0;                 ///< tip height above the floor at the end
  double z_min_mm = 0.0;              ///< lowest tip height of the move
  double length_xy_mm = 0.0;          ///< length of the move's XY trace
  Eigen::Vector2d dir{1, 0};          ///< lines: unit XY direction ((1,0) for a vertical move)
  Eigen::Vector2d perp{0, 1};         ///< lines: dir turned +90 deg
  Eigen::Vector2d centre_mm{0, 0};    ///< arcs: centre, patch-local
  double arc_radius_mm = 0.0;         ///< arcs: radius
  double start_angle_rad = 0.0;       ///< arcs: angle of the start point about the centre
  double sweep_rad = 0.0;             ///< arcs: signed swept angle (+ = ccw), |.| may exceed 2 pi
  double t_start_s = 0.0;             ///< time from the start of the path to this move's start
  double duration_s = 0.0;            ///< time the move takes at its feed, > 0
  double spindle_phase_rad = 0.0;     ///< angle of tooth 0 at the move's start, in [0, 2 pi)
  double x_min_mm = 0, x_max_mm = 0;  ///< XY box of the axis trace, patch-local
  double y_min_mm = 0, y_max_mm = 0;  ///< (not grown by the reach)

  /// True for a vertical line (plunge or retract), no XY travel.
  bool vertical() const { return kind == MoveKind::Line && length_xy_mm == 0.0; }
  /// Axis XY at move parameter t in [0, 1], patch-local.
  Eigen::Vector2d point_at(double t) const;
  /// Tip height above the floor at parameter t.
  double z_at(double t) const { return z0_mm + t * (z1_mm - z0_mm); }
  /// Lower bound of the XY distance from the axis trace to any point of a patch-local box, mm:
  /// exact for lines, the distance between bounding boxes for arcs. 0 when they overlap.
  double distance_to_box(double x_lo, double x_hi, double y_lo, double y_hi) const;
};

/// Counts of prepare_moves.
struct PreparedCounts {
  std::int64_t swept = 0;    ///< moves kept
  std::int64_t skipped = 0;  ///< moves dropped: outside the patch, too high, or of zero length
};

/// Turns a path into sweep moves.
/// @param[in] path        moves in program coordinates
/// @param[in] cut         rpm and spindle direction (phase), used with each move's feed (time)
/// @param[in] patch       grid and floor_z; the grid covers [0, nx cell] x [0, ny cell] locally
/// @param[in] reach_mm    horizontal reach of the cutter from its axis (R + runout)
/// @param[in] top_mm      highest a cutter point can be above the tip (max of the profile, axial
///                        offsets, tilt): a move whose lowest tip is higher than top_mm above the
///                        floor never comes down to a floor a cutting pass left
/// @param[out] counts     kept and dropped moves
/// @return kept moves in path order
std::vector<PreparedMove> prepare_moves(const Toolpath& path, const CutSpec& cut,
                                        const Patch& patch, double reach_mm, double top_mm,
                                        PreparedCounts& counts);

}  // namespace cuspmap

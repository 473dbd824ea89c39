// Move and Toolpath: what the cutter's tip does, as straight lines and circular arcs in the XY
// plane (arcs may change Z linearly: helices), each with its feed; the unit of work of sweep/.
// Lengths mm (program coordinates), feed mm/min.
// Method: RS-274 motion model (NIST RS274NGC interpreter, version 3, Kramer et al. 2000).
#pragma once

#include <Eigen/Core>
#include <vector>

namespace cuspmap {

/// Kinds of motion.
enum class MoveKind {
  Line,  ///< straight from start to end (G0/G1); Z may change (a ramp)
  Arc,   ///< circular in XY about centre (G2/G3), Z linear in the swept angle (a helix)
};

/// One motion of the tool tip.
struct Move {
  MoveKind kind = MoveKind::Line;         ///< line or arc
  Eigen::Vector3d start_mm{0, 0, 0};      ///< tip position at the start, program coordinates
  Eigen::Vector3d end_mm{0, 0, 0};        ///< tip position at the end
  Eigen::Vector2d centre_mm{0, 0};        ///< arc centre in XY (arcs only)
  bool ccw = false;                       ///< arc direction seen from +Z: true = G3
  int extra_turns = 0;                    ///< arcs: whole turns beyond the basic sweep (G2/G3 P word - 1)
  double feed_mm_per_min = 0.0;           ///< programmed feed; rapids carry the rapid rate
  bool rapid = false;                     ///< G0
  int source_line = 0;                    ///< line in the G-code file, 0 for built-in strategies
};

/// A whole path, in execution order.
struct Toolpath {
  std::vector<Move> moves;  ///< moves in order; empty is a valid (empty) path
};

/// Signed swept angle of an arc, rad: positive ccw, magnitude in (0, 2 pi] plus 2 pi per extra
/// turn; coincident start and end make a full circle (+-2 pi).
double arc_sweep_rad(const Move& arc);

/// Radius of an arc, mm (distance from centre to start in XY).
double arc_radius_mm(const Move& arc);

/// Length of a move's 3-D trajectory, mm (helix length for arcs).
double move_length_mm(const Move& move);

/// Tip position at parameter t in [0, 1] along the move (constant speed), mm.
Eigen::Vector3d move_point_mm(const Move& move, double t);

/// Sum of move lengths, mm; rapids included only when asked.
double path_length_mm(const Toolpath& path, bool include_rapids);

/// Time to run the path, s: feed moves at their feed, rapids at their rapid rate.
double cycle_time_s(const Toolpath& path);

}  // namespace cuspmap

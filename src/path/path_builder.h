// Appends the moves of a built-in strategy at the cutting height: feed lines and arcs, plunges,
// and links between passes (staying down, or retract - rapid - plunge). Lengths mm, mm/min.
// Method: RS-274 motion model (path/move.h); heights from DESIGN.md's job keys
// (tip at floor_z + [cut] depth, clearance at floor_z + [cut] retract_mm).
#pragma once

#include <Eigen/Core>

#include "core/heightfield.h"
#include "path/move.h"
#include "path/path_spec.h"

namespace cuspmap {

/// Builds a Toolpath move by move. Every move is checked against kMaxPathMoves.
class PathBuilder {
 public:
  /// @param[in] cut    feed (cutting moves, plunges), rapid rate (retracts, rapid links),
  ///                   depth (tip Z = floor + depth), retract_mm (clearance Z = floor + retract,
  ///                   raised to at least the cutting Z)
  /// @param[in] patch  floor_z_mm
  /// @param[in] what   the strategy's job key named in the too-many-moves error ("path.stepover")
  PathBuilder(const CutSpec& cut, const Patch& patch, const char* what);

  /// True before the first move.
  bool empty() const { return path_.moves.empty(); }
  /// Tip position in XY after the last move (the plunge point before the first).
  Eigen::Vector2d position_mm() const { return here_.head<2>(); }

  /// Goes to p at the cutting height: the first call plunges at p from the clearance height;
  /// later calls link from the current position, by a feed line at the cutting height when
  /// stay_down, else by a rapid retract, a rapid across and a feed plunge.
  void go_to(const Eigen::Vector2d& p_mm, bool stay_down);
  /// Feed line to p at the cutting height.
  void line_to(const Eigen::Vector2d& p_mm);
  /// Feed arc about centre to p (p == position gives a full circle).
  void arc_to(const Eigen::Vector2d& p_mm, const Eigen::Vector2d& centre_mm, bool ccw);
  /// Rapid retract to the clearance height (ends the path).
  void retract();
  /// The moves built so far (moved out).
  Toolpath take() { return std::move(path_); }

 private:
  void push(Move m);

  Toolpath path_;
  Eigen::Vector3d here_{0, 0, 0};
  double z_cut_mm_, z_clear_mm_, feed_, rapid_;
  const char* what_;
};

}  // namespace cuspmap

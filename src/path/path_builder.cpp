// Move-by-move construction of built-in toolpaths (see path_builder.h). Cost O(1) per move.
// Lengths mm, feeds mm/min.
// Method: RS-274 motion model (path/move.h): lines, arcs, rapids flagged.
#include "path/path_builder.h"

#include <algorithm>
#include <string>

#include "core/input_error.h"
#include "path/path_limits.h"

namespace cuspmap {

PathBuilder::PathBuilder(const CutSpec& cut, const Patch& patch, const char* what)
    : z_cut_mm_(patch.floor_z_mm + cut.depth_mm),
      z_clear_mm_(std::max(patch.floor_z_mm + cut.retract_mm, patch.floor_z_mm + cut.depth_mm)),
      feed_(cut.feed_mm_per_min),
      rapid_(cut.rapid_mm_per_min),
      what_(what) {}

void PathBuilder::push(Move m) {
  if (path_.moves.size() >= kMaxPathMoves) {
    throw InputError(std::string(what_) + ": the path would need more than " +
                     std::to_string(kMaxPathMoves) +
                     " moves; use a larger value or a smaller patch");
  }
  here_ = m.end_mm;
  path_.moves.push_back(m);
}

void PathBuilder::go_to(const Eigen::Vector2d& p_mm, bool stay_down) {
  const Eigen::Vector3d target(p_mm.x(), p_mm.y(), z_cut_mm_);
  Move m;
  if (path_.moves.empty()) {
    m.start_mm = {p_mm.x(), p_mm.y(), z_clear_mm_};
    m.end_mm = target;
    m.feed_mm_per_min = feed_;
    push(m);
    return;
  }
  if ((target - here_).norm() == 0.0) return;
  if (stay_down) {
    line_to(p_mm);
    return;
  }
  retract();
  m.start_mm = here_;
  m.end_mm = {p_mm.x(), p_mm.y(), z_clear_mm_};
  m.rapid = true;
  m.feed_mm_per_min = rapid_;
  push(m);
  m.start_mm = here_;
  m.end_mm = target;
  m.rapid = false;
  m.feed_mm_per_min = feed_;
  push(m);
}

void PathBuilder::line_to(const Eigen::Vector2d& p_mm) {
  Move m;
  m.start_mm = here_;
  m.end_mm = {p_mm.x(), p_mm.y(), z_cut_mm_};
  if ((m.end_mm - m.start_mm).norm() == 0.0) return;
  m.feed_mm_per_min = feed_;
  push(m);
}

void PathBuilder::arc_to(const Eigen::Vector2d& p_mm, const Eigen::Vector2d& centre_mm, bool ccw) {
  Move m;
  m.kind = MoveKind::Arc;
  m.start_mm = here_;
  m.end_mm = {p_mm.x(), p_mm.y(), z_cut_mm_};
  m.centre_mm = centre_mm;
  m.ccw = ccw;
  m.feed_mm_per_min = feed_;
  push(m);
}

void PathBuilder::retract() {
  if (path_.moves.empty() || here_.z() >= z_clear_mm_) return;
  Move m;
  m.start_mm = here_;
  m.end_mm = {here_.x(), here_.y(), z_clear_mm_};
  m.rapid = true;
  m.feed_mm_per_min = rapid_;
  push(m);
}

}  // namespace cuspmap

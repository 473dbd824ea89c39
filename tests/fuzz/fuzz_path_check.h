// Shared checks of built toolpaths for the fuzz targets (G-code reader, built-in strategies):
// moves within kMaxPathMoves, finite coordinates, positive feeds, arcs of positive radius,
// finite lengths and cycle time, one-line warnings. Any violation aborts (fuzz_check.h).
#pragma once

#include "fuzz_check.h"
#include "path/build_toolpath.h"
#include "path/move.h"
#include "path/path_limits.h"

namespace cuspmap::fuzz {

/// Requires a built path to honour path/move.h's promises.
inline void require_path(const BuiltPath& built) {
  const Toolpath& path = built.path;
  require(path.moves.size() <= kMaxPathMoves, "more moves than kMaxPathMoves");
  for (const Move& m : path.moves) {
    for (int k = 0; k < 3; ++k) {
      require_finite(m.start_mm[k], "move start");
      require_finite(m.end_mm[k], "move end");
    }
    require_finite(m.feed_mm_per_min, "move feed");
    require(m.feed_mm_per_min > 0, "move with feed <= 0 accepted");
    require(m.extra_turns >= 0, "negative extra turns");
    if (m.kind == MoveKind::Arc) {
      require_finite(m.centre_mm.x(), "arc centre x");
      require_finite(m.centre_mm.y(), "arc centre y");
      const double r = arc_radius_mm(m);
      require_finite(r, "arc radius");
      require(r > 0, "zero-radius arc accepted");
      require_finite(arc_sweep_rad(m), "arc sweep");
    }
    require_finite(move_length_mm(m), "move length");
  }
  require_finite(path_length_mm(path, true), "path length");
  require_finite(cycle_time_s(path), "cycle time");
  for (const PathWarning& w : built.warnings) {
    require(w.message.find('\n') == std::string::npos, "warning of several lines");
  }
}

}  // namespace cuspmap::fuzz

// libFuzzer target: the RS-274 program reader (path/read_gcode_text), with the limits of
// path/path_limits.h. Input: program text. Accepted programs must give finite moves with
// positive feeds, arcs of positive radius and finite lengths and times.
// Findings: any exception but InputError, NaN/inf or a degenerate move, a crash, a leak or UB.
// fuzz-requires: src/path/gcode_reader.h
// fuzz-requires: src/path/gcode_reader.cpp
#include <cstddef>
#include <cstdint>
#include <string_view>

#include "fuzz_check.h"
#include "path/gcode_reader.h"
#include "path/path_limits.h"

using namespace cuspmap;

namespace {

void check_path(const BuiltPath& built) {
  const Toolpath& path = built.path;
  fuzz::require(path.moves.size() <= kMaxPathMoves, "more moves than kMaxPathMoves");
  for (const Move& m : path.moves) {
    for (int k = 0; k < 3; ++k) {
      fuzz::require_finite(m.start_mm[k], "move start");
      fuzz::require_finite(m.end_mm[k], "move end");
    }
    fuzz::require_finite(m.feed_mm_per_min, "move feed");
    fuzz::require(m.feed_mm_per_min > 0, "move with feed <= 0 accepted");
    fuzz::require(m.extra_turns >= 0, "negative extra turns");
    if (m.kind == MoveKind::Arc) {
      fuzz::require_finite(m.centre_mm.x(), "arc centre x");
      fuzz::require_finite(m.centre_mm.y(), "arc centre y");
      const double r = arc_radius_mm(m);
      fuzz::require_finite(r, "arc radius");
      fuzz::require(r > 0, "zero-radius arc accepted");
      fuzz::require_finite(arc_sweep_rad(m), "arc sweep");
    }
    fuzz::require_finite(move_length_mm(m), "move length");
  }
  fuzz::require_finite(path_length_mm(path, true), "path length");
  fuzz::require_finite(cycle_time_s(path), "cycle time");
  for (const PathWarning& w : built.warnings) {
    fuzz::require(w.message.find('\n') == std::string::npos, "warning of several lines");
  }
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string_view text(reinterpret_cast<const char*>(data), size);
  // The examples' conditions: a 6 mm ball over a 10 x 10 mm patch with its floor at Z 0.
  const Cutter cutter;
  const CutSpec cut;
  const Patch patch;
  fuzz::run_one([&] { check_path(read_gcode_text(text, "fuzz.nc", cut, patch, cutter)); });
  return 0;
}

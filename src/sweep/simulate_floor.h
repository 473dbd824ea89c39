// Entry point of the sweep: the floor a Toolpath leaves on a Patch, by the envelope of the
// revolving cutter or tooth by tooth. Output heights in um above the nominal floor.
// Method: see sweep/sweep_envelope.h and sweep/sweep_teeth.h.
#pragma once

#include <cstdint>
#include <functional>

#include "core/heightfield.h"
#include "path/move.h"
#include "path/path_spec.h"
#include "tool/cutter.h"

namespace cuspmap {

/// How to simulate ([sim] of a job, plus run-time settings).
struct SimSpec {
  bool tooth_marks = false;           ///< tooth-resolved sweep (true) or revolving envelope (false)
  int threads = 0;                    ///< worker threads; 0 = all hardware threads
  std::int64_t max_memory_bytes = 0;  ///< grid memory limit; 0 = half of physical memory
  std::function<void(double)> progress;  ///< called with the done fraction in [0, 1]; may be empty
};

/// What the sweep did, for the report and benchmarks.
struct SweepStats {
  std::int64_t cell_updates = 0;   ///< cell visits by the min-update (cells x moves touching them)
  std::int64_t moves_swept = 0;    ///< moves that reached the patch
  std::int64_t moves_skipped = 0;  ///< moves that could not reach the patch (above it or outside)
};

/// Simulates the floor.
/// @param[in] cutter  validated cutter
/// @param[in] path    moves in program coordinates (Z against patch.floor_z_mm)
/// @param[in] cut     rpm and spindle direction (tooth-resolved sweep)
/// @param[in] patch   floor region and cell size
/// @param[in] sim     mode, threads, memory limit, progress
/// @param[out] stats  optional counters
/// @return the heightfield, um above the floor; NaN where no move reached
/// @throws InputError when the grid exceeds the memory limit (the estimate is in the message)
Heightfield simulate_floor(const Cutter& cutter, const Toolpath& path, const CutSpec& cut,
                           const Patch& patch, const SimSpec& sim, SweepStats* stats = nullptr);

}  // namespace cuspmap

// A rough forecast of one simulate run before it starts: grid cells, wall time and peak memory,
// from the grid size, the sweep kind and whether the floor is streamed in bands; tooth-resolved
// runs from the sweep's own cell visits per move kind (sweep/teeth_work.h).
// Inputs: grid columns/rows, tooth_marks, streamed (+ band bytes), TeethWork; output: RunEstimate.
// Method: rates measured on the reference 2-core machine (docs/performance.md), derived.
#pragma once

#include <cstdint>

#include "sweep/teeth_work.h"

namespace cuspmap {

/// What a run is expected to cost, stated to the user before it starts.
struct RunEstimate {
  std::int64_t cells = 0;     ///< grid cells (columns x rows)
  bool streamed = false;      ///< swept in bands, twice (never held whole)
  bool tooth_marks = false;   ///< tooth-resolved sweep (much slower per cell than the envelope)
  double seconds = 0.0;       ///< expected wall time of sweep + texture, s (within ~x3)
  std::int64_t bytes = 0;     ///< expected peak memory of the grids, bytes
};

/// Forecasts a run.
/// @param[in] nx, ny       grid columns and rows, >= 0
/// @param[in] tooth_marks  tooth-resolved sweep
/// @param[in] streamed     swept in bands (two passes) instead of in memory
/// @param[in] band_bytes   bytes of one band when streamed (ignored otherwise)
/// @param[in] work         the tooth-resolved sweep's cell visits (teeth_work; ignored for the
///                         envelope)
RunEstimate estimate_run(std::int64_t nx, std::int64_t ny, bool tooth_marks, bool streamed,
                         std::int64_t band_bytes, const TeethWork& work = {});

/// Wall time of the tooth-resolved sweep alone (one pass), s, on the reference machine.
double teeth_sweep_seconds(const TeethWork& work);

}  // namespace cuspmap

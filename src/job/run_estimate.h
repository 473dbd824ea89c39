// A rough forecast of one simulate run before it starts: grid cells, wall time and peak memory,
// from the grid size, the sweep kind and whether the floor is streamed in bands.
// Inputs: grid columns/rows, tooth_marks, streamed (+ band bytes); output: RunEstimate.
// Method: cell rates measured on the reference 2-core machine (docs/performance.md), derived.
#pragma once

#include <cstdint>

namespace cuspmap {

/// What a run is expected to cost, stated to the user before it starts.
struct RunEstimate {
  std::int64_t cells = 0;     ///< grid cells (columns x rows)
  bool streamed = false;      ///< swept in bands, twice (never held whole)
  bool tooth_marks = false;   ///< tooth-resolved sweep (much slower per cell than the envelope)
  double seconds = 0.0;       ///< expected wall time of sweep + texture, s (within ~x3)
  std::int64_t bytes = 0;     ///< expected peak memory of the grids, bytes
};

/// What the tooth-resolved sweep's cost depends on (all > 0 when tooth_marks is set).
struct ToothWork {
  double path_length_mm = 0.0;   ///< feed and rapid moves
  double diameter_mm = 0.0;      ///< cutter diameter D
  double cell_mm = 0.0;          ///< grid cell
  double rpm = 0.0;              ///< spindle speed
  double feed_mm_per_min = 0.0;  ///< cutting feed
  int teeth = 1;                 ///< flutes
};

/// Forecasts a run.
/// @param[in] nx, ny       grid columns and rows, >= 0
/// @param[in] tooth_marks  tooth-resolved sweep
/// @param[in] streamed     swept in bands (two passes) instead of in memory
/// @param[in] band_bytes   bytes of one band when streamed (ignored otherwise)
/// @param[in] work         tooth-resolved cost inputs (ignored for the envelope)
RunEstimate estimate_run(std::int64_t nx, std::int64_t ny, bool tooth_marks, bool streamed,
                         std::int64_t band_bytes, const ToothWork& work = {});

}  // namespace cuspmap

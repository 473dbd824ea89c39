// ISO 4287/4288 profile report of one measured trace (a stylus instrument's export), evaluated
// exactly as the traces of a heightfield are: stylus tip, lambda-s, the ISO 4288 cut-off rule.
// Inputs: runs of equally spaced heights um (spacing mm), TextureOptions; output: ProfileReport
// and warnings. Cost O(n * lc / spacing). Method: ISO 4287:1997, ISO 4288:1996 (docs/texture.md).
#pragma once

#include <string>
#include <vector>

#include "texture/texture_report.h"

namespace cuspmap {

/// A profile report of a single trace.
struct TraceReport {
  ProfileReport profile;              ///< parameters; direction "trace", direction_deg 0
  double length_mm = 0.0;             ///< longest run, first to last sample
  double spacing_mm = 0.0;            ///< sample step
  std::vector<std::string> warnings;  ///< one line each
};

/// Evaluates a trace. Runs apart by at most kMaxBridgedTracePoints missing points are first
/// joined by straight lines (texture/bridge_trace_gaps.h, with a warning); runs still shorter
/// than two of the shortest cut-offs are left out.
/// @param[in] runs     finite runs of one spacing (e.g. a trace split at missing points)
/// @param[in] options  cut-off, lambda-s and stylus tip (directions and areal filters unused)
/// @throws InputError when no run is two cut-offs long (naming the longest and the need)
TraceReport trace_report(const std::vector<ProfileTrace>& runs, const TextureOptions& options);

}  // namespace cuspmap

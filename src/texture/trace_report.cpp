// Single-trace profile report: keep the runs long enough for a cut-off, then the shared
// ISO 4288 evaluation (fill_profile_report).
// Inputs: runs, TextureOptions; output: TraceReport. Cost: see trace_report.h.
// Method: ISO 4288:1996 §7 (cut-off rules), ISO 4287:1997.
#include "texture/trace_report.h"

#include <algorithm>

#include "core/input_error.h"
#include "core/units.h"
#include "texture/bridge_trace_gaps.h"
#include "texture/iso4288_cutoff.h"

namespace cuspmap {

TraceReport trace_report(const std::vector<ProfileTrace>& measured_runs,
                         const TextureOptions& options) {
  TraceReport r;
  // Dropouts of a few points are bridged as diagnose bridges them: split there, a 14 mm trace
  // with 2 % missing points was read on its 1.8 mm longest run, with a cut-off too short for
  // its 2.9 mm period (random round trips, docs/diagnose.md rs17).
  int bridged = 0;
  const std::vector<ProfileTrace> runs =
      bridge_trace_gaps(measured_runs, kMaxBridgedTracePoints, &bridged);
  if (bridged > 0) {
    r.warnings.push_back(std::to_string(bridged) + " dropout(s) of at most " +
                         std::to_string(kMaxBridgedTracePoints) +
                         " missing points bridged by straight lines");
  }
  const double shortest_cutoff =
      options.cutoff_mm > 0.0 ? options.cutoff_mm : kStandardCutoffsMm.front();
  // Same slack as extract_profiles: lengths are sums of steps.
  constexpr double kLengthSlack = 1e-9;
  std::vector<ProfileTrace> kept;
  for (const ProfileTrace& t : runs) {
    r.length_mm = std::max(r.length_mm, t.length_mm());
    r.spacing_mm = t.spacing_mm;
    if (t.length_mm() + kLengthSlack >= 2.0 * shortest_cutoff) kept.push_back(t);
  }
  if (kept.empty()) {
    throw InputError("trace too short for a profile: its longest run is " +
                     format_number(r.length_mm) + " mm, at least " +
                     format_number(2.0 * shortest_cutoff) + " mm (two cut-offs) is needed");
  }
  if (kept.size() < runs.size()) {
    r.warnings.push_back(std::to_string(runs.size() - kept.size()) + " of " +
                         std::to_string(runs.size()) +
                         " runs between missing points are shorter than two cut-offs and left out");
  }
  r.profile.direction = "trace";
  fill_profile_report(kept, options, r.profile, r.warnings);
  return r;
}

}  // namespace cuspmap

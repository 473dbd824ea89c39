// What a single measured trace tells (a stylus profilometer's export): its dominant repeat (the
// stepover when traced across the lay, the feed marks when along it) and the cusp shape, i.e.
// the effective cutting radius. Inputs: runs um at one spacing mm; output: TraceEstimates.
// Cost O(n * lags). Method: docs/diagnose.md (autocorrelation period, phase folding).
#pragma once

#include <vector>

#include "infer/cusp_shape.h"
#include "infer/repeat_period.h"
#include "texture/bridge_trace_gaps.h"
#include "texture/extract_profiles.h"

namespace cuspmap {

/// Least standard error of a trace's repeat, in samples over its repeats: the band means' floor
/// (docs/diagnose.md), measured on traces of a few periods (trace_estimates.cpp).
inline constexpr double kTracePeakSamples = 0.5;

/// Estimates from one trace.
struct TraceEstimates {
  RepeatPeriod period;     ///< dominant repeat along the trace, with its standard error
  CuspShape cusp;          ///< folded cusp and effective radius
  double length_mm = 0.0;  ///< longest run
};

/// Reads a trace.
/// @param[in] measured_runs  finite runs of one spacing (a trace split at missing points);
///                           gaps of up to kMaxBridgedTracePoints points are bridged
/// @throws InputError when the trace shows no repeat, or fewer than 4 periods fit in it
TraceEstimates trace_estimates(const std::vector<ProfileTrace>& measured_runs);

}  // namespace cuspmap

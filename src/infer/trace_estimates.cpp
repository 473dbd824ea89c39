// Single-trace estimates: short dropouts bridged, repeat period, then the fold and valley fit on
// it. Inputs: runs; output: TraceEstimates. Cost O(n * lags).
// Method: see infer/repeat_period.h and infer/cusp_shape.h; dropouts by linear interpolation.
#include "infer/trace_estimates.h"

#include <algorithm>
#include <cmath>

#include "core/input_error.h"
#include "core/units.h"
#include "infer/surface_estimates.h"

namespace cuspmap {

TraceEstimates trace_estimates(const std::vector<ProfileTrace>& measured_runs) {
  // Dropouts of a few points (a stylus skip, a saturated sample) split a trace into runs whose
  // longest may hold under 4 periods: a 16 mm trace with 2 % missing points was refused as
  // 1.8 mm long (random round trips, tools/diagnose_campaign.py). Bridged linearly, each by a
  // chord over at most kMaxBridgedTracePoints samples, they leave the repeat and the fold as
  // they were; those traces then read the stepover within 0.3 % and 0.07 % (rs16, rs17).
  const std::vector<ProfileTrace> runs = bridge_trace_gaps(measured_runs, kMaxBridgedTracePoints);
  TraceEstimates t;
  size_t longest = 0;
  for (const ProfileTrace& r : runs) longest = std::max(longest, r.z_um.size());
  if (runs.empty() || longest < 16) {
    throw InputError("trace too short to diagnose: " + std::to_string(longest) +
                     " points in its longest run, at least 16 are needed");
  }
  const double dx = runs.front().spacing_mm;
  t.length_mm = static_cast<double>(longest - 1) * dx;
  t.period = repeat_period(mean_autocorrelation(runs, static_cast<int>(longest / 2)), dx);
  if (!t.period.found) {
    throw InputError("no repeat along the trace (" + format_number(t.length_mm) +
                     " mm): trace across the lay over at least 4 passes");
  }
  if (t.period.period_mm * kMinPeriodsInField > t.length_mm) {
    throw InputError("trace too short for its period " + format_number(t.period.period_mm) +
                     " mm: it is " + format_number(t.length_mm) + " mm, at least " +
                     format_number(kMinPeriodsInField * t.period.period_mm) +
                     " mm (4 periods) are needed");
  }
  // A trace of a few periods gives the repeat from 2-3 autocorrelation peaks: their scatter (1-2
  // degrees of freedom) says little, and each peak, shifted by the detrending of a trace that is
  // no whole number of periods long, is off by up to half a sample (random round trips: 0.5 and
  // 0.2 samples off with 2 repeats against a sigma of 0.09 and 0.05 samples; derived bound).
  t.period.sigma_mm = std::max(t.period.sigma_mm,
                               kTracePeakSamples * dx / std::max(1, t.period.repeats));
  t.cusp = cusp_shape(runs, t.period.period_mm, true);
  return t;
}

}  // namespace cuspmap

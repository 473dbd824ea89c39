// Single-trace estimates: repeat period, then the fold and valley fit on it.
// Inputs: runs; output: TraceEstimates. Cost O(n * lags).
// Method: see infer/repeat_period.h and infer/cusp_shape.h.
#include "infer/trace_estimates.h"

#include <algorithm>

#include "core/input_error.h"
#include "core/units.h"
#include "infer/surface_estimates.h"

namespace cuspmap {

TraceEstimates trace_estimates(const std::vector<ProfileTrace>& runs) {
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
  t.cusp = cusp_shape(runs, t.period.period_mm, true);
  return t;
}

}  // namespace cuspmap

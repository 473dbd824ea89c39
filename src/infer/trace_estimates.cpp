// Single-trace estimates: short dropouts bridged, repeat period, then the fold and valley fit on
// it. Inputs: runs; output: TraceEstimates. Cost O(n * lags).
// Method: see infer/repeat_period.h and infer/cusp_shape.h; dropouts by linear interpolation.
#include "infer/trace_estimates.h"

#include <algorithm>
#include <cmath>
#include <limits>

#include "core/input_error.h"
#include "core/units.h"
#include "infer/periodic_trend.h"
#include "infer/surface_estimates.h"
#include "infer/valley_period.h"

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
  // The fold stacks the periods at the repeat it is given: one that is off by d stacks the
  // valleys up to n d / 2 apart over n periods, and the low quantile then follows their lower
  // envelope, a valley flattened as by the bins' width (cusp_shape): a noise-free 8.5 mm ball's
  // trace, folded at 1.13809 mm for 1.139 (0.5 sample over 5 repeats), read the radius 0.25 %
  // long, and the radius grows either way from the true period (random round trips,
  // tools/diagnose_campaign.py seed 2029 rs17). The valleys' own vertices give the repeat to a
  // fraction of a sample (valley_period); the fold takes the more precise of the two, and the
  // radius's sigma takes the larger change of the radius over that period's +-1 sigma (GUM,
  // JCGM 100:2008 §5.1.3, a sensitivity by finite differences).
  const CuspShape first = cusp_shape(runs, t.period.period_mm, true);
  std::vector<ProfileTrace> level = runs;
  for (ProfileTrace& r : level) {
    remove_periodic_trend(r, t.period.period_mm, static_cast<int>(first.mean_um.size()));
  }
  const ValleyPeriod valleys =
      valley_period(level, t.period.period_mm, first.valley_phase_mm, kValleyWindow);
  double fold_mm = t.period.period_mm, fold_sigma_mm = t.period.sigma_mm;
  if (valleys.found && valleys.sigma_mm < fold_sigma_mm) {
    fold_mm = valleys.period_mm;
    fold_sigma_mm = valleys.sigma_mm;
  }
  // What trend the phase bins left (their samples spread over a bin's width on the cusps'
  // flanks, and that spread drifts with the period's index when the period is no whole number
  // of samples: 0.02 um/mm on a 5-period 11.4 mm ball's trace, seed 2027 rs16) the valley
  // bottoms show, each on the same circle: their heights' slope is removed too.
  if (valleys.slope_found) {
    for (ProfileTrace& r : level) remove_trend(r, valleys.slope_um_per_mm);
  }
  t.cusp = cusp_shape(level, fold_mm, false);
  t.cusp.period_mm = fold_mm;
  t.cusp.period_sigma_mm = fold_sigma_mm;
  if (t.cusp.curved && fold_sigma_mm > 0.0) {
    double change = 0.0;
    for (const double side : {-1.0, 1.0}) {
      const CuspShape moved = cusp_shape(level, fold_mm + side * fold_sigma_mm, false);
      change = std::max(change, moved.curved ? std::abs(moved.radius_mm - t.cusp.radius_mm)
                                             : std::numeric_limits<double>::infinity());
    }
    t.cusp.radius_sigma_mm = std::hypot(t.cusp.radius_sigma_mm, change);
  }
  return t;
}

}  // namespace cuspmap

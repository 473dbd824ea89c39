// The largest raster stepover whose floor meets a target Sa once the marks along the feed count
// too: the cross-feed profile's closed form brackets it, then bisection on windows swept tooth
// by tooth (simulated_cusp_heights: ISO 25178-2 Sa after least-squares plane removal).
// Method: bisection on the stepover (Sa grows with it); the upper end is the stepover at which
// the closed-form profile of cusp_profile_heights alone meets the target, taken as the answer
// when its simulated window already does (the marks along the feed then do not matter).
#include "finish/areal_stepover.h"

#include <cassert>

#include "finish/cusp_profile_heights.h"
#include "finish/simulated_cusp_heights.h"

namespace cuspmap {
namespace {

// A spindle speed for the window: the marks depend on the feed per revolution only, so any
// speed with the matching feed gives the same floor.
constexpr double kWindowRpm = 10000.0;

// Largest stepover in (0, limit] whose closed-form (extruded) Sa <= target: bisection.
double profile_stepover_mm(const Cutter& cutter, double target_sa_um, double limit_mm) {
  if (cusp_profile_heights(cutter, limit_mm).sa_um <= target_sa_um) return limit_mm;
  double lo = 0.0, hi = limit_mm;
  for (int k = 0; k < 60; ++k) {
    const double mid = 0.5 * (lo + hi);
    (cusp_profile_heights(cutter, mid).sa_um <= target_sa_um ? lo : hi) = mid;
  }
  return lo;
}

}  // namespace

ArealStepover stepover_for_sa(const Cutter& cutter, double feed_per_tooth_mm,
                              RasterDirection direction, double target_sa_um) {
  assert(feed_per_tooth_mm > 0.0 && target_sa_um > 0.0 && "validated by the caller");
  WindowSweep sweep;
  sweep.tooth_marks = true;
  sweep.cut.rpm = kWindowRpm;
  sweep.cut.feed_mm_per_min = feed_per_tooth_mm * cutter.teeth * kWindowRpm;
  ArealStepover out;
  auto sa_at = [&](double s) {
    ++out.windows;
    return simulated_cusp_heights(cutter, s, direction, sweep).sa_um;
  };
  // Passes must overlap: at most 95 % of the diameter (the window's own limit is D).
  const double limit_mm = 0.95 * cutter.diameter_mm;
  out.profile_stepover_mm = profile_stepover_mm(cutter, target_sa_um, limit_mm);
  double hi = out.profile_stepover_mm;
  const double hi_sa = sa_at(hi);
  if (hi_sa <= target_sa_um) {
    out.reachable = true;
    out.stepover_mm = hi;
    out.sa_um = hi_sa;
    out.smallest_tried_mm = hi;
    return out;
  }
  double lo = hi / 3.0;
  out.smallest_tried_mm = lo;
  double lo_sa = sa_at(lo);
  if (lo_sa > target_sa_um) {
    out.sa_um = lo_sa;
    return out;
  }
  while (hi - lo > kArealStepoverTolerance * hi) {
    const double mid = 0.5 * (lo + hi);
    const double sa = sa_at(mid);
    if (sa <= target_sa_um) {
      lo = mid;
      lo_sa = sa;
    } else {
      hi = mid;
    }
  }
  out.reachable = true;
  out.stepover_mm = lo;
  out.sa_um = lo_sa;
  return out;
}

}  // namespace cuspmap

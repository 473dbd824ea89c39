// The linear trend of a periodic trace: least squares of a line plus a function of the phase
// alone, whose slope is the common slope of the heights on position within each phase bin
// (every bin keeping its own mean). Inputs: a trace um at spacing mm, its period mm; output:
// the slope um/mm (or the trace with it removed). Cost O(samples). Method: analysis of
// covariance, the pooled within-group regression slope (Snedecor & Cochran, Statistical
// Methods, 8th ed., §18.2).
#pragma once

#include "texture/extract_profiles.h"

namespace cuspmap {

/// Pooled within-bin slope of a trace folded on `period_mm` in `bins` phase bins.
/// @param[out] slope_um_per_mm  the slope, when some bin holds two samples (a run of two periods)
/// @return false when no bin holds two samples
bool periodic_trend_slope(const ProfileTrace& t, double period_mm, int bins,
                          double& slope_um_per_mm);

/// Removes slope x position (from the first sample) and then the mean from the trace.
void remove_trend(ProfileTrace& t, double slope_um_per_mm);

/// Removes the periodic trend's slope times position and then the mean from the trace, or its
/// least-squares line when it spans under two periods. A least-squares line through a trace that is no whole
/// number of periods long is tilted by the cusps themselves (derived; a 5-period ball trace at
/// 1.139 mm: 0.3 um/mm), which the fold then stacks periods apart.
void remove_periodic_trend(ProfileTrace& t, double period_mm, int bins);

}  // namespace cuspmap

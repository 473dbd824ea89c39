// Cusp height of a periodic mark pattern: peak-to-valley of the crests and valleys met by traces
// across the lay, each crest and valley refined below the sample spacing by intersecting the
// two flanks that meet there (each extrapolated by the parabola through its three nearest
// samples). Inputs: traces (um, equally spaced); output um. Cost O(samples).
// Method: derived (a cusp is where the envelopes of two neighbouring passes cross; a flank is
// smooth, so a three-point parabola extrapolates it over one spacing to O(spacing^3)).
#pragma once

#include <vector>

#include "texture/extract_profiles.h"

namespace cuspmap {

/// Peak-to-valley heights of a profile's mark pattern.
struct PeriodicCusp {
  double cusp_um = 0.0;  ///< median over crests of (refined crest - lower adjacent refined valley)
  int crests = 0;        ///< crests measured (0: no crest with a valley on both sides; cusp 0)
};

/// Refined height of the extremum at sample i of z (a crest when sign = +1, a valley when
/// sign = -1): the higher (lower) crossing of the flank parabolas under the two hypotheses that
/// the true extremum lies in [i-1, i] or in [i, i+1]; never short of z[i].
/// @param[in] z     samples, um; needs 3 <= i <= z.size() - 4
/// @param[in] i     index of a local extremum of z
/// @param[in] sign  +1 crest, -1 valley
double refined_extremum_um(const std::vector<double>& z, std::size_t i, double sign);

/// The cusp of traces taken across the lay: every crest that has a valley on both sides within
/// its trace gives (crest - lower valley); the median over all crests of all traces is the
/// cusp, robust to the odd crest at a trace's end or where a pattern changes. Crests and
/// valleys smaller than 10 % of the trace's height range are not counted (ISO 4287 discrimination).
/// @param[in] traces  runs of finite samples (any may be short: runs under 7 samples are skipped)
PeriodicCusp periodic_cusp(const std::vector<ProfileTrace>& traces);

}  // namespace cuspmap

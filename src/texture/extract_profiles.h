// Parallel profile traces through a heightfield along any direction, sampled bilinearly at one
// cell spacing and cut where the trace meets an unreached (NaN) cell.
// Inputs: Heightfield (um, mm), direction deg from +X counter-clockwise; output: traces (um).
// Cost O(traces * trace length).
// Method: bilinear interpolation between cell centres; a sample that needs a NaN cell is NaN.
#pragma once

#include <vector>

#include "core/heightfield.h"

namespace cuspmap {

/// One run of finite samples along a trace.
struct ProfileTrace {
  std::vector<double> z_um;  ///< heights, equally spaced along the trace
  double spacing_mm = 0.0;   ///< sample spacing (the cell size)
  double offset_mm = 0.0;    ///< signed distance of the trace from the field's centre, across it
  double start_mm = 0.0;     ///< position of the first sample along the trace, from the centre
  /// Length from the first to the last sample, mm.
  double length_mm() const {
    return z_um.size() < 2 ? 0.0 : static_cast<double>(z_um.size() - 1) * spacing_mm;
  }
};

/// Traces along `direction_deg` through the cell centres' rectangle, one cell apart across the
/// direction, thinned evenly to at most `max_traces`; each trace is split at NaN samples and only
/// runs at least `min_length_mm` long are kept.
/// @param[in] hf             heightfield (nx, ny >= 1, cell > 0)
/// @param[in] direction_deg  trace direction, degrees from +X counter-clockwise (any value)
/// @param[in] max_traces     upper bound on the number of parallel lines sampled (>= 1)
/// @param[in] min_length_mm  shortest run kept (>= 0)
/// @return runs in order of offset then position; empty when nothing qualifies
std::vector<ProfileTrace> extract_profiles(const Heightfield& hf, double direction_deg,
                                           int max_traces, double min_length_mm);

/// Length of the longest straight trace in `direction_deg` through the cell centres'
/// rectangle (ignoring NaN cells), mm.
double longest_chord_mm(const Heightfield& hf, double direction_deg);

}  // namespace cuspmap

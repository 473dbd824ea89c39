// Joins the finite runs of a measured trace across short dropouts (a stylus skip, a saturated
// sample), filling each gap linearly. Inputs: runs of one spacing (z um over x mm) in order;
// output: runs with gaps of at most N missing samples filled. Cost O(points).
// Method: linear interpolation of dropouts (common practice of instrument software, no source).
#pragma once

#include <vector>

#include "texture/extract_profiles.h"

namespace cuspmap {

/// Longest dropout (missing points in a row) a trace's estimates and its profile report bridge
/// by linear interpolation; longer gaps keep the runs apart (common practice, no source:
/// instrument software interpolates dropouts; a chord over 4 samples is a quarter of the
/// shortest run a trace may hold, kMinTracePoints, and each filled sample is one of the many a
/// fold bin or a sampling length averages).
inline constexpr int kMaxBridgedTracePoints = 4;

/// Joins runs separated by at most `max_gap_points` missing samples, filling the gap linearly.
/// @param[in] runs  finite runs of one spacing, in order along the trace (start_mm increasing)
/// @param[out] bridged  if not null, set to the number of gaps filled
/// @return the runs with short gaps filled (a run's start_mm kept)
std::vector<ProfileTrace> bridge_trace_gaps(const std::vector<ProfileTrace>& runs,
                                            int max_gap_points, int* bridged = nullptr);

}  // namespace cuspmap

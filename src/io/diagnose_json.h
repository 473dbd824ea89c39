// JSON form of what `diagnose` read from a floor or a trace (every number, full precision).
// Inputs: SurfaceEstimates or TraceEstimates; output: nlohmann::json. Cost O(bins).
// Method: DESIGN.md key style (lengths *_mm, heights *_um, angles *_deg).
#pragma once

#include <nlohmann/json.hpp>

#include "infer/surface_estimates.h"
#include "infer/trace_estimates.h"

namespace cuspmap {

/// {kind: "surface", lay_deg, lay_strength, lay_given, stepover_mm, stepover_sigma_mm,
///  stepover_repeats, cusp{cusp_um, effective_radius_mm, effective_radius_sigma_mm, curved,
///  valley_mm, mean_profile_um[], bin_mm}, feed{found, period_mm, period_sigma_mm, revolution_mm,
///  marks_per_revolution, feed_per_tooth_mm}, passes{next_pass, second_pass, mirror,
///  along_rms_um, bands}, direction, heel, setup_plane{gx_um_per_mm, gy_um_per_mm, tilt_deg,
///  tilt_toward_deg}, notes[]}
nlohmann::json surface_estimates_json(const SurfaceEstimates& e);

/// {kind: "trace", period_mm, period_sigma_mm, period_repeats, length_mm, cusp{...}}
nlohmann::json trace_estimates_json(const TraceEstimates& t);

}  // namespace cuspmap

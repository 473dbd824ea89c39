// JSON of the tooth-resolved stage, merged into diagnose.json's "fit" object: runout and its
// phase, dish, the along-feed sign, and the stage's own block (window, residual, cost).
// Inputs: ToothFit; output: nlohmann::json keys set on `fit`. Cost O(1).
// Method: DESIGN.md key style (heights *_um, angles *_deg; sigma beside value).
#pragma once

#include <nlohmann/json.hpp>

#include "infer/tooth_fit.h"

namespace cuspmap {

/// Sets on `fit`: runout_um, runout_um_sigma, runout_phase_deg, runout_phase_deg_sigma,
/// runout_phase_period_deg, runout_projection_only, dish_deg, dish_deg_sigma (numbers, when the
/// stage ran) and tooth_fit{ran, skipped?, teeth, feed_per_tooth_mm, runout_um{...},
/// runout_phase_deg{...}, dish_deg{...}, tilt_along_deg{...}, tilt_across_deg{...},
/// along_sign_known, along_sign_cost_sigmas, residual_rms_um, measured_rms_um,
/// correlation_factor, samples, passes, sweeps, smoothed_residual_ratio, marks_misfit,
/// runout_not_read, runout_basin_sigmas, marks_seen, marks_rms_um, marks_variance_ratio};
/// objects {value, sigma, fitted, resolved, bound}
/// as the envelope stage's (sigma/bound left out when infinite).
void add_tooth_fit_json(const ToothFit& t, nlohmann::json& fit);

}  // namespace cuspmap

// JSON form of the inverse simulation (every fitted number with its standard error, the window,
// the residual, the verdicts), the "fit" object of diagnose.json.
// Inputs: FloorFit, FittedErrors, FitVerdict; output: nlohmann::json. Cost O(1).
// Method: DESIGN.md key style (lengths *_mm, heights *_um, angles *_deg; sigma beside value).
#pragma once

#include <nlohmann/json.hpp>

#include "infer/fit_uncertainty.h"
#include "infer/fit_verdict.h"

namespace cuspmap {

/// {value, fitted, resolved, sigma?, bound?} of one fitted number (sigma and bound left out
/// when infinite).
nlohmann::json fitted_value_json(const FittedValue& v);

/// {model, window{sample_mm, samples, size_mm[2], origin_mm[2]}, tilt_deg{value, sigma,
///  resolved, bound}, tilt_toward_deg{...}, tilt_toward_alt_deg, along_sign_known,
///  tilt_along_deg{...}, tilt_across_deg{...}, stepover_mm{...}, offset_mm{...},
///  setup_plane{gx_um_per_mm{...}, gy_um_per_mm{...}}, residual_rms_um, measured_rms_um,
///  evaluations, solver_status, heel_lifted, heel_min_tilt_deg, tram_target_deg, explained, weak, verdict[],
///  cannot_tell[]}. sigma and bound are left out when infinite (a parameter the floor does not move).
nlohmann::json floor_fit_json(const FloorFit& fit, const FittedErrors& f, const FitVerdict& v);

}  // namespace cuspmap

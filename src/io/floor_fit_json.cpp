// JSON of the fit: values with sigma, bounds, window, residual and verdicts.
// Inputs: FloorFit, FittedErrors, FitVerdict; output: JSON. Cost O(1).
// Method: DESIGN.md key contract.
#include "io/floor_fit_json.h"

#include <cmath>

namespace cuspmap {
// sigma and bound are left out when infinite (a parameter the floor does not move): JSON
// numbers stay finite (CONVENTIONS.md 8).
nlohmann::json fitted_value_json(const FittedValue& v) {
  nlohmann::json j = {{"value", v.value}, {"fitted", v.fitted}, {"resolved", v.resolved}};
  if (std::isfinite(v.sigma)) j["sigma"] = v.sigma;
  if (std::isfinite(v.bound)) j["bound"] = v.bound;
  return j;
}

nlohmann::json floor_fit_json(const FloorFit& fit, const FittedErrors& f, const FitVerdict& v) {
  nlohmann::json j;
  j["model"] = fit.model.tooth_marks ? "tooth-resolved sweep" : "revolving-envelope sweep";
  const Patch& w = fit.model.window;
  j["window"] = {{"sample_mm", fit.sample_mm},
                 {"samples", fit.samples},
                 {"size_mm", {fit.measured.nx * w.cell_mm, fit.measured.ny * w.cell_mm}},
                 {"origin_mm", {w.origin_x_mm, w.origin_y_mm}}};
  j["lay_deg"] = fit.model.lay_deg;
  j["tilt_deg"] = fitted_value_json(f.tilt_deg);
  j["tilt_toward_deg"] = fitted_value_json(f.tilt_toward_deg);
  j["tilt_toward_alt_deg"] = f.tilt_toward_alt_deg;
  j["along_sign_known"] = f.along_sign_known;
  j["tilt_along_deg"] = fitted_value_json(f.tilt_along_deg);
  j["tilt_across_deg"] = fitted_value_json(f.tilt_across_deg);
  j["stepover_mm"] = fitted_value_json(f.stepover_mm);
  j["offset_mm"] = fitted_value_json(f.offset_mm);
  j["setup_plane"] = {{"gx_um_per_mm", fitted_value_json(f.setup_gx_um_per_mm)},
                      {"gy_um_per_mm", fitted_value_json(f.setup_gy_um_per_mm)}};
  j["residual_rms_um"] = fit.residual_rms_um;
  j["correlation_factor"] = fit.correlation_factor;
  j["tilt_interval_deg"] = {fit.tilt_interval_deg.first, fit.tilt_interval_deg.second};
  j["tilt_profile_sigma_deg"] = fit.tilt_profile_sigma_deg;
  j["direction_profile_sigma_deg"] = fit.direction_profile_sigma_deg;
  j["measured_rms_um"] = fit.measured_rms_um;
  j["evaluations"] = fit.evaluations;
  j["solver_status"] = fit.solver_status;
  j["heel_lifted"] = v.heel_lifted;
  j["heel_min_tilt_deg"] = v.heel_min_tilt_deg;
  j["tram_target_deg"] = v.tram_target_deg;
  j["explained"] = v.explained;
  j["weak"] = v.weak;
  j["tilt_interval_only"] = v.tilt_interval_only;
  j["ridge_tilt_deg"] = v.ridge_tilt_deg;
  j["arc_beat"] = v.arc_beat;
  j["arc_beat_stepover_mm"] =
      v.arc_beat ? nlohmann::json(v.arc_beat_stepover_mm) : nlohmann::json(nullptr);
  j["verdict"] = v.lines;
  j["cannot_tell"] = v.cannot_tell;
  return j;
}

}  // namespace cuspmap

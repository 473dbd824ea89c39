// JSON of the tooth-resolved stage: flat keys beside the envelope's and a tooth_fit block.
// Inputs: ToothFit; output: keys on the fit object. Cost O(1).
// Method: DESIGN.md key contract; non-finite numbers are left out (CONVENTIONS.md 8).
#include "io/tooth_fit_json.h"

#include "io/floor_fit_json.h"

#include <cmath>

namespace cuspmap {
namespace {

void flat(nlohmann::json& fit, const char* key, const FittedValue& v) {
  fit[key] = v.value;
  if (std::isfinite(v.sigma)) fit[std::string(key) + "_sigma"] = v.sigma;
}

}  // namespace

void add_tooth_fit_json(const ToothFit& t, nlohmann::json& fit) {
  nlohmann::json j;
  j["ran"] = t.ran;
  if (!t.ran) {
    j["skipped"] = t.skipped;
    fit["tooth_fit"] = j;
    return;
  }
  // A misfit gives no flat value (its numbers stay in the block, marked unresolved).
  if (!t.marks_misfit && !t.runout_not_read) {
    flat(fit, "runout_um", t.runout_um);
    fit["runout_projection_only"] = t.runout_projection_only;
    if (!t.runout_projection_only) flat(fit, "runout_phase_deg", t.runout_phase_deg);
    fit["runout_phase_period_deg"] = t.runout_phase_period_deg;
  }
  if (!t.marks_misfit) {
    flat(fit, "dish_deg", t.dish_deg);
  }
  j["teeth"] = t.teeth;
  j["feed_per_tooth_mm"] = t.feed_per_tooth_mm;
  j["runout_um"] = fitted_value_json(t.runout_um);
  if (!t.runout_projection_only) j["runout_phase_deg"] = fitted_value_json(t.runout_phase_deg);
  j["dish_deg"] = fitted_value_json(t.dish_deg);
  j["tilt_along_deg"] = fitted_value_json(t.tilt_along_deg);
  j["tilt_across_deg"] = fitted_value_json(t.tilt_across_deg);
  j["along_sign_known"] = t.along_sign_known;
  j["along_sign_cost_sigmas"] = t.along_sign_cost_sigmas;
  j["residual_rms_um"] = t.residual_rms_um;
  j["measured_rms_um"] = t.measured_rms_um;
  j["correlation_factor"] = t.correlation_factor;
  j["smoothed_residual_ratio"] = t.smoothed_residual_ratio;
  j["marks_misfit"] = t.marks_misfit;
  j["runout_not_read"] = t.runout_not_read;
  // Infinite when every solved start stopped in one phase basin (no other phase to compare):
  // written as null (docs/output-keys.md), never as a non-finite number (CONVENTIONS.md 8).
  j["runout_basin_sigmas"] = std::isfinite(t.runout_basin_sigmas)
                                 ? nlohmann::json(t.runout_basin_sigmas)
                                 : nlohmann::json(nullptr);
  j["marks_seen"] = t.marks.seen;
  j["marks_rms_um"] = t.marks.marks_rms_um;
  j["marks_variance_ratio"] = t.marks.variance_ratio;
  j["offset_from_marks"] = t.offset_from_marks;
  j["marks_offset_contrast"] = t.marks_offset.contrast;
  j["samples"] = t.samples;
  j["passes"] = t.passes;
  j["sweeps"] = t.sweeps;
  fit["tooth_fit"] = j;
}

}  // namespace cuspmap

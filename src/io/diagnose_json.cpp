// JSON objects of the diagnose estimates.
// Inputs: estimates; output: JSON. Cost O(bins).
// Method: DESIGN.md key contract.
#include "io/diagnose_json.h"

namespace cuspmap {
namespace {

nlohmann::json cusp_json(const CuspShape& c) {
  nlohmann::json j;
  j["cusp_um"] = c.cusp_um;
  j["curved"] = c.curved;
  j["effective_radius_mm"] = c.radius_mm;
  j["effective_radius_sigma_mm"] = c.radius_sigma_mm;
  j["valley_mm"] = c.valley_phase_mm;
  j["bin_mm"] = c.bin_mm;
  j["period_mm"] = c.period_mm;
  j["period_sigma_mm"] = c.period_sigma_mm;
  j["mean_profile_um"] = c.mean_um;
  return j;
}

}  // namespace

nlohmann::json surface_estimates_json(const SurfaceEstimates& e) {
  nlohmann::json j;
  j["kind"] = "surface";
  j["lay_deg"] = e.lay_deg;
  j["lay_strength"] = e.lay_strength;
  j["lay_pass_share"] = e.lay_pass_share;
  j["lay_given"] = e.lay_given;
  j["stepover_mm"] = e.stepover.period_mm;
  j["stepover_sigma_mm"] = e.stepover.sigma_mm;
  j["stepover_repeats"] = e.stepover.repeats;
  j["cusp"] = cusp_json(e.cusp);
  const FeedMarks& f = e.feed;
  j["feed"] = {{"found", f.found},
               {"period_mm", f.period_mm},
               {"period_sigma_mm", f.period_sigma_mm},
               {"revolution_mm", f.revolution_mm},
               {"marks_per_revolution", f.marks_per_revolution},
               {"feed_per_tooth_mm", f.feed_per_tooth_mm}};
  const PassSignatures& p = e.passes;
  j["passes"] = {{"next_pass", p.next_pass},
                 {"second_pass", p.second_pass},
                 {"mirror", p.mirror},
                 {"along_rms_um", p.along_rms_um},
                 {"bands", p.bands}};
  j["direction"] = e.direction;
  j["heel"] = e.heel;
  j["setup_plane"] = {{"gx_um_per_mm", e.setup_plane.gx_um_per_mm},
                      {"gy_um_per_mm", e.setup_plane.gy_um_per_mm},
                      {"tilt_deg", e.setup_tilt_deg},
                      {"tilt_toward_deg", e.setup_tilt_toward_deg}};
  j["notes"] = e.notes;
  return j;
}

nlohmann::json trace_estimates_json(const TraceEstimates& t) {
  nlohmann::json j;
  j["kind"] = "trace";
  j["period_mm"] = t.period.period_mm;
  j["period_sigma_mm"] = t.period.sigma_mm;
  j["period_repeats"] = t.period.repeats;
  j["length_mm"] = t.length_mm;
  j["cusp"] = cusp_json(t.cusp);
  return j;
}

}  // namespace cuspmap

// JSON objects of the texture report.
// Inputs: TextureReport; output: JSON. Cost O(1).
// Method: DESIGN.md key contract.
#include "io/texture_json.h"

#include <string>

#include "core/units.h"

namespace cuspmap {
namespace {

// P and W parameters under their own letter (Pa_um, Wa_um ...).
nlohmann::json letter_json(char letter, const ProfileParameters& p) {
  const std::string l(1, letter);
  nlohmann::json j;
  j[l + "a_um"] = p.a_um;
  j[l + "q_um"] = p.q_um;
  j[l + "p_um"] = p.p_um;
  j[l + "v_um"] = p.v_um;
  j[l + "t_um"] = p.t_um;
  j[l + "sk"] = p.sk;
  j[l + "ku"] = p.ku;
  j[l + "Sm_mm"] = p.sm_mm;
  return j;
}

}  // namespace

nlohmann::json profile_json(const ProfileReport& p) {
  const ProfileParameters& r = p.roughness;
  nlohmann::json j;
  j["Ra_um"] = r.a_um;
  j["Rq_um"] = r.q_um;
  j["Rp_um"] = r.p_um;
  j["Rv_um"] = r.v_um;
  j["Rz_um"] = r.z_um;
  j["Rt_um"] = r.t_um;
  j["Rsk"] = r.sk;
  j["Rku"] = r.ku;
  j["RSm_mm"] = r.sm_mm;
  j["Ra_uin"] = r.a_um * kUinPerUm;
  j["Rz_uin"] = r.z_um * kUinPerUm;
  j["cutoff_mm"] = p.cutoff_mm;
  j["lambda_s_um"] = p.lambda_s_um;
  j["evaluation_length_mm"] = p.evaluation_length_mm;
  j["sampling_lengths"] = p.sampling_lengths;
  j["traces"] = p.traces;
  j["direction"] = p.direction;
  j["direction_deg"] = p.direction_deg;
  j["lay_deg"] = p.lay_deg;
  j["lay_source"] = p.lay_source;
  j["cutoff_rule"] = p.cutoff_rule;
  j["periodic"] = p.periodic;
  j["acf_peak"] = p.acf_peak;
  j["iso1302_grade"] = p.iso1302_grade;
  j["stylus_tip_um"] = p.stylus_tip_um;
  j["primary"] = letter_json('P', p.primary);
  j["waviness"] = letter_json('W', p.waviness);
  return j;
}

nlohmann::json areal_json(const ArealReport& a) {
  const ArealParameters& s = a.parameters;
  nlohmann::json j;
  j["Sa_um"] = s.sa_um;
  j["Sq_um"] = s.sq_um;
  j["Sp_um"] = s.sp_um;
  j["Sv_um"] = s.sv_um;
  j["Sz_um"] = s.sz_um;
  j["Ssk"] = s.ssk;
  j["Sku"] = s.sku;
  j["Sdr"] = s.sdr;
  j["Str"] = a.spatial.str;
  j["Sal_mm"] = a.spatial.sal_mm;
  j["lay_deg"] = a.spatial.lay_deg;
  j["lay_strength"] = a.spatial.lay_strength;
  j["s_filter_mm"] = a.s_filter_mm;
  j["l_filter_mm"] = a.l_filter_mm;
  return j;
}

nlohmann::json texture_report_json(const TextureReport& r) {
  nlohmann::json j;
  j["profile"] = profile_json(r.profile);
  j["areal"] = areal_json(r.areal);
  j["cell_mm"] = r.cell_mm;
  j["size_mm"] = {r.size_x_mm, r.size_y_mm};
  j["cells"] = r.cells;
  j["reached_cells"] = r.reached_cells;
  j["warnings"] = r.warnings;
  return j;
}

nlohmann::json trace_report_json(const TraceReport& r, int points, int missing_points) {
  nlohmann::json j;
  j["kind"] = "trace";
  j["profile"] = profile_json(r.profile);
  j["spacing_mm"] = r.spacing_mm;
  j["length_mm"] = r.length_mm;
  j["points"] = points;
  j["missing_points"] = missing_points;
  j["warnings"] = r.warnings;
  return j;
}

}  // namespace cuspmap

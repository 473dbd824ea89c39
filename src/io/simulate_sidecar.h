// The texture settings `simulate` used for a floor, read back from the report.json it writes
// beside height.npy, so that `texture` on that file measures it the same way (same lay, so the
// same traces; a fixed cut-off stays fixed). Inputs: the heightmap's path; output: settings.
// Method: the report.json keys profile.lay_source, profile.lay_deg, profile.cutoff_rule and
// profile.cutoff_mm (io/texture_json.cpp).
#pragma once

#include <optional>
#include <string>

namespace cuspmap {

/// What a report.json beside a heightmap says about how its texture was measured.
struct SimulateSidecar {
  std::optional<double> lay_deg;    ///< lay `simulate` knew (the path's passes or --lay), deg
  std::optional<double> cutoff_mm;  ///< lambda-c when `simulate` was given a fixed one, mm
  std::string file;                 ///< the report.json read (empty when none)
};

/// Reads report.json beside `heightmap_path` when there is one and it was written by
/// `simulate` (a report without these keys, or none, gives an empty result: the surface is then
/// measured by the default rules). Never throws for a missing or foreign file.
SimulateSidecar read_simulate_sidecar(const std::string& heightmap_path);

}  // namespace cuspmap

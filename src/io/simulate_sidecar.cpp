// report.json beside a heightmap -> the lay and fixed cut-off `simulate` measured it with.
// Inputs: heightmap path; output: SimulateSidecar. Method: keys of io/texture_json.cpp.
#include "io/simulate_sidecar.h"

#include <cmath>
#include <filesystem>
#include <fstream>
#include <nlohmann/json.hpp>
#include <sstream>

namespace cuspmap {

SimulateSidecar read_simulate_sidecar(const std::string& heightmap_path) {
  SimulateSidecar out;
  const std::filesystem::path side =
      std::filesystem::path(heightmap_path).parent_path() / "report.json";
  std::error_code ec;
  if (!std::filesystem::is_regular_file(side, ec)) return out;
  std::ifstream in(side, std::ios::binary);
  std::stringstream text;
  text << in.rdbuf();
  const nlohmann::json doc = nlohmann::json::parse(text.str(), nullptr, false);
  if (doc.is_discarded() || !doc.is_object() || !doc.contains("profile")) return out;
  const nlohmann::json& p = doc["profile"];
  if (!p.is_object()) return out;
  const auto number = [&](const char* key) -> std::optional<double> {
    const auto it = p.find(key);
    if (it == p.end() || !it->is_number()) return std::nullopt;
    const double v = it->get<double>();
    return std::isfinite(v) ? std::optional<double>(v) : std::nullopt;
  };
  const auto text_of = [&](const char* key) {
    const auto it = p.find(key);
    return it != p.end() && it->is_string() ? it->get<std::string>() : std::string();
  };
  if (text_of("lay_source") == "known") out.lay_deg = number("lay_deg");
  if (text_of("cutoff_rule") == "fixed") {
    const auto c = number("cutoff_mm");
    if (c && *c > 0.0) out.cutoff_mm = c;
  }
  if (out.lay_deg || out.cutoff_mm) out.file = side.string();
  return out;
}

}  // namespace cuspmap

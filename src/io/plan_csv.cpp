// CSV rows of a stepover plan (RFC 4180 quoting, locale-independent numbers). O(options).
// Method: RFC 4180 field quoting; std::to_chars shortest round-trip numbers.
#include "io/plan_csv.h"

#include <charconv>

namespace cuspmap {
namespace {

std::string field(const std::string& text) {
  if (text.find_first_of(",\"\n") == std::string::npos) return text;
  std::string out = "\"";
  for (const char c : text) out += c == '"' ? std::string("\"\"") : std::string(1, c);
  return out + "\"";
}

std::string num(double v) {
  char buf[64];
  const auto r = std::to_chars(buf, buf + sizeof buf, v);
  return std::string(buf, r.ptr);
}

}  // namespace

std::string encode_plan_csv(const PlanResult& plan) {
  std::string csv =
      "tool,stepover_mm,passes,path_length_mm,machine_time_s,cusp_um,Sv_um,Ra_um,simulated,"
      "sanded,grits,bench_time_s,removed_volume_mm3,final_Ra_um,machine_cost,bench_cost,cost,"
      "meets_spec,best,reason\n";
  for (std::size_t k = 0; k < plan.options.size(); ++k) {
    const PlanOption& p = plan.options[k];
    std::string grits;
    if (p.allowance) {
      for (const GritStep& g : p.allowance->grits.steps)
        grits += (grits.empty() ? "" : " ") + g.grit;
    }
    csv += field(p.tool) + "," + num(p.stepover_mm) + "," + std::to_string(p.machine.passes) + "," +
           num(p.machine.path_length_mm) + "," + num(p.machine.machine_time_s) + "," +
           num(p.surface.sz_um) + "," + num(p.surface.sv_um) + "," + num(p.surface.ra_um) + "," +
           (p.simulated ? "1" : "0") + "," + (p.sanded ? "1" : "0") + "," + field(grits) + "," +
           num(p.bench_time_s) + "," + num(p.removed_volume_mm3) + "," + num(p.final_ra_um) + "," +
           num(p.machine_cost) + "," + num(p.bench_cost) + "," + num(p.cost) + "," +
           (p.meets_spec ? "1" : "0") + "," + (plan.best && *plan.best == k ? "1" : "0") + "," +
           field(p.reason) + "\n";
  }
  return csv;
}

}  // namespace cuspmap

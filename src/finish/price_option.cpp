// Cost of a finishing option (machine + bench at hourly rates), its finished Ra and peak-to-valley,
// the spec verdict with a one-line reason, and the cheapest option meeting the spec.
// Method: DESIGN.md "Finish decisions"; sanding from sanding_allowance (layered scratch model).
#include "finish/price_option.h"

#include <cassert>
#include <cmath>
#include <utility>

#include "core/units.h"

namespace cuspmap {
namespace {

constexpr double kSecondsPerHour = 3600.0;

// Heights in reasons are shown to 0.1 um, Ra to 0.001 um (finer digits are noise next to the
// model's own error).
std::string um_text(double um) { return format_number(std::round(um * 10.0) / 10.0) + " um"; }

// Whether a finish meets the targets; on a miss, `why` names the first target missed.
bool meets_targets(const PlanSpec& spec, double ra_um, double peak_to_valley_um, const char* what,
                   std::string& why) {
  if (spec.target_ra_um && ra_um > *spec.target_ra_um) {
    why = std::string(what) + " Ra " + format_number(std::round(ra_um * 1000.0) / 1000.0) +
          " um > target " + format_number(*spec.target_ra_um) + " um";
    return false;
  }
  if (spec.target_scallop_um && peak_to_valley_um > *spec.target_scallop_um) {
    why = std::string(what) + " peak-to-valley " + um_text(peak_to_valley_um) + " > target " +
          format_number(*spec.target_scallop_um) + " um";
    return false;
  }
  return true;
}

}  // namespace

PlanOption price_option(const std::string& tool, const Cutter& cutter, double stepover_mm,
                        const MachineTime& machine, const SurfaceHeights& surface, bool simulated,
                        const PlanSpec& spec) {
  assert(!spec.grits.empty() && spec.area_mm2 > 0.0 && "the caller validates the plan spec");
  PlanOption option;
  option.tool = tool;
  option.cutter = cutter;
  option.stepover_mm = stepover_mm;
  option.machine = machine;
  option.surface = surface;
  option.simulated = simulated;

  std::string why;
  const bool machined_ok = meets_targets(spec, surface.ra_um, surface.sz_um, "as machined", why);
  if (spec.sanding == SandingMode::WhenNeeded && machined_ok) {
    option.final_ra_um = surface.ra_um;
    option.final_peak_to_valley_um = surface.sz_um;
    option.meets_spec = true;
    option.reason = "meets the finish spec as machined: no sanding";
  } else {
    // No target passed: the spec verdict is made here, on the finish the option ends with.
    Allowance allowance = sanding_allowance(surface, spec.grit_table, spec.grits, spec.area_mm2,
                                            spec.tolerance_um, std::nullopt);
    if (!allowance.grits.needed) {
      // Sanding would end no finer than machined: the option ends as machined.
      option.final_ra_um = surface.ra_um;
      option.final_peak_to_valley_um = surface.sz_um;
      option.meets_spec = machined_ok;
      option.reason = machined_ok ? allowance.grits.verdict
                                  : why + "; " + allowance.grits.verdict +
                                        (allowance.grits.finer_grit.empty()
                                             ? ": use a finer stepover"
                                             : ": add " + allowance.grits.finer_grit + " or finer");
    } else {
      option.sanded = true;
      option.bench_time_s = allowance.grits.total_time_s;
      option.removed_volume_mm3 = allowance.grits.total_volume_mm3;
      option.final_ra_um = allowance.grits.final_ra_um;
      option.final_peak_to_valley_um = allowance.grits.final_scratch_um;
      const bool finish_ok =
          meets_targets(spec, option.final_ra_um, option.final_peak_to_valley_um,
                        ("after " + allowance.grits.steps.back().grit).c_str(), why);
      if (!finish_ok) {
        option.reason = why + ": add finer grades";
      } else if (!allowance.within_tolerance) {
        option.reason = "sanding changes the dimension by up to " +
                        um_text(allowance.dimension_change_um) + " > tolerance +-" +
                        format_number(*allowance.tolerance_um) + " um";
      } else {
        option.meets_spec = true;
        option.reason = "meets the finish spec after sanding " +
                        allowance.grits.steps.front().grit + " to " +
                        allowance.grits.steps.back().grit;
      }
    }
    option.allowance = std::move(allowance);
  }
  option.machine_cost = spec.machine_rate_per_hour * machine.machine_time_s / kSecondsPerHour;
  option.bench_cost = spec.bench_rate_per_hour * option.bench_time_s / kSecondsPerHour;
  option.cost = option.machine_cost + option.bench_cost;
  return option;
}

std::optional<std::size_t> cheapest_option(const std::vector<PlanOption>& options) {
  std::optional<std::size_t> best;
  for (std::size_t k = 0; k < options.size(); ++k) {
    if (!options[k].meets_spec) continue;
    if (!best) {
      best = k;
      continue;
    }
    const PlanOption& o = options[k];
    const PlanOption& b = options[*best];
    // Equal cost: the finer finish the option ends with wins.
    if (o.cost < b.cost || (o.cost == b.cost && o.final_ra_um < b.final_ra_um)) best = k;
  }
  return best;
}

}  // namespace cuspmap

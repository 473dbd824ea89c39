// Prices one finishing option (tool + stepover): machine time from its path, bench time from the
// sanding its marks need, total cost at the user's hourly rates, and whether the finished surface
// meets the spec; then picks the cheapest option that does. Times s, heights um, rates per hour.
// Method: cost = machine rate x machine time + bench rate x bench time (DESIGN.md "Finish
// decisions"); bench time from sanding_allowance's grit sequence.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "finish/grit_table.h"
#include "finish/sanding_allowance.h"
#include "finish/surface_heights.h"
#include "finish/toolpath_machine_time.h"
#include "tool/cutter.h"

namespace cuspmap {

/// When an option is sanded.
enum class SandingMode {
  WhenNeeded,  ///< only when the machined surface misses the finish target
  Always,      ///< always (e.g. visible marks are not acceptable whatever their Ra)
};

/// The finish spec, the rates and the sanding set-up shared by all options of a plan.
struct PlanSpec {
  std::optional<double> target_ra_um;  ///< finished Ra must be <= this, um
  std::optional<double>
      target_scallop_um;  ///< finished peak-to-valley (cusp, or last scratches) <= this, um
  std::optional<double> tolerance_um;             ///< +- tolerance the sanding may use up, um
  SandingMode sanding = SandingMode::WhenNeeded;  ///< when to sand
  double machine_rate_per_hour = 0.0;  ///< cost of one machine hour, currency-neutral, >= 0
  double bench_rate_per_hour = 0.0;    ///< cost of one bench (sanding) hour, >= 0
  double area_mm2 = 0.0;               ///< finished area, mm^2, > 0
  GritTable grit_table;                ///< grades available
  std::vector<std::string> grits;      ///< sanding sequence, coarse to fine, non-empty
};

/// One priced option.
struct PlanOption {
  std::string tool;                    ///< label of the tool, e.g. "ball D6"
  Cutter cutter;                       ///< the cutter
  double stepover_mm = 0.0;            ///< stepover, mm
  MachineTime machine;                 ///< machine side
  SurfaceHeights surface;              ///< machined surface heights, um
  bool simulated = false;              ///< surface from a simulated heightfield (else closed form)
  bool sanded = false;                 ///< the option includes sanding
  std::optional<Allowance> allowance;  ///< sanding detail when sanding was considered (its
                                       ///< grits.needed is false when it was not worth doing)
  double bench_time_s = 0.0;           ///< sanding time over the area, s (0 when not sanded)
  double removed_volume_mm3 = 0.0;     ///< volume sanded off, mm^3
  double final_ra_um = 0.0;            ///< Ra of the finished surface, um
  double final_peak_to_valley_um = 0.0;  ///< cusp (not sanded) or last scratch depth (sanded), um
  double machine_cost = 0.0;             ///< machine rate x machine time
  double bench_cost = 0.0;               ///< bench rate x bench time
  double cost = 0.0;                     ///< machine_cost + bench_cost
  bool meets_spec = false;               ///< finish target(s) and tolerance met
  std::string reason;                    ///< one line: why it meets or misses the spec
};

/// The priced options of a plan (tools in order, stepovers ascending) and the best one.
struct PlanResult {
  std::vector<PlanOption> options;  ///< every option tried
  std::optional<std::size_t> best;  ///< index of the cheapest option meeting the spec, or none
};

/// Prices an option.
/// @param[in] tool         label for reports
/// @param[in] cutter       validated cutter
/// @param[in] stepover_mm  > 0
/// @param[in] machine      machine time of its path
/// @param[in] surface      machined surface heights, um
/// @param[in] simulated    whether `surface` came from a simulation
/// @param[in] spec         finish spec, rates, sanding set-up
PlanOption price_option(const std::string& tool, const Cutter& cutter, double stepover_mm,
                        const MachineTime& machine, const SurfaceHeights& surface, bool simulated,
                        const PlanSpec& spec);

/// Index of the cheapest option that meets the spec (on equal cost the one that ends with the
/// finer Ra, then the first), or empty when none does. Options are judged by the finish they end
/// with (final_ra_um: sanded, or as machined when sanding would not make it finer).
std::optional<std::size_t> cheapest_option(const std::vector<PlanOption>& options);

}  // namespace cuspmap

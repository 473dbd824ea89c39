// Stepover plan: real raster path per option for machine time, closed-form or simulated surface,
// sanding and cost per option, cheapest option within the spec. Lengths mm, times s.
// Method: DESIGN.md "Finish decisions" (machine time vs bench time at user rates).
#include "finish/plan_stepover.h"

#include <algorithm>
#include <cassert>
#include <cmath>

#include "finish/cusp_profile_heights.h"
#include "path/raster.h"

namespace cuspmap {
namespace {

// Default stepover range as fractions of the diameter (common practice, no source): 1% is a
// very fine ball finish, 60% a coarse flat-end pass.
constexpr double kMinStepoverFraction = 0.01;
constexpr double kMaxStepoverFraction = 0.6;

}  // namespace

std::vector<double> default_stepovers_mm(double diameter_mm) {
  std::vector<double> s;
  const double lo = kMinStepoverFraction * diameter_mm, hi = kMaxStepoverFraction * diameter_mm;
  for (int k = 0; k < kDefaultStepoverCount; ++k) {
    s.push_back(lo * std::pow(hi / lo, static_cast<double>(k) / (kDefaultStepoverCount - 1)));
  }
  return s;
}

PlanResult plan_stepover(const PlanRequest& request) {
  assert(!request.tools.empty() && "the caller validates a non-empty tool list");
  PlanSpec spec = request.spec;
  spec.area_mm2 = request.patch.size_x_mm * request.patch.size_y_mm;
  PlanResult result;
  for (const PlanTool& tool : request.tools) {
    std::vector<double> stepovers = tool.stepovers_mm.empty()
                                        ? default_stepovers_mm(tool.cutter.diameter_mm)
                                        : tool.stepovers_mm;
    std::sort(stepovers.begin(), stepovers.end());
    for (const double s : stepovers) {
      PathSpec path;
      path.kind = PathKind::Raster;
      path.stepover_mm = s;
      path.angle_deg = 0.0;
      path.direction = request.direction;
      const Toolpath moves = raster_path(path, request.cut, request.patch, tool.cutter);
      const MachineTime machine =
          toolpath_machine_time(moves, path.angle_deg, request.pass_overhead_s);
      const bool simulated = static_cast<bool>(request.simulate);
      const SurfaceHeights surface =
          simulated ? request.simulate(tool.cutter, s) : cusp_profile_heights(tool.cutter, s);
      result.options.push_back(
          price_option(tool.label, tool.cutter, s, machine, surface, simulated, spec));
    }
  }
  result.best = cheapest_option(result.options);
  return result;
}

}  // namespace cuspmap

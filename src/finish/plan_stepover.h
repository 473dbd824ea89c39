// Stepover plan: for each tool and stepover, the machine time of the real raster over the patch,
// the surface it leaves (closed form, or simulated on request), the sanding that surface needs,
// and the cost at machine and bench rates; then the cheapest option that meets the spec.
// Cost: O(options x path moves); simulated: + one small sweep per option (see simulated_heights).
// Method: DESIGN.md "Finish decisions"; path from raster_path, surface from cusp_profile_heights.
#pragma once

#include <functional>
#include <optional>
#include <string>
#include <vector>

#include "core/heightfield.h"
#include "finish/price_option.h"
#include "path/path_spec.h"
#include "tool/cutter.h"

namespace cuspmap {

/// One tool of the plan and the stepovers to try with it.
struct PlanTool {
  std::string label;                 ///< shown in tables, e.g. "12.7 mm flat"
  Cutter cutter;                     ///< validated cutter
  std::vector<double> stepovers_mm;  ///< each in (0, D]; empty = default_stepovers_mm(D)
};

/// Everything a plan needs.
struct PlanRequest {
  std::vector<PlanTool> tools;  ///< at least one
  Patch patch;                  ///< finished area (size_x, size_y mm); cell unused
  CutSpec cut;                  ///< feed, rapid rate, retract (depth 0: on the floor)
  RasterDirection direction = RasterDirection::OneWay;  ///< raster passes
  double pass_overhead_s = kDefaultPassOverheadS;       ///< per-pass overhead, s, >= 0
  PlanSpec spec;  ///< finish spec, rates, sanding (area = patch area)
  /// Surface of an option when simulating (tool, stepover -> heights); empty = closed form.
  std::function<SurfaceHeights(const Cutter&, double stepover_mm)> simulate;
};

/// Default stepovers for a tool: kDefaultStepoverCount values spaced geometrically from 1% to
/// 60% of the diameter (fine ball passes to coarse flat-end passes; common practice, no source).
std::vector<double> default_stepovers_mm(double diameter_mm);

/// Number of default stepovers per tool.
inline constexpr int kDefaultStepoverCount = 24;

/// Runs the plan.
/// @param[in] request  validated request (tools non-empty, stepovers in (0, D], rates >= 0)
PlanResult plan_stepover(const PlanRequest& request);

}  // namespace cuspmap

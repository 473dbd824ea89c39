// Sanding allowance from the marks' height parameters: depth to clear, mean removal, stock in two
// conventions, volumes (mm^3, in^3) and the tolerance verdict. Heights um, areas mm^2.
// Method: Sz/Sv of ISO 25178-2 as depth to clear / average thickness; 1 in^3 = 25.4^3 mm^3 exactly;
// final level below the valleys from grit_sequence's layered scratch model.
#include "finish/sanding_allowance.h"

#include <cassert>
#include <cmath>

#include "core/units.h"

namespace cuspmap {

Allowance sanding_allowance(const SurfaceHeights& marks, const GritTable& table,
                            const std::vector<std::string>& sequence, double area_mm2,
                            std::optional<double> tolerance_um,
                            std::optional<double> target_ra_um) {
  assert(std::isfinite(marks.sz_um) && marks.sz_um >= 0.0 && marks.sv_um >= 0.0 &&
         "height parameters are finite and non-negative");
  Allowance a;
  a.depth_to_clear_um = marks.sz_um;
  a.mean_removal_um = marks.sv_um;
  a.area_mm2 = area_mm2;
  a.tolerance_um = tolerance_um;
  if (target_ra_um && marks.ra_um <= *target_ra_um) {
    a.grits.needed = false;
    a.grits.final_ra_um = marks.ra_um;
    a.grits.final_scratch_um = marks.sz_um;
    a.grits.verdict = "no sanding needed: the machined Ra " + format_number(marks.ra_um) +
                      " um already meets the target " + format_number(*target_ra_um) + " um";
  } else {
    a.grits = grit_sequence(marks, table, sequence, area_mm2);
  }
  a.volume_per_area_mm3_per_mm2 = marks.sv_um / kUmPerMm;
  a.volume_mm3 = a.volume_per_area_mm3_per_mm2 * area_mm2;
  a.volume_in3 = a.volume_mm3 / kMm3PerIn3;
  if (!a.grits.needed) return a;  // nothing sanded: no stock, no sequence, no dimension change
  // The sanded mean ends mean_below_valleys below the machined valleys; the valleys sit Sv below
  // the machined mean.
  a.stock_valleys_nominal_um = a.grits.mean_below_valleys_um;
  a.stock_mean_nominal_um = marks.sv_um + a.grits.mean_below_valleys_um;
  a.sequence_volume_mm3 = a.grits.total_volume_mm3;
  a.sequence_volume_in3 = a.sequence_volume_mm3 / kMm3PerIn3;
  a.dimension_change_um = marks.sz_um + a.grits.deepest_below_valleys_um;
  a.within_tolerance = !tolerance_um || a.dimension_change_um <= *tolerance_um;
  return a;
}

}  // namespace cuspmap

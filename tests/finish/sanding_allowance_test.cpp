// Tests of the sanding allowance: depth to clear and mean removal on the ideal cusp, the two
// stock conventions, volume units (1 in^3 = 16387.064 mm^3 exactly), area scaling, tolerance.
#include "finish/sanding_allowance.h"

#include <cmath>

#include "finish/cusp_profile_heights.h"
#include "test_support.h"

namespace cuspmap {
namespace {

Cutter ball(double diameter_mm) {
  Cutter c;
  c.shape = CutterShape::Ball;
  c.diameter_mm = diameter_mm;
  return c;
}

}  // namespace

TEST_CASE("sanding_allowance: on the ideal cusp, depth to clear is h and mean removal ~h/3",
          "[finish]") {
  // Ball D 10 mm, stepover 0.4 mm: h = 5 - sqrt(25 - 0.04) mm (handbook scallop formula);
  // parabolic mean h/3 (DESIGN.md), the circle's excess over it is O(h/R) ~ 1e-3 relative.
  const GritTable t = default_grit_table();
  const SurfaceHeights cusp = cusp_profile_heights(ball(10.0), 0.4);
  const Allowance a = sanding_allowance(cusp, t, t.sequence, 10000.0, std::nullopt, std::nullopt);
  const double h_um = (5.0 - std::sqrt(25.0 - 0.04)) * 1000.0;
  REQUIRE_NEAR(a.depth_to_clear_um, h_um, 1e-9);
  REQUIRE_NEAR(a.mean_removal_um, h_um / 3.0, 1e-3 * h_um);
  REQUIRE_NEAR(a.volume_per_area_mm3_per_mm2, a.mean_removal_um / 1000.0, 1e-15);
  REQUIRE_NEAR(a.volume_mm3, a.mean_removal_um / 1000.0 * 10000.0, 1e-9);
  // Stock: the mean-on-nominal convention leaves exactly Sv more than valleys-on-nominal.
  REQUIRE_NEAR(a.stock_mean_nominal_um - a.stock_valleys_nominal_um, a.mean_removal_um, 1e-12);
  REQUIRE(a.stock_valleys_nominal_um == a.grits.mean_below_valleys_um);
  REQUIRE_NEAR(a.dimension_change_um, h_um + a.grits.deepest_below_valleys_um, 1e-9);
}

TEST_CASE("sanding_allowance: mm^3 to in^3 uses 1 in^3 = 16387.064 mm^3 exactly", "[finish]") {
  // 1 in = 25.4 mm exactly (international inch, 1959), so 1 in^3 = 25.4^3 mm^3 = 16387.064 mm^3.
  REQUIRE_NEAR(kMm3PerIn3, 25.4 * 25.4 * 25.4, 1e-9);
  REQUIRE(kMm3PerIn3 == 16387.064);
  const GritTable t = default_grit_table();
  SurfaceHeights marks;
  marks.sz_um = 30.0;
  marks.sv_um = 10.0;  // 0.01 mm of mean thickness
  marks.sp_um = 20.0;
  marks.ra_um = 7.7;  // ideal cusp Ra ~ 0.2566 Sz (DESIGN.md): coarser than any grade leaves
  // Area chosen so the marks' volume is exactly one cubic inch: 16387.064 / 0.01 mm^2.
  const Allowance a =
      sanding_allowance(marks, t, t.sequence, 1638706.4, std::nullopt, std::nullopt);
  REQUIRE_NEAR(a.volume_mm3, 16387.064, 1e-6);
  REQUIRE_NEAR(a.volume_in3, 1.0, 1e-12);
  REQUIRE_NEAR(a.sequence_volume_in3, a.sequence_volume_mm3 / 16387.064, 1e-12);
}

TEST_CASE("sanding_allowance: volumes and times scale linearly with area", "[finish]") {
  const GritTable t = default_grit_table();
  const SurfaceHeights cusp = cusp_profile_heights(ball(6.0), 0.5);
  const Allowance small =
      sanding_allowance(cusp, t, t.sequence, 1000.0, std::nullopt, std::nullopt);
  const Allowance big = sanding_allowance(cusp, t, t.sequence, 3000.0, std::nullopt, std::nullopt);
  REQUIRE_NEAR(big.volume_mm3, 3.0 * small.volume_mm3, 1e-9);
  REQUIRE_NEAR(big.volume_in3, 3.0 * small.volume_in3, 1e-12);
  REQUIRE_NEAR(big.sequence_volume_mm3, 3.0 * small.sequence_volume_mm3, 1e-9);
  REQUIRE_NEAR(big.grits.total_time_s, 3.0 * small.grits.total_time_s, 1e-9);
  // Depths and stocks do not depend on area.
  REQUIRE(big.depth_to_clear_um == small.depth_to_clear_um);
  REQUIRE(big.stock_mean_nominal_um == small.stock_mean_nominal_um);
}

TEST_CASE("sanding_allowance: tolerance verdict compares the dimension change", "[finish]") {
  const GritTable t = default_grit_table();
  const SurfaceHeights cusp = cusp_profile_heights(ball(6.0), 0.5);
  const Allowance free = sanding_allowance(cusp, t, t.sequence, 100.0, std::nullopt, std::nullopt);
  REQUIRE(free.within_tolerance);
  REQUIRE_FALSE(free.tolerance_um.has_value());
  const double change = free.dimension_change_um;
  REQUIRE(sanding_allowance(cusp, t, t.sequence, 100.0, change * 1.001, std::nullopt)
              .within_tolerance);
  REQUIRE_FALSE(sanding_allowance(cusp, t, t.sequence, 100.0, change * 0.999, std::nullopt)
                    .within_tolerance);
}

TEST_CASE("sanding_allowance: issue_13: marks finer than the last grade leaves are not sanded",
          "[finish]") {
  // A flat end mill without tilt leaves no cross-feed cusp (DESIGN.md closed forms): sanding
  // with P400 would leave Ra 0.35 um (kRaPerParticle x 35 um, from memory) on a finer floor.
  const GritTable t = default_grit_table();
  Cutter flat;
  flat.shape = CutterShape::Flat;
  flat.diameter_mm = 12.7;
  const SurfaceHeights marks = cusp_profile_heights(flat, 0.508);
  REQUIRE(marks.ra_um < find_grit(t, "P400")->ra_um);
  const Allowance a = sanding_allowance(marks, t, t.sequence, 10000.0, std::nullopt, std::nullopt);
  REQUIRE_FALSE(a.grits.needed);
  REQUIRE(a.grits.steps.empty());
  REQUIRE(a.stock_valleys_nominal_um == 0.0);  // stock follows the marks: none to sand
  REQUIRE(a.stock_mean_nominal_um == 0.0);
  REQUIRE(a.grits.total_time_s == 0.0);
  REQUIRE(a.dimension_change_um == 0.0);
  REQUIRE(a.grits.final_ra_um <= marks.ra_um);  // never rougher than machined
  REQUIRE(a.grits.verdict.rfind("no sanding needed", 0) == 0);
}

TEST_CASE("sanding_allowance: issue_13: marks meeting the target Ra are not sanded", "[finish]") {
  // Ball D 6 mm at 0.5 mm: Ra = 4h/(9 sqrt 3), h ~ 10.4 um (handbook cusp): ~2.7 um.
  const GritTable t = default_grit_table();
  const SurfaceHeights cusp = cusp_profile_heights(ball(6.0), 0.5);
  const Allowance meets = sanding_allowance(cusp, t, t.sequence, 100.0, std::nullopt, 3.2);
  REQUIRE_FALSE(meets.grits.needed);
  REQUIRE(meets.stock_valleys_nominal_um == 0.0);
  REQUIRE(meets.grits.final_ra_um == cusp.ra_um);
  const Allowance misses = sanding_allowance(cusp, t, t.sequence, 100.0, std::nullopt, 1.6);
  REQUIRE(misses.grits.needed);
  REQUIRE(misses.grits.final_ra_um < cusp.ra_um);
}

}  // namespace cuspmap

// Tests of option pricing and the cheapest-option choice: cost arithmetic, the spec verdict
// (finish target, sanding, tolerance), never choosing an option that misses the spec, and the
// optimum moving to finer stepovers as the bench rate rises against the machine rate.
#include "finish/price_option.h"

#include <cmath>

#include "finish/cusp_profile_heights.h"
#include "test_support.h"

namespace cuspmap {
namespace {

Cutter ball6() {
  Cutter c;
  c.shape = CutterShape::Ball;
  c.diameter_mm = 6.0;
  return c;
}

PlanSpec base_spec() {
  PlanSpec spec;
  spec.target_ra_um = 0.8;
  spec.machine_rate_per_hour = 90.0;
  spec.bench_rate_per_hour = 45.0;
  spec.area_mm2 = 120.0 * 80.0;
  spec.grit_table = default_grit_table();
  spec.grits = spec.grit_table.sequence;
  return spec;
}

// Machine time of a 120 x 80 mm one-way raster for the test's options: one pass per stepover
// across 80 mm (+1), each 120 + 6 mm long at 1500 mm/min plus 2 s of links. Test input data
// (decreasing in the stepover, as any raster's is); the product's own path is tested in
// plan_stepover_test once built from raster_path.
MachineTime test_machine_time(double stepover_mm) {
  MachineTime m;
  m.passes = static_cast<int>(std::ceil(80.0 / stepover_mm)) + 1;
  m.path_length_mm = m.passes * 126.0;
  m.cycle_time_s = m.path_length_mm / 1500.0 * 60.0 + 2.0 * m.passes;
  m.machine_time_s = m.cycle_time_s;
  return m;
}

std::vector<PlanOption> price_all(const PlanSpec& spec, const std::vector<double>& stepovers) {
  std::vector<PlanOption> options;
  for (const double s : stepovers) {
    options.push_back(price_option("ball D6", ball6(), s, test_machine_time(s),
                                   cusp_profile_heights(ball6(), s), false, spec));
  }
  return options;
}

}  // namespace

TEST_CASE("price_option: cost is rate x time for machine and bench", "[finish]") {
  PlanSpec spec = base_spec();
  spec.sanding = SandingMode::Always;
  const PlanOption o = price_all(spec, {0.6}).front();
  REQUIRE(o.sanded);
  REQUIRE(o.bench_time_s > 0.0);
  REQUIRE_NEAR(o.machine_cost, 90.0 * o.machine.machine_time_s / 3600.0, 1e-12);
  REQUIRE_NEAR(o.bench_cost, 45.0 * o.bench_time_s / 3600.0, 1e-12);
  REQUIRE_NEAR(o.cost, o.machine_cost + o.bench_cost, 1e-12);
  REQUIRE(o.bench_time_s == o.allowance->grits.total_time_s);
  REQUIRE(o.final_ra_um == o.allowance->grits.final_ra_um);
}

TEST_CASE("price_option: a surface that meets the target as machined is not sanded", "[finish]") {
  const PlanSpec spec = base_spec();  // target Ra 0.8 um
  // Ball D6 at 0.1 mm: h ~ 0.42 um, Ra ~ 0.11 um: meets as machined.
  const PlanOption fine = price_all(spec, {0.1}).front();
  REQUIRE_FALSE(fine.sanded);
  REQUIRE(fine.meets_spec);
  REQUIRE(fine.bench_time_s == 0.0);
  REQUIRE(fine.reason == "meets the finish spec as machined: no sanding");
  // At 1.5 mm: h ~ 95 um, Ra ~ 24 um: sanded; P400 leaves Ra 0.35 um (default table), meets.
  const PlanOption coarse = price_all(spec, {1.5}).front();
  REQUIRE(coarse.sanded);
  REQUIRE(coarse.meets_spec);
  REQUIRE(coarse.final_ra_um == spec.grit_table.grits[10].ra_um);
}

TEST_CASE(
    "price_option: misses the spec when the last grade is too coarse or the tolerance "
    "too tight",
    "[finish]") {
  PlanSpec spec = base_spec();
  spec.target_ra_um = 0.2;  // finer than P400's 0.35 um
  const PlanOption rough = price_all(spec, {1.0}).front();
  REQUIRE(rough.sanded);
  REQUIRE_FALSE(rough.meets_spec);
  REQUIRE(rough.reason == "after P400 Ra 0.35 um > target 0.2 um: add finer grades");

  spec = base_spec();
  spec.tolerance_um = 20.0;
  const PlanOption deep = price_all(spec, {2.0}).front();  // h ~ 172 um to sand off
  REQUIRE_FALSE(deep.meets_spec);
  REQUIRE(deep.reason.find("> tolerance +-20 um") != std::string::npos);
}

TEST_CASE("cheapest_option: never picks an option that misses the spec; empty when none meets",
          "[finish]") {
  PlanSpec spec = base_spec();
  spec.tolerance_um = 25.0;
  spec.bench_rate_per_hour = 0.0;  // sanding is free: the coarsest stepovers would be cheapest
  std::vector<double> stepovers;
  for (double s = 0.1; s <= 3.0; s += 0.1) stepovers.push_back(s);
  const std::vector<PlanOption> options = price_all(spec, stepovers);
  const std::optional<std::size_t> best = cheapest_option(options);
  REQUIRE(best.has_value());
  REQUIRE(options[*best].meets_spec);
  for (const PlanOption& o : options) {
    if (o.meets_spec) REQUIRE(o.cost >= options[*best].cost);
  }
  // The coarsest options are cheaper but break the tolerance: they exist and were passed over.
  REQUIRE_FALSE(options.back().meets_spec);
  REQUIRE(options.back().cost < options[*best].cost);

  spec.target_ra_um = 0.01;  // nothing reaches it
  REQUIRE_FALSE(cheapest_option(price_all(spec, stepovers)).has_value());
}

TEST_CASE("cheapest_option: optimum moves to finer stepovers as the bench rate rises", "[finish]") {
  PlanSpec spec = base_spec();
  spec.sanding = SandingMode::Always;  // every option sanded: a real machine/bench trade-off
  std::vector<double> stepovers;
  for (double s = 0.05; s <= 2.5; s *= 1.1) stepovers.push_back(s);
  double previous = 1e9;
  int distinct = 0;
  for (const double ratio : {0.01, 0.1, 0.3, 1.0, 3.0, 10.0, 30.0, 100.0}) {
    CAPTURE(ratio);
    spec.bench_rate_per_hour = spec.machine_rate_per_hour * ratio;
    const std::vector<PlanOption> options = price_all(spec, stepovers);
    const std::optional<std::size_t> best = cheapest_option(options);
    REQUIRE(best.has_value());
    const double chosen = options[*best].stepover_mm;
    REQUIRE(chosen <= previous);
    if (chosen < previous) ++distinct;
    previous = chosen;
  }
  REQUIRE(distinct >= 3);  // the optimum really moves, not a flat answer
}

TEST_CASE("price_option: issue_13: --sand always never ends rougher than machined", "[finish]") {
  PlanSpec spec = base_spec();
  spec.sanding = SandingMode::Always;
  // Ball D6 at 0.1 mm: Ra ~ 0.11 um (handbook cusp x 4/(9 sqrt 3)), finer than the 0.35 um P400
  // leaves (default table, from memory): the option ends as machined, with no bench time.
  const PlanOption fine = price_all(spec, {0.1}).front();
  REQUIRE_FALSE(fine.sanded);
  REQUIRE(fine.bench_time_s == 0.0);
  REQUIRE(fine.final_ra_um == fine.surface.ra_um);
  REQUIRE(fine.meets_spec);
  REQUIRE(fine.reason.rfind("no sanding needed", 0) == 0);
  // At 1.5 mm the marks are coarser than P400's: sanded, ending at P400's Ra.
  const PlanOption coarse = price_all(spec, {1.5}).front();
  REQUIRE(coarse.sanded);
  REQUIRE(coarse.final_ra_um < coarse.surface.ra_um);
  // Judged by the finish they end with: with free machine time the fine option ends finer.
  spec.machine_rate_per_hour = 0.0;
  spec.bench_rate_per_hour = 0.0;
  const std::vector<PlanOption> both = price_all(spec, {1.5, 0.1});
  REQUIRE(cheapest_option(both) == std::optional<std::size_t>(1));
}

}  // namespace cuspmap

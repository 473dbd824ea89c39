// JSON of the tooth-resolved stage: a phase basin with no other basin solved (its margin
// infinite) is written as null, not as a non-finite number the CLI refuses to print.
#include "io/tooth_fit_json.h"

#include "infer/fit_uncertainty.h"

#include <catch2/catch.hpp>

#include <cmath>
#include <limits>

namespace cuspmap {
namespace {

ToothFit ran_fit(double basin_sigmas) {
  ToothFit t;
  t.ran = true;
  t.teeth = 4;
  t.feed_per_tooth_mm = 0.0446;
  t.runout_um = fitted_value(3.4, 0.04, true);
  t.runout_phase_deg = fitted_value(38.0, 25.0, true);
  t.runout_phase_period_deg = 90.0;
  t.dish_deg = fitted_value(0.8, 0.01, true);
  t.runout_basin_sigmas = basin_sigmas;
  return t;
}

TEST_CASE("tooth_fit JSON: no other phase basin solved writes runout_basin_sigmas as null",
          "[io]") {
  // Found by tools/tooth_campaign.py --seed 2030 (tc2, a 4-flute bull-nose): every solved start
  // stopped in one basin, the margin was +inf and `diagnose --json` failed with "non-finite
  // number in JSON output at $.fit.tooth_fit.runout_basin_sigmas" after ~10 min of fit.
  nlohmann::json fit;
  add_tooth_fit_json(ran_fit(std::numeric_limits<double>::infinity()), fit);
  // docs/output-keys.md: "null when no other phase was solved" (common practice, no source).
  REQUIRE(fit["tooth_fit"]["runout_basin_sigmas"].is_null());
  // The rest of the block is still written (derived: only the margin is unknown).
  REQUIRE(fit["runout_um"].get<double>() == Approx(3.4));
  REQUIRE(fit["tooth_fit"]["teeth"].get<int>() == 4);
}

TEST_CASE("tooth_fit JSON: a finite basin margin is written as its number", "[io]") {
  nlohmann::json fit;
  add_tooth_fit_json(ran_fit(146.15), fit);
  // The value passes through unchanged (derived: no scaling in the encoder).
  REQUIRE(fit["tooth_fit"]["runout_basin_sigmas"].get<double>() == Approx(146.15));
}

}  // namespace
}  // namespace cuspmap

// Runs every row of tests/data/cusp_cases.toml (published values with tolerance and source)
// through the cusp library: forward stepovers, targets and turning marks.
#include <toml++/toml.h>

#include <string>

#include "core/units.h"
#include "cusp/cross_feed_cusp.h"
#include "cusp/feed_mark.h"
#include "cusp/inverse_stepover.h"
#include "test_support.h"

namespace {

// A number in the quantity's unit, or a length string converted to it.
double read_value(const toml::node& node, const std::string& quantity) {
  if (const auto* v = node.as_floating_point()) return v->get();
  if (const auto* v = node.as_integer()) return static_cast<double>(v->get());
  const double mm = cuspmap::parse_length_mm(node.value_or(std::string()),
                                             cuspmap::LengthUnit::Millimetre, "case value");
  return quantity.ends_with("_um") ? mm * cuspmap::kUmPerMm : mm;
}

double length_mm(const toml::table& row, const char* key) {
  return cuspmap::parse_length_mm(row[key].value_or(std::string()), cuspmap::LengthUnit::Millimetre,
                                  key);
}

double pick(const cuspmap::CuspResult& r, double stepover_approx, const std::string& q) {
  if (q == "scallop_um") return r.scallop_um;
  if (q == "scallop_approx_um") return r.scallop_approx_um;
  if (q == "ra_um") return r.stats.ra_um;
  if (q == "ra_approx_um") return r.stats_approx.ra_um;
  if (q == "rq_um") return r.stats.rq_um;
  if (q == "rz_um") return r.stats.rz_um;
  if (q == "rz_approx_um") return r.stats_approx.rz_um;
  if (q == "stepover_mm") return r.stepover_mm;
  if (q == "stepover_approx_mm") return stepover_approx;
  if (q == "ra_approx_per_scallop") return r.stats_approx.ra_um / r.scallop_approx_um;
  if (q == "rq_approx_per_scallop") return r.stats_approx.rq_um / r.scallop_approx_um;
  FAIL("unknown quantity " << q);
  return 0.0;
}

cuspmap::FinishTarget target_of(const std::string& mode) {
  if (mode == "ra") return cuspmap::FinishTarget::Ra;
  if (mode == "rz") return cuspmap::FinishTarget::Rz;
  return cuspmap::FinishTarget::Scallop;
}

}  // namespace

TEST_CASE("cusp_cases.toml: published values", "[cusp]") {
  const toml::table doc = toml::parse_file(cuspmap::test::data_path("cusp_cases.toml"));
  const toml::array* cases = doc["case"].as_array();
  REQUIRE(cases != nullptr);
  REQUIRE(cases->size() >= 10);
  for (const toml::node& node : *cases) {
    const toml::table& row = *node.as_table();
    const std::string name = row["name"].value_or(std::string());
    const std::string tool = row["tool"].value_or(std::string());
    const std::string mode = row["mode"].value_or(std::string("forward"));
    const std::string quantity = row["quantity"].value_or(std::string());
    CAPTURE(name, row["source"].value_or(std::string()));
    cuspmap::CuspResult r;
    double approx_step = 0.0;
    auto take = [&](const cuspmap::StepoverSolution& sol) {
      REQUIRE(sol.reachable);
      r = sol.cusp;
      approx_step = sol.stepover_approx_mm;
    };
    const double target_um = mode == "forward" ? 0.0 : length_mm(row, "target") * cuspmap::kUmPerMm;
    if (tool == "insert") {
      const double nose = length_mm(row, "nose_radius");
      if (mode == "forward") {
        r = cuspmap::feed_mark(nose, length_mm(row, "stepover"));
      } else {
        take(cuspmap::inverse_feed_mark(nose, target_of(mode), target_um));
      }
    } else {
      cuspmap::CuspSetup setup;
      setup.cutter.shape = tool == "ball"       ? cuspmap::CutterShape::Ball
                           : tool == "bullnose" ? cuspmap::CutterShape::BullNose
                                                : cuspmap::CutterShape::Flat;
      setup.cutter.diameter_mm = length_mm(row, "diameter");
      if (row.contains("corner_radius"))
        setup.cutter.corner_radius_mm = length_mm(row, "corner_radius");
      if (mode == "forward") {
        r = cuspmap::cross_feed_cusp(setup, length_mm(row, "stepover"));
      } else {
        take(cuspmap::inverse_stepover(setup, target_of(mode), target_um));
      }
    }
    REQUIRE_NEAR(pick(r, approx_step, quantity), read_value(*row.get("expected"), quantity),
                 read_value(*row.get("tolerance"), quantity));
  }
}

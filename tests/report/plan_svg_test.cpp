// Tests of the plan encoders: the SVG chart parses as XML (pugixml) with one set of series per
// tool, a marker per option and the best ringed, labels escaped; the CSV has one row per option
// with RFC 4180 quoting and the best flagged.
#include "report/plan_svg.h"

#include <pugixml.hpp>

#include "finish/cusp_profile_heights.h"
#include "io/plan_csv.h"
#include "test_support.h"

namespace cuspmap {
namespace {

// A small plan priced by the library (machine times are test input: 60 s per pass).
PlanResult small_plan(double target_ra_um) {
  PlanSpec spec;
  spec.target_ra_um = target_ra_um;
  spec.machine_rate_per_hour = 80.0;
  spec.bench_rate_per_hour = 40.0;
  spec.area_mm2 = 5000.0;
  spec.grit_table = default_grit_table();
  spec.grits = spec.grit_table.sequence;
  PlanResult plan;
  for (const char* label : {"6 mm ball", "ball & \"co\" <R3>"}) {
    Cutter c;
    c.diameter_mm = 6.0;
    for (const double s : {0.1, 0.3, 0.9}) {
      MachineTime m;
      m.passes = static_cast<int>(50.0 / s);
      m.machine_time_s = m.cycle_time_s = 60.0 * m.passes;
      plan.options.push_back(price_option(label, c, s, m, cusp_profile_heights(c, s), false, spec));
    }
  }
  plan.best = cheapest_option(plan.options);
  return plan;
}

int count(const pugi::xml_node& root, const char* name) {
  return static_cast<int>(root.select_nodes((std::string("//") + name).c_str()).size());
}

}  // namespace

TEST_CASE("encode_plan_svg: well-formed chart with series per tool and the best ringed", "[report]") {
  const PlanResult plan = small_plan(0.8);
  REQUIRE(plan.best.has_value());
  const std::string svg = encode_plan_svg(plan, PlanSvgOptions{});
  pugi::xml_document doc;
  const pugi::xml_parse_result parsed = doc.load_string(svg.c_str());
  INFO(parsed.description());
  REQUIRE(parsed);
  const pugi::xml_node root = doc.child("svg");
  REQUIRE(root);
  REQUIRE(std::string(root.attribute("width").value()) == "880");
  REQUIRE(count(root, "polyline") == 3 * 2);  // total, machine, bench per tool
  REQUIRE(count(root, "circle") == 6 + 1);    // a marker per option + the ring
  REQUIRE(svg.find("ball &amp; &quot;co&quot; &lt;R3&gt;") != std::string::npos);
  REQUIRE(svg.find("ringed: best") != std::string::npos);
  // Deterministic: same plan, same bytes.
  REQUIRE(encode_plan_svg(plan, PlanSvgOptions{}) == svg);
}

TEST_CASE("encode_plan_svg: says so when nothing meets the spec or there is nothing to draw",
          "[report]") {
  const PlanResult none = small_plan(0.01);
  REQUIRE_FALSE(none.best.has_value());
  const std::string svg = encode_plan_svg(none, PlanSvgOptions{});
  REQUIRE(svg.find("no option meets the spec") != std::string::npos);
  pugi::xml_document doc;
  REQUIRE(doc.load_string(svg.c_str()));
  REQUIRE(count(doc.child("svg"), "circle") == 6);  // no ring
  pugi::xml_document empty;
  REQUIRE(empty.load_string(encode_plan_svg(PlanResult{}, PlanSvgOptions{}).c_str()));
}

TEST_CASE("encode_plan_csv: one row per option, quoted fields, best flagged", "[report]") {
  const PlanResult plan = small_plan(0.8);
  const std::string csv = encode_plan_csv(plan);
  std::vector<std::string> lines;
  for (std::size_t start = 0; start < csv.size();) {
    const std::size_t end = csv.find('\n', start);
    lines.push_back(csv.substr(start, end - start));
    start = end + 1;
  }
  REQUIRE(lines.size() == 1 + plan.options.size());
  REQUIRE(lines[0].rfind("tool,stepover_mm,passes,", 0) == 0);
  // RFC 4180: a field with quotes or commas is quoted, its quotes doubled.
  REQUIRE(lines[4].rfind("\"ball & \"\"co\"\" <R3>\",0.1,", 0) == 0);
  int best_rows = 0;
  for (std::size_t k = 1; k < lines.size(); ++k) {
    // "...,meets_spec,best,reason": the best column is the second to last before the reason.
    const bool is_best = *plan.best == k - 1;
    if (is_best) {
      ++best_rows;
      REQUIRE(lines[k].find(",1,1,") != std::string::npos);
    }
  }
  REQUIRE(best_rows == 1);
}

}  // namespace cuspmap

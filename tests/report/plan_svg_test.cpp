// Tests of the plan encoders: the SVG chart parses as XML (pugixml) with one set of series per
// tool, a marker per option and the best ringed, labels escaped; the CSV has one row per option
// with RFC 4180 quoting and the best flagged.
#include "report/plan_svg.h"

#include <cstdio>
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

// A plan of three tools with long labels, two of them priced the same (their lines coincide).
PlanResult crowded_plan() {
  PlanSpec spec;
  spec.target_ra_um = 0.8;
  spec.machine_rate_per_hour = 80.0;
  spec.bench_rate_per_hour = 40.0;
  spec.area_mm2 = 5000.0;
  spec.grit_table = default_grit_table();
  spec.grits = spec.grit_table.sequence;
  PlanResult plan;
  for (const char* label : {"bull-nose 10 mm, corner radius 1 mm, 0.5 deg dish, tilt 0.02 deg",
                            "the same bull-nose on the second spindle, tilt 0.02 deg",
                            "6 mm ball, 2 teeth, climb, extra-long-label-without-any-spaces-at-all"}) {
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

// The box a text element takes at the chart's own width budget (kPlanSvgCharEm per character):
// from 0.8 em above the baseline to 0.25 em below it (ascent/descent of sans-serif faces,
// derived from their metrics), shifted by text-anchor; rotated -90 deg for the y-axis title.
struct Box {
  double x0, y0, x1, y1;
  std::string text;
};

Box text_box(const pugi::xml_node& t, double font_px) {
  const std::string text = t.child_value();
  const double fs = t.attribute("font-size") ? t.attribute("font-size").as_double() : font_px;
  const double w = kPlanSvgCharEm * fs * static_cast<double>(text.size());
  const std::string anchor = t.attribute("text-anchor").value();
  const double shift = anchor == "middle" ? -0.5 * w : anchor == "end" ? -w : 0.0;
  const std::string transform = t.attribute("transform").value();
  if (!transform.empty()) {
    // "translate(X Y) rotate(-90)": the text runs upwards from (X, Y).
    double tx = 0, ty = 0;
    REQUIRE(std::sscanf(transform.c_str(), "translate(%lf %lf) rotate(-90)", &tx, &ty) == 2);
    return {tx - 0.8 * fs, ty - shift - w, tx + 0.25 * fs, ty - shift, text};
  }
  const double x = t.attribute("x").as_double(), y = t.attribute("y").as_double();
  return {x + shift, y - 0.8 * fs, x + shift + w, y + 0.25 * fs, text};
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

TEST_CASE("encode_plan_svg: every text inside the picture, no two texts overlap, equal series "
          "apart",
          "[report]") {
  for (const bool inch : {false, true}) {
    const PlanResult plan = crowded_plan();
    PlanSvgOptions options;
    options.inch = inch;
    const std::string svg = encode_plan_svg(plan, options);
    pugi::xml_document doc;
    REQUIRE(doc.load_string(svg.c_str()));
    const pugi::xml_node root = doc.child("svg");
    double vx = 0, vy = 0, vw = 0, vh = 0;
    REQUIRE(std::sscanf(root.attribute("viewBox").value(), "%lf %lf %lf %lf", &vx, &vy, &vw,
                        &vh) == 4);
    const double font_px = root.attribute("font-size").as_double();
    std::vector<Box> boxes;
    for (const pugi::xpath_node& n : root.select_nodes("//text")) {
      boxes.push_back(text_box(n.node(), font_px));
    }
    REQUIRE(boxes.size() > 10);
    for (const Box& b : boxes) {
      CAPTURE(b.text, b.x0, b.y0, b.x1, b.y1);
      REQUIRE(b.x0 >= vx);
      REQUIRE(b.y0 >= vy);
      REQUIRE(b.x1 <= vx + vw);
      REQUIRE(b.y1 <= vy + vh);
    }
    for (std::size_t a = 0; a < boxes.size(); ++a) {
      for (std::size_t b = a + 1; b < boxes.size(); ++b) {
        const bool apart = boxes[a].x1 <= boxes[b].x0 || boxes[b].x1 <= boxes[a].x0 ||
                           boxes[a].y1 <= boxes[b].y0 || boxes[b].y1 <= boxes[a].y0;
        CAPTURE(boxes[a].text, boxes[b].text);
        REQUIRE(apart);
      }
    }
    // Each tool is named by its own label, and the two tools of equal cost do not share a line.
    REQUIRE(svg.find(">bull-nose 10 mm, corner") != std::string::npos);
    std::vector<std::string> totals;
    for (const pugi::xpath_node& n : root.select_nodes("//polyline[not(@stroke-dasharray)]")) {
      totals.push_back(n.node().attribute("points").value());
    }
    REQUIRE(totals.size() == 3);
    REQUIRE(totals[0] != totals[1]);
  }
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

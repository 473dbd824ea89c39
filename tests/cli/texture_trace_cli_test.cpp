// `cuspmap texture` on a measured two-column trace: read as a trace by the auto rule, evaluated
// per ISO 4287/4288 exactly as a heightfield's traces are; --layout and --stylus-tip errors.
#include <catch2/catch.hpp>
#include <cmath>
#include <nlohmann/json.hpp>
#include <string>

#include "test_support.h"

namespace cuspmap {
namespace {

// Ideal cusp profile: parabolic arcs of height h_um repeating every s_mm (DESIGN.md closed
// forms), sampled every dx_mm.
double cusp_at(double x, double s_mm, double h_um) {
  const double d = x - s_mm * std::round(x / s_mm);
  return h_um * (2.0 * d / s_mm) * (2.0 * d / s_mm);
}

}  // namespace

TEST_CASE("texture: a two-column file is a trace, evaluated like the same profile in a grid",
          "[cli]") {
  test::TempDir dir;
  const double s = 0.3, h = 5.0, dx = 0.002;
  const int n = 3000;  // 6 mm: five 0.8 mm sampling lengths and the run-up/run-out
  std::string trace = "# x_mm z_um (stylus export)\n", grid;
  for (int i = 0; i < n; ++i) {
    const double x = i * dx;
    trace += std::to_string(x) + "," + std::to_string(cusp_at(x, s, h)) + "\n";
    if (i > 0) grid += ',';
    grid += std::to_string(cusp_at(x, s, h));
  }
  grid += '\n';
  const std::string row = grid;
  for (int k = 0; k < 3; ++k) grid += row;  // four identical rows: every trace along X is it
  test::write_text(dir.file("trace.csv"), trace);
  test::write_text(dir.file("grid.csv"), grid);

  const test::RunResult t = test::run_cuspmap({"texture", dir.file("trace.csv"), "--json"});
  REQUIRE(t.exit_code == 0);
  const nlohmann::json jt = nlohmann::json::parse(t.out);
  CHECK(jt["kind"] == "trace");
  CHECK(jt["points"] == n);
  CHECK(jt["profile"]["direction"] == "trace");
  // ISO 4288 Table 3 (from memory): RSm 0.3 mm lies in 0.13-0.4 mm -> cut-off 0.8 mm.
  CHECK(jt["profile"]["cutoff_mm"].get<double>() == 0.8);
  // DESIGN.md ideal cusp profile: Ra = 4 h / (9 sqrt 3); the 0.8 mm Gaussian passes 99 % of the
  // 0.3 mm period (ISO 16610-21 transmission), so within 1 %.
  REQUIRE_NEAR(jt["profile"]["Ra_um"].get<double>(), 4.0 * h / (9.0 * std::sqrt(3.0)),
               0.01 * 4.0 * h / (9.0 * std::sqrt(3.0)));

  const test::RunResult g = test::run_cuspmap({"texture", dir.file("grid.csv"), "--json", "--cell",
                                               std::to_string(dx), "--direction", "0"});
  REQUIRE(g.exit_code == 0);
  const nlohmann::json jg = nlohmann::json::parse(g.out);
  // Derived: the same samples through the same evaluation (the grid holds float heights).
  for (const char* key : {"Ra_um", "Rq_um", "Rz_um", "Rt_um", "RSm_mm"}) {
    CAPTURE(key);
    REQUIRE_NEAR(jt["profile"][key].get<double>(), jg["profile"][key].get<double>(),
                 1e-5 * std::abs(jg["profile"][key].get<double>()));
  }

  // The table names the trace.
  const test::RunResult table = test::run_cuspmap({"texture", dir.file("trace.csv")});
  REQUIRE(table.exit_code == 0);
  CHECK(table.out.find("x, z trace, 3000 points every 0.002 mm over 6 mm") !=
        std::string::npos);
}

TEST_CASE("texture: --layout grid keeps a two-column CSV a grid; bad values are refused",
          "[cli]") {
  test::TempDir dir;
  std::string text;
  for (int i = 0; i < 40; ++i) text += std::to_string(i * 0.01) + "," + std::to_string(i % 3) + "\n";
  test::write_text(dir.file("two.csv"), text);
  const test::RunResult g =
      test::run_cuspmap({"texture", dir.file("two.csv"), "--layout", "grid", "--cell", "0.01",
                         "--direction", "0"});
  CHECK(g.exit_code == 2);  // a grid two cells wide holds no profile across 0.16 mm
  test::require_input_error({"texture", dir.file("two.csv"), "--layout", "rows"},
                            "--layout 'rows': allowed are auto, trace or grid");
  test::require_input_error({"texture", dir.file("two.csv"), "--stylus-tip", "5"},
                            "--stylus-tip 5: 5000 um is larger than any stylus tip; allowed up to "
                            "50 um, e.g. 5um (ISO 3274 nominal 2, 5, 10 um)");
  std::string short_text;
  for (int i = 0; i < 16; ++i) short_text += std::to_string(i * 0.005) + " 1\n";
  test::write_text(dir.file("short.txt"), short_text);
  test::require_input_error({"texture", dir.file("short.txt")},
                            "trace too short for a profile: its longest run is 0.075 mm, at least "
                            "0.16 mm (two cut-offs) is needed");
}

}  // namespace cuspmap

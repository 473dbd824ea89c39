// Issue 13 items 3 and 5 end to end: `stepover` answers for tilted end mills, warns when the feed
// mark outgrows the cusp and when Ra hides wide bull-nose ridges; `plan` says when its best option
// is at an end of the range; inch shops' bare microinch targets, N-grades and fractions.
#include <cmath>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "test_support.h"

namespace {

using cuspmap::test::run_cuspmap;
using Args = std::vector<std::string>;

nlohmann::json run_json(Args args) {
  args.push_back("--json");
  const cuspmap::test::RunResult r = run_cuspmap(args);
  INFO("stderr: " << r.err);
  REQUIRE(r.exit_code == 0);
  return nlohmann::json::parse(r.out);
}

bool any_contains(const nlohmann::json& lines, const std::string& part) {
  for (const auto& l : lines) {
    if (l.get<std::string>().find(part) != std::string::npos) return true;
  }
  return false;
}

double tan_deg(double deg) { return std::tan(deg * 3.14159265358979323846 / 180.0); }

}  // namespace

TEST_CASE("stepover: issue_13 a tilted bull-nose leaves its flat rim's ellipse, not 0", "[cli]") {
  // Derived (tests/cusp/scallop_tilted_test.cpp): h = tan(tau)(a - sqrt(a^2 - s^2/4)), a = R - rc.
  const nlohmann::json j = run_json({"stepover", "--tool", "bullnose", "--diameter", "10",
                                     "--corner-radius", "1", "--tilt", "0.02", "--stepover", "6"});
  const double h_um = tan_deg(0.02) * (4.0 - std::sqrt(7.0)) * 1000.0;
  REQUIRE_NEAR(j["cusp_um"].get<double>(), h_um, 1e-3 * h_um);
  REQUIRE(j["tool"]["tilt_deg"] == 0.02);
  REQUIRE(any_contains(j["notes"], "ellipses"));
  // Inverse, flat end tilted across the feed: a saw-tooth h = s tan(tau) (derived), so a bare
  // 0.3 (um) gives s = 0.3 um / tan(0.02 deg).
  const nlohmann::json inv = run_json({"stepover", "--tool", "flat", "--diameter", "10", "--tilt",
                                       "0.02", "--tilt-toward", "90", "--target-scallop", "0.3"});
  REQUIRE_NEAR(inv["cusp_um"].get<double>(), 0.3, 1e-6);
  REQUIRE_NEAR(inv["stepover_mm"].get<double>(), 0.3e-3 / tan_deg(0.02), 1e-6);
  cuspmap::test::require_input_error(
      {"stepover", "--tool", "flat", "--diameter", "10", "--tilt", "0.1", "--slope", "5",
       "--stepover", "1"},
      "--tilt 0.1 deg: a tilted cutter's cusp is modelled on a level floor only (--surface "
      "flat, no --slope)");
}

TEST_CASE("stepover: issue_13 a feed mark larger than the designed cusp is said", "[cli]") {
  // 10 mm ball, fz 0.08 mm, 2 teeth, target Ra 0.1 um: the cusp designed is ~0.39 um while the
  // once-per-revolution mark (0.16 mm) is 0.64 um (Boothroyd & Knight: f^2/(8r)).
  const Args base = {"stepover", "--diameter", "10", "--target-ra", "0.1um", "--feed-per-tooth",
                     "0.08",     "--teeth",    "2"};
  const nlohmann::json j = run_json(base);
  REQUIRE(j["cusp_um"].get<double>() < 0.4);
  REQUIRE(j["feed_mark_per_rev_um"].get<double>() > 0.6);
  REQUIRE(any_contains(j["warnings"], "is larger than the cross-feed cusp"));
  REQUIRE(any_contains(j["warnings"], "add --both-directions"));
  // Both directions: the largest fz for the same Ra along the feed, exact arc Ra (feed_mark.h);
  // the parabolic Ra = f^2/(18 sqrt 3 r) gives ~0.1249 mm.
  Args both = base;
  both.push_back("--both-directions");
  const nlohmann::json b = run_json(both);
  REQUIRE_NEAR(b["feed_per_tooth_max_mm"].get<double>(), std::sqrt(18.0 * std::sqrt(3.0) * 5e-4),
               1e-3);
  REQUIRE(any_contains(b["notes"], "meets the target Ra"));
  both[6] = "0.2";  // --feed-per-tooth 0.2: too coarse for Ra 0.1 um along the feed
  const nlohmann::json miss = run_json(both);
  REQUIRE(any_contains(miss["warnings"], "misses the target along the feed"));
}

TEST_CASE("stepover: issue_13 Ra that hides wide bull-nose ridges gets a caution", "[cli]") {
  // ISO 4288:1996 Table 3 ends at RSm 4 mm; a bull-nose stepped past its 8 mm flat meets
  // Ra 0.8 um with cusps tens of um high every ~8.4 mm.
  const nlohmann::json j = run_json({"stepover", "--tool", "bullnose", "--diameter", "10",
                                     "--corner-radius", "1", "--target-ra", "0.8um"});
  REQUIRE(j["stepover_mm"].get<double>() > 4.0);
  REQUIRE(j["cusp_um"].get<double>() > 10.0);
  REQUIRE(any_contains(j["cautions"], "Ra hides these ridges"));
  const nlohmann::json ball = run_json({"stepover", "--diameter", "6", "--target-ra", "0.8um"});
  REQUIRE_FALSE(any_contains(ball["cautions"], "Ra hides"));
}

TEST_CASE("stepover: issue_13 inch prints: bare uin targets, N-grades, fractions", "[cli]") {
  // Trade convention (common practice, no source): an inch print's Ra 32 is 32 uin; ISO
  // 1302:1992 prints N6 = 0.8 um = 32 uin. 1 in = 25.4 mm exactly.
  const nlohmann::json j =
      run_json({"stepover", "--units", "in", "--diameter", "1/4", "--target-ra", "32"});
  REQUIRE_NEAR(j["target"]["value_um"].get<double>(), 0.8128, 1e-12);
  REQUIRE_NEAR(j["tool"]["diameter_mm"].get<double>(), 6.35, 1e-12);
  REQUIRE(j["iso1302_grade"] == "N6");
  const auto human =
      run_cuspmap({"stepover", "--units", "in", "--diameter", "1/4", "--target-ra", "32"});
  REQUIRE(human.exit_code == 0);
  REQUIRE(human.out.find("ISO 1302:1992 grade N6 (Ra up to 32 uin = 0.8 um)") != std::string::npos);
  const nlohmann::json n6 = run_json({"stepover", "--diameter", "6", "--target-ra", "N6"});
  REQUIRE(n6["target"]["value_um"] == 0.8);
  cuspmap::test::require_input_error(
      {"stepover", "--diameter", "6", "--target-ra", "N13"},
      "--target-ra 'N13': unknown roughness grade; ISO 1302:1992 grades are N1 to N12");
  // plan reads targets the same way.
  const nlohmann::json plan =
      run_json({"plan", "--units", "in", "--tool", "ball", "--diameter", "1/4", "--size", "3x2",
                "--feed", "60", "--machine-rate", "90", "--bench-rate", "45", "--stepovers",
                "0.005,0.01", "--target-ra", "63"});
  REQUIRE_NEAR(plan["spec"]["target_Ra_um"].get<double>(), 63.0 * 0.0254, 1e-12);
}

TEST_CASE("plan: issue_13 a best option at an end of the range says so", "[cli]") {
  // A loose target: the coarsest stepover tried is cheapest; the next range continues the tried
  // one geometrically (ratio 2 here: 0.05, 0.1, 0.2 mm).
  const nlohmann::json j = run_json({"plan", "--tool", "ball", "--diameter", "6", "--size", "80x50",
                                     "--feed", "1500", "--machine-rate", "90", "--bench-rate", "45",
                                     "--stepovers", "0.05,0.1,0.2", "--target-ra", "5um"});
  REQUIRE(j["best_index"] == 2);
  REQUIRE(j["range_edge"]["at"] == "largest");
  REQUIRE_NEAR(j["range_edge"]["next_stepovers_mm"][0].get<double>(), 0.4, 1e-9);
  REQUIRE(any_contains(j["notes"], "the optimum may lie outside the range"));
  REQUIRE(j["message"].get<std::string>().find("machined cusp") != std::string::npos);
  // Inside the range: no note.
  const nlohmann::json inside =
      run_json({"plan", "--tool", "ball", "--diameter", "6", "--size", "80x50", "--feed", "1500",
                "--machine-rate", "90", "--bench-rate", "45", "--stepovers", "0.05,0.3,3",
                "--target-ra", "0.5um"});
  REQUIRE(inside["best_index"] == 1);
  REQUIRE(inside["range_edge"].is_null());
}

TEST_CASE("plan: issue_13 a bull-nose meeting Ra with wide ridges is cautioned", "[cli]") {
  const nlohmann::json j =
      run_json({"plan", "--tool", "bullnose", "--diameter", "10", "--corner-radius", "1", "--size",
                "80x50", "--feed", "1500", "--machine-rate", "90", "--bench-rate", "45",
                "--stepovers", "2,5,8.4", "--target-ra", "0.8um"});
  REQUIRE(j["best_index"] == 2);
  REQUIRE(any_contains(j["cautions"], "Ra hides these ridges"));
}

TEST_CASE("plan: issue_13 --job prices the surface simulate sweeps for that job", "[cli]") {
  // The invented pump-cover flat end: 1 deg dish, tooth marks on. Its closed form and revolving
  // envelope leave no cusp (Ra 0) while `simulate` shows the rim arcs; plan --job must sweep
  // tooth by tooth like simulate and so see them.
  const std::string job = cuspmap::test::source_path("examples/pump_cover_flat_oneway.toml");
  const nlohmann::json plan =
      run_json({"plan", "--job", job, "--stepovers", "0.5", "--machine-rate", "90", "--bench-rate",
                "45", "--target-ra", "0.1um"});
  const double plan_sa = plan["options"][0]["Ra_um"].get<double>();
  const double plan_sz = plan["options"][0]["cusp_um"].get<double>();
  REQUIRE(plan_sa > 0.01);
  REQUIRE(plan["basis"]["surface"].get<std::string>().find("tooth by tooth") != std::string::npos);
  cuspmap::test::TempDir dir;
  const auto sim = run_cuspmap({"simulate", job, "--out", dir.path()});
  REQUIRE(sim.exit_code == 0);
  const nlohmann::json report =
      nlohmann::json::parse(cuspmap::test::read_text(dir.file("report.json")));
  const double sim_sa = report["areal"]["Sa_um"].get<double>();
  // Same sweep, different windows: the job's 6 x 6 mm patch includes its edge passes, the plan's
  // window whole interior periods, so Sa agrees to within the edge band's share (derived bound).
  REQUIRE_NEAR(plan_sa, sim_sa, 0.35 * sim_sa);
  REQUIRE(plan_sz > 0.0);
  // Flags the job already gives are refused.
  cuspmap::test::require_input_error(
      {"plan", "--job", job, "--size", "10x10", "--machine-rate", "90", "--bench-rate", "45",
       "--target-ra", "0.1um"},
      "--size 10x10: --job " + job + " gives the tool, floor and feed; drop --size or --job");
}

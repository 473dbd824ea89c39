// CLI tests of `cuspmap plan`: JSON contract keys, best as an index or null (exit 0 with a clear
// message), the three files under --out, cautions in the human output, bad input lines (exit 2).
#include <nlohmann/json.hpp>

#include "test_support.h"

namespace cuspmap {
namespace {

using test::run_cuspmap;

// An invented bracket face, 80 x 50 mm, 6 mm ball and 10 mm flat.
std::vector<std::string> bracket(std::vector<std::string> extra) {
  std::vector<std::string> args = {
      "plan",  "--tools",     "ball:6,flat:10", "--tilt",         "0.05", "--size",
      "80x50", "--feed",      "1500",           "--machine-rate", "90",   "--bench-rate",
      "45",    "--stepovers", "0.2,0.5,1"};
  args.insert(args.end(), extra.begin(), extra.end());
  return args;
}

}  // namespace

TEST_CASE("cuspmap plan: JSON carries options and the index of the best one", "[cli]") {
  const test::RunResult r = run_cuspmap(bracket({"--target-ra", "0.8um", "--json"}));
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  const nlohmann::json doc = nlohmann::json::parse(r.out);
  REQUIRE(doc["options"].size() == 6);
  for (const auto& o : doc["options"]) {
    for (const char* key : {"stepover_mm", "machine_time_s", "bench_time_s", "cost", "meets_spec",
                            "tool", "passes", "cusp_um", "Ra_um", "removed_volume_mm3",
                            "final_Ra_um", "machine_cost", "bench_cost", "reason", "grits"}) {
      CAPTURE(key);
      REQUIRE(o.contains(key));
    }
  }
  REQUIRE(doc["best_index"].is_number_integer());
  const auto best = doc["best_index"].get<std::size_t>();
  REQUIRE(doc["options"][best]["meets_spec"].get<bool>());
  for (const auto& o : doc["options"]) {
    if (o["meets_spec"].get<bool>())
      REQUIRE(o["cost"].get<double>() >= doc["options"][best]["cost"].get<double>());
  }
  REQUIRE(doc["cautions"].size() >= 4);
  REQUIRE(doc["message"].get<std::string>().rfind("best: ", 0) == 0);
}

TEST_CASE("cuspmap plan: no option meeting the spec is a valid answer: best null, exit 0",
          "[cli]") {
  const test::RunResult r =
      run_cuspmap(bracket({"--target-scallop", "0.00001um", "--sand", "always", "--json"}));
  REQUIRE(r.exit_code == 0);
  const nlohmann::json doc = nlohmann::json::parse(r.out);
  REQUIRE(doc["best_index"].is_null());
  REQUIRE(doc["message"].get<std::string>().rfind("no option meets the spec", 0) == 0);
  const test::RunResult human = run_cuspmap(bracket({"--target-scallop", "0.00001um", "--sand", "always"}));
  REQUIRE(human.exit_code == 0);
  REQUIRE(human.out.find("no option meets the spec") != std::string::npos);
}

TEST_CASE("cuspmap plan: --out writes plan.json, plan.csv and plan.svg; table shows cautions",
          "[cli]") {
  test::TempDir dir;
  const std::string out = dir.file("plan");
  const test::RunResult r = run_cuspmap(bracket({"--target-ra", "0.8um", "--out", out}));
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  const nlohmann::json doc = nlohmann::json::parse(test::read_text(out + "/plan.json"));
  REQUIRE(doc.contains("options"));
  REQUIRE(doc.contains("best_index"));
  const std::string csv = test::read_text(out + "/plan.csv");
  REQUIRE(std::count(csv.begin(), csv.end(), '\n') == 7);
  REQUIRE(test::read_text(out + "/plan.svg").find("<svg") != std::string::npos);
  for (const char* text : {"<- cheapest", "Caution:", "rotating tools", "combustible",
                           "local codes", "licensed practice"}) {
    CAPTURE(text);
    REQUIRE(r.out.find(text) != std::string::npos);
  }
}

TEST_CASE("cuspmap plan: --simulate takes surfaces from a simulated window", "[cli]") {
  const test::RunResult r = run_cuspmap({"plan",        "--tools",      "ball:6,flat:10",
                                         "--tilt",      "0.05",         "--tilt-toward",
                                         "90",          "--size",       "80x50",
                                         "--feed",      "1500",         "--machine-rate",
                                         "90",          "--bench-rate", "45",
                                         "--stepovers", "0.5,1",        "--target-ra",
                                         "0.8",         "--simulate",   "--json"});
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  const nlohmann::json doc = nlohmann::json::parse(r.out);
  REQUIRE(doc["options"].size() == 4);
  for (const auto& o : doc["options"]) REQUIRE(o["simulated"].get<bool>());
  REQUIRE(doc["basis"]["surface"].get<std::string>().rfind("simulated window", 0) == 0);
  // The flat end tilted across the feed leaves a sawtooth (about s tan(tau)), not a level floor.
  REQUIRE(doc["options"][3]["cusp_um"].get<double>() > 0.5);
  // Without --simulate the closed form refuses a tilt across the feed.
  test::require_input_error(
      {"plan", "--tools", "flat:10", "--tilt", "0.05", "--tilt-toward", "90", "--size", "80x50",
       "--feed", "1500", "--machine-rate", "90", "--bench-rate", "45", "--target-ra", "0.8um"},
      "--tilt-toward 90 deg: the closed-form cusp of a tilted flat end takes the tilt "
      "along the passes (0 or 180 deg); add --simulate");
}

TEST_CASE("cuspmap plan: bad input exits 2 with one line", "[cli]") {
  test::require_input_error({"plan", "--diameter", "6", "--feed", "1000", "--machine-rate", "1", "--bench-rate",
                 "1", "--target-ra", "1um"},
                "--size is missing: give the floor size, e.g. 120x80");
  test::require_input_error(bracket({}),
                "plan needs a finish spec: --target-ra or --target-scallop (or --sand always)");
  test::require_input_error({"plan", "--diameter", "6", "--size", "80x50", "--feed", "1000", "--bench-rate",
                 "1", "--target-ra", "1um"},
                "--machine-rate is missing: give the cost of one hour (any currency)");
  test::require_input_error(bracket({"--target-ra", "0.8um", "--pass-direction", "spiral"}),
                "--pass-direction spiral: must be one-way or zigzag");
  test::require_input_error(bracket({"--target-ra", "0.8um", "--sand", "never"}),
                "--sand never: must be when-needed or always");
  test::require_input_error({"plan", "--tools", "ball", "--size", "80x50", "--feed", "1000", "--machine-rate",
                 "1", "--bench-rate", "1", "--target-ra", "1um"},
                "--tools ball: expected shape:diameter or bullnose:diameter:corner (e.g. "
                "ball:6mm,flat:0.5in,bullnose:10:1)");
  test::require_input_error({"plan", "--diameter", "6", "--size", "80x50", "--feed", "1000", "--machine-rate",
                 "1", "--bench-rate", "1", "--target-ra", "1um", "--stepovers", "7,8"},
                "--stepovers 7,8: none is <= the diameter of the 6 mm ball");
  test::require_input_error({"plan", "--diameter", "6", "--size", "80", "--feed", "1000", "--machine-rate", "1",
                 "--bench-rate", "1", "--target-ra", "1um"},
                "--size 80: expected two lengths, e.g. 120x80");
  test::require_input_error(bracket({"--target-ra", "-1um"}), "--target-ra -1 um: must be > 0");
  test::require_input_error({"plan", "--diameter", "6", "--size", "80x50", "--feed", "1000", "--machine-rate",
                 "-4", "--bench-rate", "1", "--target-ra", "1um"},
                "--machine-rate -4: must be >= 0 per hour");
}

TEST_CASE("cuspmap plan: issue_13: --sand always never ends rougher than machined", "[cli]") {
  // The flat end mill with 0.05 deg tilt leaves marks far finer than P400's Ra 0.35 um (default
  // table, from memory): sanding them would make the floor worse, so those options end as
  // machined, with no bench time.
  const test::RunResult r = run_cuspmap(bracket({"--sand", "always", "--json"}));
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  const nlohmann::json doc = nlohmann::json::parse(r.out);
  int unsanded = 0;
  for (const auto& o : doc["options"]) {
    CAPTURE(o["tool"], o["stepover_mm"]);
    REQUIRE(o["final_Ra_um"].get<double>() <= o["Ra_um"].get<double>() + 1e-12);
    if (!o["sanded"].get<bool>()) {
      ++unsanded;
      REQUIRE(o["bench_time_s"] == 0.0);
      REQUIRE(o["grits"].empty());
    }
  }
  REQUIRE(unsanded > 0);
}

}  // namespace cuspmap

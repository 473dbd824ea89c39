// `cuspmap compare` ranks like with like, and `texture` on a simulated height.npy measures it as
// `simulate` did (issue 13 item 1): the real binary on small invented jobs.
// Sources: ISO 4288:1996 Table 3 (RSm 0.1 mm -> lc 0.25 mm; RSm 0.5 mm -> lc 2.5 mm, from
// memory); the comparisons are between cuspmap's own outputs (same floor, same numbers).
#include <nlohmann/json.hpp>
#include <string>

#include "test_support.h"

using namespace cuspmap::test;

namespace {

// A 6 mm ball raster on a 6 x 6 mm patch (invented bracket floor), coarse cells for speed.
constexpr const char* kBallJob = R"(name = "bracket floor - ball"
units = "mm"
[patch]
size = [6, 6]
cell = 0.01
[tool]
shape = "ball"
diameter = 6
[cut]
rpm = 10000
feed = 1500
[path]
kind = "raster"
stepover = 0.3
)";

// A 6 mm flat end mill dished 1 deg, one-way at 0.5 mm, tooth by tooth: its rim arcs hide the
// pass direction from the spectrum (invented pump-cover floor).
constexpr const char* kDishedFlatJob = R"(name = "pump cover - dished flat"
units = "mm"
[patch]
size = [3, 3]
cell = 0.005
[tool]
shape = "flat"
diameter = 6
dish_deg = 1
teeth = 3
[cut]
rpm = 10000
feed = 1500
[path]
kind = "raster"
stepover = 0.5
direction = "one-way"
[sim]
tooth_marks = true
)";

}  // namespace

TEST_CASE("compare: issue_13: every row's profile on one cut-off, shown per row", "[cli]") {
  TempDir dir;
  write_text(dir.file("ball.toml"), kBallJob);
  const RunResult r = run_cuspmap({"compare", dir.file("ball.toml"), "--stepover", "0.1,0.5",
                                   "--out", dir.file("out"), "--json"});
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  const auto doc = nlohmann::json::parse(r.out);
  REQUIRE(doc["rows"].size() == 2);
  // Alone, 0.1 mm picks lc 0.25 mm and 0.5 mm picks a longer one (ISO 4288 Table 3); compared,
  // both use the longer.
  const double c0 = doc["rows"][0]["cutoff_mm"], c1 = doc["rows"][1]["cutoff_mm"];
  REQUIRE(c0 == c1);
  REQUIRE(c0 > 0.25);
  REQUIRE(doc["basis"]["cutoff_mm"] == c0);
  REQUIRE(doc["basis"]["ranked"] == true);
  for (const auto& row : doc["rows"]) {
    REQUIRE(row["direction"] == "across");
    REQUIRE(row.contains("direction_deg"));
  }
  REQUIRE(doc["best_index"]["Ra_um"] == 0);
  const std::string csv = read_text(dir.file("out/compare.csv"));
  REQUIRE(csv.find(",cutoff_mm,direction,direction_deg\n") != std::string::npos);
  const RunResult table = run_cuspmap(
      {"compare", dir.file("ball.toml"), "--stepover", "0.1,0.5", "--out", dir.file("out2")});
  REQUIRE(table.exit_code == 0);
  REQUIRE(table.out.find("cut-off mm") != std::string::npos);
  REQUIRE(table.out.find("across 90 deg") != std::string::npos);
}

TEST_CASE("texture: issue_13: a simulated height.npy gives simulate's Ra, Rz and Sa", "[cli]") {
  TempDir dir;
  write_text(dir.file("flat.toml"), kDishedFlatJob);
  const RunResult sim = run_cuspmap({"simulate", dir.file("flat.toml"), "--out", dir.file("out")});
  INFO(sim.err);
  REQUIRE(sim.exit_code == 0);
  const auto report = nlohmann::json::parse(read_text(dir.file("out/report.json")));
  const RunResult tex = run_cuspmap({"texture", dir.file("out/height.npy"), "--json"});
  INFO(tex.err);
  REQUIRE(tex.exit_code == 0);
  const auto t = nlohmann::json::parse(tex.out);
  // Same floor, same cut-off rule, same traces: the same numbers to float rounding.
  for (const char* key : {"Ra_um", "Rz_um", "cutoff_mm", "direction_deg"}) {
    CAPTURE(key);
    const double a = report["profile"][key], b = t["profile"][key];
    REQUIRE_NEAR(a, b, 1e-9 * (1.0 + std::abs(a)));
  }
  const double sa = report["areal"]["Sa_um"], tsa = t["areal"]["Sa_um"];
  REQUIRE_NEAR(sa, tsa, 1e-9);
}

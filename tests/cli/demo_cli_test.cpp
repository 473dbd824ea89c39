// End-to-end test of `cuspmap demo --quick`: every output present, JSON keys, a choice made.
#include <algorithm>
#include <filesystem>
#include <nlohmann/json.hpp>

#include "test_support.h"

using namespace cuspmap::test;

TEST_CASE("demo: --quick runs the built-in scenario end to end", "[cli]") {
  TempDir dir;
  const RunResult r = run_cuspmap({"demo", "--quick", "--out", dir.file("d"), "--json"});
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  const auto doc = nlohmann::json::parse(r.out);
  REQUIRE(doc["rows"].size() == 4);
  for (const auto& row : doc["rows"]) {
    for (const char* key : {"name", "Ra_um", "Rz_um", "Sa_um", "Sz_um", "cusp_um",
                            "path_length_mm", "cycle_time_s"}) {
      CHECK(row.contains(key));
    }
  }
  CHECK(doc["target_Ra_um"] == 0.8);
  CHECK(doc["cautions"].size() >= 3);
  // The ball at 0.3 mm leaves Ra ~ 0.96 um > 0.8 um (handbook cusp 3.75 um x 4/(9 sqrt 3)), so
  // the first option must miss the target.
  CHECK(doc["meets_target"][0] == false);
  const std::vector<std::string> files = [&] {
    TempDir unused;
    (void)unused;
    std::vector<std::string> names;
    for (const auto& e : std::filesystem::directory_iterator(dir.file("d"))) {
      names.push_back(e.path().filename().string());
    }
    return names;
  }();
  for (const char* f : {"montage.png", "compare.csv", "compare.json", "report.html", "demo.json",
                        "job_ball_raster.toml", "1_6_mm_ball__raster_0.3_mm_shaded.png",
                        // issue 14: each floor on its own range too, and its detail view
                        "2_6_mm_flat__1_deg_dish__one-way_0.5_mm_height_own.png",
                        "2_6_mm_flat__1_deg_dish__one-way_0.5_mm_detail.png",
                        "2_6_mm_flat__1_deg_dish__one-way_0.5_mm_detail_shaded.png"}) {
    INFO(f);
    CHECK(std::find(files.begin(), files.end(), f) != files.end());
  }
  for (const auto& f : files) CHECK(f.find(".tmp-") == std::string::npos);
}

// CLI tests of `cuspmap allowance`: the JSON contract keys, cautions in both outputs, inch
// input, a user grade table, a simulate report as input, and bad input lines verbatim (exit 2).
#include <cmath>
#include <nlohmann/json.hpp>

#include "core/write_file_atomic.h"
#include "finish/cusp_profile_heights.h"
#include "io/read_heightmap.h"
#include "test_support.h"

namespace cuspmap {
namespace {

using test::run_cuspmap;

nlohmann::json json_of(const test::RunResult& r) {
  INFO("stderr: " << r.err);
  REQUIRE(r.exit_code == 0);
  return nlohmann::json::parse(r.out);
}

}  // namespace

TEST_CASE("cuspmap allowance: JSON carries the contract keys", "[cli]") {
  const nlohmann::json doc =
      json_of(run_cuspmap({"allowance", "--tool", "ball", "--diameter", "6", "--stepover", "0.5",
                           "--area", "120x80", "--tolerance", "0.05mm", "--json"}));
  for (const char* key :
       {"depth_to_clear_um", "mean_removal_um", "stock_valleys_nominal_um", "stock_mean_nominal_um",
        "volume_mm3", "volume_in3", "volume_per_area_mm3_per_mm2", "grits", "cautions",
        "final_Ra_um", "basis", "tolerance", "stock_notes"}) {
    CAPTURE(key);
    REQUIRE(doc.contains(key));
  }
  REQUIRE(doc["area_mm2"].get<double>() == 9600.0);
  REQUIRE(doc["grits"].size() == 4);
  for (const auto& g : doc["grits"]) {
    REQUIRE(g.contains("grit"));
    REQUIRE(g.contains("remove_um"));
    REQUIRE(g.contains("time_s"));
  }
  REQUIRE(doc["grits"][0]["grit"] == "P180");
  REQUIRE(doc["tolerance"]["within"].get<bool>());
  REQUIRE(doc["tolerance"]["tolerance_um"].get<double>() == 50.0);
  REQUIRE(doc["cautions"].size() >= 3);
  // Handbook scallop: 6 mm ball at 0.5 mm, h = 3 - sqrt(9 - 0.0625) mm.
  REQUIRE_NEAR(doc["depth_to_clear_um"].get<double>(), (3.0 - std::sqrt(8.9375)) * 1000.0, 1e-9);
}

TEST_CASE("cuspmap allowance: human output shows the stock, grits, verdict and cautions", "[cli]") {
  const test::RunResult r =
      run_cuspmap({"allowance", "--diameter", "6", "--stepover", "0.5", "--tolerance", "10um"});
  REQUIRE(r.exit_code == 0);
  for (const char* text :
       {"valleys on nominal", "mean on nominal", "P400", "Predicted Ra: machined", "Tolerance check: exceeds",
        "Caution:", "combustible", "local codes", "licensed practice", "reference area 100 cm^2"}) {
    CAPTURE(text);
    REQUIRE(r.out.find(text) != std::string::npos);
  }
  // issue 14: the short caution once on the terminal, the full list in --help.
  REQUIRE(r.out.find("respiratory protection") == std::string::npos);
  const test::RunResult help = run_cuspmap({"allowance", "--help"});
  for (const char* text : {"respiratory protection", "aluminium", "licensed practice"}) {
    CAPTURE(text);
    REQUIRE(help.out.find(text) != std::string::npos);
  }
}

TEST_CASE("cuspmap allowance: inch units read bare numbers in inches", "[cli]") {
  // 0.5 in ball at 0.020 in: the same as 12.7 mm at 0.508 mm (1 in = 25.4 mm exactly).
  const nlohmann::json in = json_of(run_cuspmap({"allowance", "--units", "in", "--diameter", "0.5",
                                                 "--stepover", "0.020", "--area", "10", "--json"}));
  const nlohmann::json mm = json_of(run_cuspmap(
      {"allowance", "--diameter", "12.7mm", "--stepover", "0.508mm", "--area", "10in2", "--json"}));
  REQUIRE_NEAR(in["depth_to_clear_um"].get<double>(), mm["depth_to_clear_um"].get<double>(), 1e-9);
  REQUIRE_NEAR(in["area_mm2"].get<double>(), 6451.6, 1e-9);  // 10 in^2 = 10 x 645.16 mm^2
  REQUIRE_NEAR(mm["area_mm2"].get<double>(), 6451.6, 1e-9);
  const test::RunResult human =
      run_cuspmap({"allowance", "--units", "in", "--diameter", "0.5", "--stepover", "0.020"});
  REQUIRE(human.out.find(" uin") != std::string::npos);
}

TEST_CASE("cuspmap allowance: a grade table file and --grits replace the defaults", "[cli]") {
  const nlohmann::json doc = json_of(
      run_cuspmap({"allowance", "--diameter", "10", "--stepover", "1.5", "--grit-table",
                   test::data_path("grits_measured.toml"), "--grits", "P240,P600", "--json"}));
  REQUIRE(doc["grits"].size() == 2);
  REQUIRE(doc["grits"][1]["grit"] == "P600");
  REQUIRE(doc["final_Ra_um"].get<double>() == 0.25);
  REQUIRE(doc["basis"]["grit_table"] == "example shop measurements (invented test data)");
}

TEST_CASE("cuspmap allowance: reads a simulate report", "[cli]") {
  test::TempDir dir;
  const std::string report = dir.file("report.json");
  test::write_text(report, R"({"cell_mm": 0.01, "size_mm": [40, 25],
    "areal": {"Sa_um": 1.1, "Sq_um": 1.3, "Sz_um": 9.0, "Sp_um": 6.0, "Sv_um": 3.0,
              "Ssk": -0.6, "Sku": 2.1},
    "profile": {"Ra_um": 1.05, "Rq_um": 1.2, "Rz_um": 8.5, "cutoff_mm": 0.8, "direction": "y"}})");
  const nlohmann::json doc = json_of(run_cuspmap({"allowance", report, "--json"}));
  REQUIRE(doc["depth_to_clear_um"].get<double>() == 9.0);
  REQUIRE(doc["mean_removal_um"].get<double>() == 3.0);
  REQUIRE(doc["area_mm2"].get<double>() == 1000.0);  // the simulated patch, 40 x 25 mm
  REQUIRE_NEAR(doc["volume_mm3"].get<double>(), 3.0e-3 * 1000.0, 1e-12);
  test::write_text(report, R"({"areal": {"Sz_um": 9.0}})");
  test::require_input_error(
      {"allowance", report},
      report + ": areal.Sv_um is missing: expected a report.json written by `cuspmap simulate`");
}

TEST_CASE("cuspmap allowance: a heightmap of the ideal cusp gives the closed-form allowance",
          "[cli]") {
  // Ball D 6 mm, stepover 0.41 mm: twelve periods of the exact circle z = R - sqrt(R^2 - y^2)
  // (handbook cusp geometry), 41 cells of 0.01 mm per period: a cell centre on every crest.
  const double big_r = 3.0, s = 0.41;
  const int per = 41, periods = 12;
  Heightfield hf;
  hf.nx = 24;
  hf.ny = per * periods;
  hf.cell_mm = s / per;
  hf.z_um.resize(hf.ny, hf.nx);
  for (int j = 0; j < hf.ny; ++j) {
    const double y = std::remainder(hf.y_mm(j), s);  // distance to the nearest pass
    hf.z_um.row(j).setConstant(
        static_cast<float>((big_r - std::sqrt(big_r * big_r - y * y)) * 1000.0));
  }
  test::TempDir dir;
  const std::string npy = dir.file("cusp.npy");
  write_file_atomic(npy, encode_heightmap(hf, npy));
  const nlohmann::json doc = json_of(run_cuspmap({"allowance", npy, "--cell", "0.01mm", "--json"}));
  Cutter ball;
  ball.diameter_mm = 2.0 * big_r;
  const SurfaceHeights exact = cusp_profile_heights(ball, s);
  // Sampling error ~6e-4 h at the valleys; float storage ~1e-7 relative: 2% is ample.
  REQUIRE_NEAR(doc["depth_to_clear_um"].get<double>(), exact.sz_um, 0.02 * exact.sz_um);
  REQUIRE_NEAR(doc["mean_removal_um"].get<double>(), exact.sv_um, 0.02 * exact.sv_um);
  // Ra is the ISO 4287 roughness Ra behind the ISO 16610-21 Gaussian filter at the cut-off the
  // texture module picks (0.8 mm here): the filter passes the 0.41 mm fundamental at
  // 1 - exp(-pi (0.4697 x 0.8 / 0.41)^2) ~ 0.93, so Ra lies a little under the ideal, never above.
  const double ra = doc["marks"]["Ra_um"].get<double>();
  REQUIRE(ra <= exact.ra_um * 1.001);
  REQUIRE(ra >= 0.9 * exact.ra_um);
  REQUIRE(doc["input"]["kind"] == "heightmap");
  REQUIRE_NEAR(doc["area_mm2"].get<double>(), hf.nx * hf.ny * hf.cell_mm * hf.cell_mm, 1e-9);
}

TEST_CASE("cuspmap allowance: a job file is simulated and agrees with its report", "[cli]") {
  // The invented pump-cover example: simulating it here, or reading the report `simulate`
  // writes, must give the same marks (same pipeline, same numbers).
  const std::string job = test::source_path("examples/pump_cover_ball.toml");
  const nlohmann::json direct = json_of(run_cuspmap({"allowance", job, "--json"}));
  test::TempDir dir;
  const test::RunResult sim = run_cuspmap({"simulate", job, "--out", dir.path()});
  REQUIRE(sim.exit_code == 0);
  const nlohmann::json via = json_of(run_cuspmap({"allowance", dir.file("report.json"), "--json"}));
  REQUIRE(direct["input"]["kind"] == "job");
  REQUIRE_NEAR(direct["depth_to_clear_um"].get<double>(), via["depth_to_clear_um"].get<double>(),
               1e-6);
  REQUIRE_NEAR(direct["mean_removal_um"].get<double>(), via["mean_removal_um"].get<double>(), 1e-6);
  REQUIRE_NEAR(direct["area_mm2"].get<double>(), 100.0, 1e-9);  // the job's 10 x 10 mm patch
}

TEST_CASE("cuspmap allowance: bad input exits 2 with one line", "[cli]") {
  test::require_input_error({"allowance"},
                "allowance needs a job.toml, a simulate report.json, a heightmap file or "
                "--stepover with the tool flags (--tool, --diameter)");
  test::require_input_error({"allowance", "--diameter", "6", "--stepover", "7"},
                "--stepover 7 mm: must be > 0 and <= the tool diameter 6 mm");
  test::require_input_error({"allowance", "--tool", "cone", "--diameter", "6", "--stepover", "1"},
                "--tool cone: must be ball, bullnose or flat");
  test::require_input_error({"allowance", "--stepover", "1"},
                "--diameter is missing: give the cutter diameter");
  test::require_input_error({"allowance", "--diameter", "6", "--stepover", "1", "--area", "-5"},
                "--area -5: must be > 0 (an area such as 9600, 96cm2, 120x80 or 4.7inx3.1in)");
  test::require_input_error({"allowance", "--diameter", "6", "--stepover", "1", "--tolerance", "0"},
                "--tolerance 0: must be > 0 (the +- band, e.g. 0.05mm)");
  test::require_input_error({"allowance", "--diameter", "6", "--stepover", "1", "--grits", "P400,P180"},
                "--grits 'P400,P180': P180 is not finer than P400; list grades coarse to fine");
  test::require_input_error({"allowance", "--tool", "bullnose", "--diameter", "10", "--stepover", "1"},
                "--corner-radius is missing: a bullnose tool needs its corner radius");
  test::require_input_error(
      {"allowance", "--tool", "flat", "--diameter", "10", "--stepover", "1", "--tilt", "3"},
      "--tilt 3 deg: must be within +-1 deg (the first-order tilt model's limit)");
  test::require_input_error(
      {"allowance", "--diameter", "6", "--stepover", "1", "--grit-table", "/nonexistent/g.toml"},
      "--grit-table /nonexistent/g.toml: cannot read the file");
}

}  // namespace cuspmap

using cuspmap::test::run_cuspmap;

TEST_CASE("allowance: issue_13: marks finer than the last grade leaves get no sanding", "[cli]") {
  // A 1/2 in flat end mill at 0.020 in: no cross-feed cusp in the closed form (DESIGN.md), so
  // P400 (Ra 0.35 um, default table, from memory) would leave the floor rougher than machined.
  const auto r = run_cuspmap({"allowance", "--tool", "flat", "--diameter", "0.5", "--stepover",
                              "0.020", "--units", "in", "--json"});
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  const auto doc = nlohmann::json::parse(r.out);
  REQUIRE(doc["sanding_needed"] == false);
  REQUIRE(doc["grits"].empty());
  REQUIRE(doc["stock_valleys_nominal_um"] == 0.0);
  REQUIRE(doc["stock_mean_nominal_um"] == 0.0);
  REQUIRE(doc["sanding_time_s"] == 0.0);
  REQUIRE(doc["final_Ra_um"].get<double>() <= doc["marks"]["Ra_um"].get<double>());
  REQUIRE(doc["model"].get<std::string>().find("kinematic best case") != std::string::npos);
  const auto human = run_cuspmap(
      {"allowance", "--tool", "flat", "--diameter", "0.5", "--stepover", "0.020", "--units", "in"});
  REQUIRE(human.exit_code == 0);
  REQUIRE(human.out.find("no sanding needed") != std::string::npos);
  REQUIRE(human.out.find("kinematic best case") != std::string::npos);
  REQUIRE(human.out.find("is below 8 uin (0.2 um)") != std::string::npos);  // Ra 0: the fine-Ra caution, in uin (ISO 1302:1992 inch column)
}

TEST_CASE("allowance: issue_13: each grade's predicted Ra is shown", "[cli]") {
  // Ball 6 mm at 0.5 mm: Ra ~ 2.7 um (handbook cusp x 4/(9 sqrt 3)), coarser than any grade.
  const auto r = run_cuspmap({"allowance", "--tool", "ball", "--diameter", "6", "--stepover",
                              "0.5", "--json"});
  REQUIRE(r.exit_code == 0);
  const auto doc = nlohmann::json::parse(r.out);
  REQUIRE(doc["sanding_needed"] == true);
  for (const auto& g : doc["grits"]) REQUIRE(g.contains("Ra_after_um"));
  REQUIRE(doc["grits"].back()["Ra_after_um"] == doc["final_Ra_um"]);
  const auto meets = run_cuspmap({"allowance", "--tool", "ball", "--diameter", "6", "--stepover",
                                  "0.5", "--target-ra", "3.2um", "--json"});
  REQUIRE(meets.exit_code == 0);
  REQUIRE(nlohmann::json::parse(meets.out)["sanding_needed"] == false);
}

// CLI tests of `cuspmap calibrate`: the table, the files under --out, the profile read back by
// --shop, and bad input (exit 2, one line, nothing written).
#include <nlohmann/json.hpp>

#include "test_support.h"

namespace cuspmap {

namespace {

// An invented bracket shop: 6 mm ball at four stepovers, measured Ra a little rougher.
const char* kHistory =
    "name,tool,diameter,stepover,measured_ra\n"
    "bracket A,ball,6,0.2,0.81\n"
    "bracket B,ball,6,0.4,2.35\n"
    "bracket C,ball,6,0.6,4.93\n"
    "bracket D,ball,6,0.8,8.55\n";

}  // namespace

TEST_CASE("cuspmap calibrate: table, files, and the profile they write", "[cli]") {
  test::TempDir dir;
  test::write_text(dir.file("history.csv"), kHistory);
  const test::RunResult r =
      test::run_cuspmap({"calibrate", dir.file("history.csv"), "--out", dir.file("out")});
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  REQUIRE(r.out.find("4 rows, Ra in um") != std::string::npos);
  REQUIRE(r.out.find("Fit (floor+scale): measured Ra = ") != std::string::npos);
  REQUIRE(r.out.find("RMS of measured - model: before ") != std::string::npos);
  const std::string toml = test::read_text(dir.file("out/shop.toml"));
  REQUIRE(toml.find("model = \"floor+scale\"") != std::string::npos);
  REQUIRE(toml.find("created = \"20") != std::string::npos);
  const std::string svg = test::read_text(dir.file("out/calibration.svg"));
  REQUIRE(svg.find("</svg>") != std::string::npos);
}

TEST_CASE("cuspmap calibrate: bad input is one line, exit 2, nothing written", "[cli]") {
  test::TempDir dir;
  test::write_text(dir.file("bad.csv"), "tool,diameter,stepover,measured_ra\nball,6,0.3,x\n");
  test::require_input_error({"calibrate", dir.file("bad.csv"), "--out", dir.file("out")},
                            dir.file("bad.csv") + ":2: measured_ra 'x': not a number");
  REQUIRE(dir.list() == std::vector<std::string>{"bad.csv"});
  test::require_input_error({"calibrate", dir.file("none.csv")},
                            dir.file("none.csv") + ": cannot read the measurements file");
}

}  // namespace cuspmap

namespace cuspmap {

TEST_CASE("--shop: calibrated Ra beside the kinematic one, never in its place", "[cli]") {
  test::TempDir dir;
  test::write_text(dir.file("history.csv"), kHistory);
  const test::RunResult fit = test::run_cuspmap(
      {"calibrate", dir.file("history.csv"), "--out", dir.file("out"), "--json"});
  REQUIRE(fit.exit_code == 0);
  const nlohmann::json cal = nlohmann::json::parse(fit.out);
  const std::string profile = dir.file("out/shop.toml");
  const test::RunResult r = test::run_cuspmap(
      {"stepover", "--tool", "ball", "--diameter", "6", "--stepover", "0.5", "--shop", profile,
       "--json"});
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  const nlohmann::json doc = nlohmann::json::parse(r.out);
  const double kin = doc["Ra_um"].get<double>();
  REQUIRE(doc["shop"]["kinematic_Ra_um"].get<double>() == kin);  // the kinematic value stays
  // Derived: calibrated = floor + scale x kinematic (docs/calibration.md).
  REQUIRE_NEAR(doc["shop"]["calibrated_Ra_um"].get<double>(),
               cal["floor_um"].get<double>() + cal["scale"].get<double>() * kin, 1e-12);
  const test::RunResult text = test::run_cuspmap(
      {"stepover", "--tool", "ball", "--diameter", "6", "--stepover", "0.5", "--shop", profile});
  REQUIRE(text.out.find("shop-calibrated Ra ") != std::string::npos);
  test::require_input_error({"stepover", "--tool", "ball", "--diameter", "6", "--stepover", "0.5",
                             "--shop", dir.file("missing.toml")},
                            "--shop " + dir.file("missing.toml") + ": cannot read the file");
}

}  // namespace cuspmap

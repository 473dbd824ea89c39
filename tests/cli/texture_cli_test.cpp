// `cuspmap texture`: the real binary on files written here; JSON keys, table, exit codes and
// verbatim one-line errors with nothing on stdout.
#include <cmath>
#include <nlohmann/json.hpp>

#include "io/npy.h"
#include "test_support.h"

using namespace cuspmap;
using cuspmap::test::run_cuspmap;

namespace {

// Passes along X every 0.3 mm leaving 5 um parabolic cusps; 0.1 x 5 mm at 0.005 mm cells.
Heightfield cusp_floor() {
  Heightfield hf;
  hf.nx = 20;
  hf.ny = 1000;
  hf.cell_mm = 0.005;
  hf.z_um.resize(hf.ny, hf.nx);
  for (int j = 0; j < hf.ny; ++j) {
    const double y = hf.y_mm(j), d = y - 0.3 * std::round(y / 0.3), u = 2 * d / 0.3;
    for (int i = 0; i < hf.nx; ++i) hf.z_um(j, i) = static_cast<float>(5.0 * u * u);
  }
  return hf;
}

}  // namespace

TEST_CASE("texture: --json prints the contract keys", "[cli]") {
  test::TempDir dir;
  test::write_text(dir.file("floor.npy"), encode_npy(cusp_floor()));
  const auto r = run_cuspmap({"texture", dir.file("floor.npy"), "--cell", "0.005", "--json"});
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  const nlohmann::json j = nlohmann::json::parse(r.out);
  for (const char* key : {"Ra_um", "Rq_um", "Rp_um", "Rv_um", "Rz_um", "Rt_um", "Rsk", "Rku",
                          "RSm_mm", "cutoff_mm", "direction", "lambda_s_um", "evaluation_length_mm",
                          "sampling_lengths", "iso1302_grade", "primary", "waviness"}) {
    CAPTURE(key);
    REQUIRE(j["profile"].contains(key));
  }
  for (const char* key :
       {"Sa_um", "Sq_um", "Sp_um", "Sv_um", "Sz_um", "Ssk", "Sku", "Sdr", "Str", "lay_deg"}) {
    CAPTURE(key);
    REQUIRE(j["areal"].contains(key));
  }
  REQUIRE(j["cell_mm"].get<double>() == 0.005);
  REQUIRE(j["size_mm"].size() == 2);
  REQUIRE(j["profile"]["direction"] == "across");
  // ISO 4288 Table 3: RSm 0.3 mm -> 0.8 mm; ideal cusp Ra = 4h/(9 sqrt 3) (DESIGN.md). At
  // lc/stepover = 2.7 the mean line keeps part of the cusp (ISO 16610-21 transmission), which
  // lowers Ra by about 1.3 %; the exact figure is checked by gaussian_filter_oracle.py.
  REQUIRE(j["profile"]["cutoff_mm"].get<double>() == 0.8);
  REQUIRE_NEAR(j["profile"]["Ra_um"].get<double>(), 20.0 / (9.0 * std::sqrt(3.0)), 0.02 * 1.283);
}

TEST_CASE("texture: table shows um, uin, grade and cut-off", "[cli]") {
  test::TempDir dir;
  test::write_text(dir.file("floor.npy"), encode_npy(cusp_floor()));
  const auto r = run_cuspmap({"texture", dir.file("floor.npy"), "--cell", "5um"});
  REQUIRE(r.exit_code == 0);
  REQUIRE(r.out.find(" um ") != std::string::npos);
  REQUIRE(r.out.find("ISO 1302:1992 N7") != std::string::npos);
  REQUIRE(r.out.find("cut-off 0.8 mm, chosen by RSm (periodic)") != std::string::npos);
}

TEST_CASE("texture: cell from report.json beside the file", "[cli]") {
  test::TempDir dir;
  test::write_text(dir.file("height.npy"), encode_npy(cusp_floor()));
  test::write_text(dir.file("report.json"), "{\"cell_mm\": 0.005}");
  const auto r = run_cuspmap({"texture", dir.file("height.npy"), "--json"});
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  REQUIRE(nlohmann::json::parse(r.out)["cell_mm"].get<double>() == 0.005);
}

TEST_CASE("texture: --export x3p reads back to the same parameters", "[cli]") {
  test::TempDir dir;
  test::write_text(dir.file("floor.npy"), encode_npy(cusp_floor()));
  const auto a = run_cuspmap({"texture", dir.file("floor.npy"), "--cell", "0.005", "--json",
                              "--export", dir.file("floor.x3p")});
  REQUIRE(a.exit_code == 0);
  const auto b = run_cuspmap({"texture", dir.file("floor.x3p"), "--json"});
  INFO(b.err);
  REQUIRE(b.exit_code == 0);
  const double sa = nlohmann::json::parse(a.out)["areal"]["Sa_um"],
               sb = nlohmann::json::parse(b.out)["areal"]["Sa_um"];
  REQUIRE_NEAR(sb, sa, 1e-5 * sa);
}

TEST_CASE("texture: malformed input exits 2 with one line and no output", "[cli]") {
  test::TempDir dir;
  test::write_text(dir.file("floor.npy"), encode_npy(cusp_floor()));
  test::write_text(dir.file("bad.csv"), "1,2,3\n4,5\n");
  test::write_text(dir.file("bad.xyz"), "0 0 1\n0.1 0 2\n0.25 0 3\n");
  test::write_text(dir.file("bad.sdf"), "aBCR-1.0\nNumPoints = 2\n*\n");
  test::write_text(dir.file("bad.x3p"), "PK but not a zip");
  struct Case {
    std::vector<std::string> args;
    std::string err;
  };
  const std::vector<Case> cases = {
      {{"texture", dir.file("bad.csv"), "--cell", "0.01"},
       dir.file("bad.csv") + ":2: 2 values, expected 3 as on line 1"},
      {{"texture", dir.file("bad.xyz")},
       dir.file("bad.xyz") +
           ":3: point (0.25, 0) is off the regular grid of cell 0.1 mm starting at (0, 0)"},
      {{"texture", dir.file("bad.sdf")}, dir.file("bad.sdf") + ": header lacks NumProfiles"},
      {{"texture", dir.file("bad.x3p")},
       dir.file("bad.x3p") + ": not an X3P file (not a zip archive)"},
      {{"texture", dir.file("floor.npy")},
       dir.file("floor.npy") +
           ": --cell is required for .npy files (no report.json with cell_mm beside it)"},
      {{"texture", dir.file("missing.npy"), "--cell", "0.01"},
       dir.file("missing.npy") + ": cannot open the file"},
      {{"texture", dir.file("floor.npy"), "--cell", "0.005", "--direction", "sideways"},
       "--direction 'sideways': allowed are across, along or an angle in deg"},
      {{"texture", dir.file("floor.npy"), "--cell", "0.005", "--z-units", "ft"},
       "--z-units 'ft': allowed units are um, nm, mm, m"},
      {{"texture", dir.file("floor.npy"), "--cell", "-1"}, "--cell -1: must be > 0"},
  };
  for (const Case& c : cases) {
    CAPTURE(c.args.back());
    const auto r = run_cuspmap(c.args);
    REQUIRE(r.exit_code == 2);
    REQUIRE(r.out.empty());
    REQUIRE(r.err == "cuspmap: error: " + c.err + "\n");
  }
}

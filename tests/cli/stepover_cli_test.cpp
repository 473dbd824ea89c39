// `cuspmap stepover` end to end: JSON keys and values, inch = metric, the human table, warnings,
// and every bad-input case's exit code and verbatim stderr line.
#include <cmath>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "test_support.h"

namespace {

using cuspmap::test::run_cuspmap;
using Args = std::vector<std::string>;

nlohmann::json run_json(Args args) {
  args.insert(args.begin(), "stepover");
  args.push_back("--json");
  const cuspmap::test::RunResult r = run_cuspmap(args);
  INFO("stderr: " << r.err);
  REQUIRE(r.exit_code == 0);
  return nlohmann::json::parse(r.out);  // throws unless stdout is exactly one JSON value
}

void require_bad(Args args, const std::string& line) {
  args.insert(args.begin(), "stepover");
  cuspmap::test::require_input_error(args, line);
}

}  // namespace

TEST_CASE("stepover: JSON keys and the handbook ball cusp", "[cli]") {
  const nlohmann::json j = run_json({"--tool", "ball", "--diameter", "6", "--stepover", "0.5"});
  REQUIRE(j.is_object());
  for (const char* key : {"stepover_mm", "cusp_um", "Ra_um", "Rq_um", "Rz_um",
                          "effective_radius_mm", "cusp_approx_um", "iso1302_grade",
                          "warnings", "notes", "cautions", "within_model"}) {
    CAPTURE(key);
    REQUIRE(j.contains(key));
  }
  REQUIRE_FALSE(j.contains("feed_mark_um"));  // only with --feed-per-tooth
  // machinecalcs.com worked example: 6 mm ball, 0.5 mm stepover -> h ~= 0.0104 mm.
  REQUIRE_NEAR(j["cusp_um"].get<double>(), 10.4, 0.05);
  // Machinery's Handbook cusp formula, evaluated here: 3 - sqrt(9 - 0.0625) mm.
  REQUIRE_NEAR(j["cusp_um"].get<double>(), (3.0 - std::sqrt(8.9375)) * 1000.0, 1e-9);
  REQUIRE(j["stepover_mm"].get<double>() == 0.5);
  REQUIRE(j["effective_radius_mm"].get<double>() == 3.0);
  REQUIRE(j["Rz_um"].get<double>() == j["cusp_um"].get<double>());
  // DESIGN.md parabolic forms beside it: Ra = 4h/(9 sqrt 3) with h = s^2/(8R).
  const double h_par = 0.25 / 24.0 * 1000.0;
  REQUIRE_NEAR(j["Ra_approx_um"].get<double>(), 4.0 * h_par / (9.0 * std::sqrt(3.0)), 1e-9);
  REQUIRE(j["iso1302_grade"] == "N8");  // Ra 2.68 um: smallest grade at or above is N8 (3.2)
  REQUIRE(j["within_model"] == true);
  REQUIRE(j["cautions"].size() == 1);
}

TEST_CASE("stepover: feed-per-tooth mark of a ball and once-per-revolution mark", "[cli]") {
  const nlohmann::json j =
      run_json({"--diameter", "6", "--stepover", "0.5", "--feed-per-tooth", "0.1", "--teeth", "2"});
  // DESIGN.md: ball feed mark R - sqrt(R^2 - (fz/2)^2).
  REQUIRE_NEAR(j["feed_mark_um"].get<double>(), (3.0 - std::sqrt(9.0 - 0.0025)) * 1000.0, 1e-9);
  REQUIRE_NEAR(j["feed_mark_per_rev_um"].get<double>(), (3.0 - std::sqrt(9.0 - 0.01)) * 1000.0,
               1e-9);
  REQUIRE(j["feed_per_rev_mm"].get<double>() == 0.2);
  // The feed marks leave the cross-feed cusp unchanged.
  REQUIRE_NEAR(j["cusp_um"].get<double>(), (3.0 - std::sqrt(8.9375)) * 1000.0, 1e-9);
}

TEST_CASE("stepover: inch input equals its metric equivalent", "[cli]") {
  const nlohmann::json in = run_json({"--diameter", "0.25in", "--stepover", "0.020in"});
  const nlohmann::json bare =
      run_json({"--units", "in", "--diameter", "0.25", "--stepover", "0.02"});
  const nlohmann::json mm = run_json({"--diameter", "6.35", "--stepover", "0.508mm"});
  for (const char* key : {"cusp_um", "Ra_um", "Rq_um", "stepover_mm"}) {
    CAPTURE(key);
    REQUIRE_NEAR(in[key].get<double>(), mm[key].get<double>(), 1e-12 * mm[key].get<double>());
    REQUIRE_NEAR(bare[key].get<double>(), mm[key].get<double>(), 1e-12 * mm[key].get<double>());
  }
  // Trade rule (common practice, no source): 1/4 in ball at 0.020 in leaves about 0.4 thou.
  REQUIRE_NEAR(in["cusp_um"].get<double>() / 25.4, 0.4, 0.01);
}

TEST_CASE("stepover: inverse targets in mm and inch", "[cli]") {
  // machinecalcs.com: 6 mm ball, 0.005 mm cusp -> stepover ~= 0.346 mm.
  const nlohmann::json j = run_json({"--diameter", "6", "--target-scallop", "5um"});
  REQUIRE(j["mode"] == "inverse");
  REQUIRE_NEAR(j["stepover_mm"].get<double>(), 0.346, 0.0005);
  REQUIRE_NEAR(j["cusp_um"].get<double>(), 5.0, 1e-9);
  REQUIRE(j["stepover_approx_mm"].get<double>() > j["stepover_mm"].get<double>());
  const nlohmann::json k = run_json({"--units", "in", "--diameter", "0.236220472440945",
                                     "--target-scallop", "196.850393700787uin"});
  REQUIRE_NEAR(k["stepover_mm"].get<double>(), j["stepover_mm"].get<double>(), 1e-9);
  const nlohmann::json ra = run_json({"--diameter", "6", "--target-ra", "0.8um"});
  REQUIRE_NEAR(ra["Ra_um"].get<double>(), 0.8, 1e-9);
  REQUIRE(ra["iso1302_grade"] == "N6");
}

TEST_CASE("stepover: bull-nose, flat, slope and cylinders", "[cli]") {
  const nlohmann::json bull = run_json(
      {"--tool", "bullnose", "--diameter", "10", "--corner-radius", "1", "--stepover", "9"});
  // DESIGN.md: rc - sqrt(rc^2 - (s/2 - (R - rc))^2) = 1 - sqrt(1 - 0.25) mm.
  REQUIRE_NEAR(bull["cusp_um"].get<double>(), (1.0 - std::sqrt(0.75)) * 1000.0, 1e-9);
  REQUIRE(bull["effective_radius_mm"].get<double>() == 1.0);
  const nlohmann::json flat = run_json({"--tool", "flat", "--diameter", "10", "--stepover", "5"});
  REQUIRE(flat["cusp_um"].get<double>() == 0.0);
  REQUIRE(flat["effective_radius_mm"].is_null());
  REQUIRE(flat["iso1302_grade"].is_null());
  REQUIRE(flat["notes"][0].get<std::string>().find("cuspmap simulate") != std::string::npos);
  // Flat end mill on a 10 deg slope: saw-tooth s sin(a) (geometry, see scallop_plane_test).
  const nlohmann::json saw =
      run_json({"--tool", "flat", "--diameter", "10", "--slope", "10deg", "--stepover", "1"});
  REQUIRE_NEAR(saw["cusp_um"].get<double>(), std::sin(10.0 * M_PI / 180.0) * 1000.0,
               1e-6);
  const nlohmann::json vex = run_json(
      {"--diameter", "6", "--surface", "convex", "--surface-radius", "20", "--stepover", "0.5"});
  REQUIRE_NEAR(vex["effective_radius_mm"].get<double>(), 3.0 * 20.0 / 23.0, 1e-12);
  // Lin & Koren 1996 small-stepover limit, within 0.5% at s = 0.5 mm.
  REQUIRE_NEAR(vex["cusp_um"].get<double>(), 0.25 / 8.0 * (1.0 / 3 + 1.0 / 20) * 1000.0,
               0.005 * vex["cusp_um"].get<double>());
}

TEST_CASE("stepover: turning feed marks with --tool insert", "[cli]") {
  const nlohmann::json j =
      run_json({"--tool", "insert", "--nose-radius", "0.8", "--feed-per-rev", "0.2"});
  // Boothroyd & Knight: Rt = f^2/(8r) = 6.25 um, Ra = f^2/(18 sqrt 3 r) ~= 1.604 um.
  REQUIRE_NEAR(j["Rz_approx_um"].get<double>(), 6.25, 1e-9);
  REQUIRE_NEAR(j["Ra_approx_um"].get<double>(), 40.0 / (18.0 * std::sqrt(3.0) * 0.8), 1e-9);
  REQUIRE(j["feed_per_rev_mm"].get<double>() == 0.2);
  REQUIRE(j["tool"]["shape"] == "insert");
}

TEST_CASE("stepover: passes that no longer overlap are refused, exit 2", "[cli]") {
  // Issue 8: degenerate geometry is an input error, not a warning with lower-bound numbers.
  const auto flat = run_cuspmap({"stepover", "--tool", "flat", "--diameter", "6", "--stepover", "7"});
  REQUIRE(flat.exit_code == 2);
  REQUIRE(flat.err ==
          "cuspmap: error: --stepover 7 mm: must be < the tool diameter 6 mm (wider passes leave "
          "uncut strips between them)\n");
  REQUIRE(flat.out.empty());
  // s = D exactly: neighbouring circles touch at one point; the strip between is uncut.
  const auto touch = run_cuspmap({"stepover", "--diameter", "6", "--stepover", "6"});
  REQUIRE(touch.exit_code == 2);
  // Convex cylinder: reach 2 rho asin(R / (rho + R)) = 2*10*asin(3/13) = 4.6571 mm (Lin & Koren
  // 1996 geometry, scallop_curved.h).
  const auto vex = run_cuspmap({"stepover", "--diameter", "6", "--surface", "convex",
                                "--surface-radius", "10", "--stepover", "5"});
  REQUIRE(vex.exit_code == 2);
  REQUIRE(vex.err.find("--stepover 5 mm: must be <= 4.657") != std::string::npos);
  REQUIRE(vex.err.find("convex surface") != std::string::npos);
  const auto cave = run_cuspmap({"stepover", "--diameter", "6", "--surface", "concave",
                                 "--surface-radius", "2", "--stepover", "0.5"});
  REQUIRE(cave.exit_code == 2);
  REQUIRE(cave.err ==
          "cuspmap: error: --surface-radius 2 mm: must be larger than the ball radius 3 mm (a "
          "ball cannot follow a tighter concave surface)\n");
}

TEST_CASE("stepover: human table in mm and in inches", "[cli]") {
  const auto mm = run_cuspmap({"stepover", "--diameter", "6", "--stepover", "0.5"});
  REQUIRE(mm.exit_code == 0);
  REQUIRE(mm.out.find("cusp height         10.4 um") != std::string::npos);
  REQUIRE(mm.out.find("ISO 1302:1992 grade N8 (Ra up to 3.2 um = 125 uin)") != std::string::npos);
  REQUIRE(mm.out.find("Caution: ") != std::string::npos);
  const auto in =
      run_cuspmap({"stepover", "--units", "in", "--diameter", "0.25", "--stepover", "0.02"});
  REQUIRE(in.exit_code == 0);
  REQUIRE(in.out.find("stepover            0.02 in") != std::string::npos);
  REQUIRE(in.out.find("cusp height         401 uin") != std::string::npos);
}

TEST_CASE("stepover: --help is real and --verbose prints stages", "[cli]") {
  const auto help = run_cuspmap({"stepover", "--help"});
  REQUIRE(help.exit_code == 0);
  for (const char* text : {"--target-scallop", "--surface-radius", "--feed-per-rev",
                           "Conventions: heights are along the surface normal", "Examples"}) {
    CAPTURE(text);
    REQUIRE(help.out.find(text) != std::string::npos);
  }
  const auto v = run_cuspmap({"stepover", "--diameter", "6", "--stepover", "0.5", "--verbose"});
  REQUIRE(v.exit_code == 0);
  REQUIRE(v.err.find("cusp ") == 0);
  REQUIRE(v.err.find("\noutput ") != std::string::npos);
}

TEST_CASE("stepover: bad input exits 2 with one line naming the value", "[cli]") {
  require_bad({"--diameter", "-3", "--stepover", "1"}, "--diameter -3 mm: must be > 0");
  require_bad({"--diameter", "0", "--stepover", "1"}, "--diameter 0 mm: must be > 0");
  require_bad({"--tool", "bullnose", "--diameter", "10", "--corner-radius", "6", "--stepover", "1"},
              "--corner-radius 6 mm: must be > 0 and <= the tool radius 5 mm");
  require_bad({"--tool", "bullnose", "--diameter", "10", "--stepover", "1"},
              "--corner-radius is required for --tool bullnose");
  require_bad({"--diameter", "6", "--stepover", "0"}, "--stepover 0 mm: must be > 0");
  require_bad({"--diameter", "6", "--stepover=-1"}, "--stepover -1 mm: must be > 0");
  require_bad({"--diameter", "6", "--stepover", "0.5ft"},
              "--stepover '0.5ft': unknown unit; allowed suffixes are mm, um, in, thou, uin");
  require_bad({"--diameter", "6", "--stepover", "1", "--units", "cm"},
              "--units 'cm': allowed units are mm, in");
  require_bad({"--diameter", "6"},
              "one of --stepover, --target-scallop, --target-ra, --target-rz, --target-sa is required");
  require_bad({"--diameter", "6", "--stepover", "1", "--target-ra", "1um"},
              "give only one of --stepover, --target-scallop, --target-ra, --target-rz, --target-sa (got "
              "--stepover and --target-ra)");
  require_bad({"--tool", "drill", "--diameter", "6", "--stepover", "1"},
              "--tool 'drill': allowed tools are ball, bullnose, flat, insert");
  require_bad({"--diameter", "6", "--surface", "torus", "--stepover", "1"},
              "--surface 'torus': allowed surfaces are flat, convex, concave");
  require_bad({"--tool", "bullnose", "--diameter", "10", "--corner-radius", "1", "--target-scallop",
               "1500um"},
              "--target-scallop 1500 um: unreachable; the largest cusp this cutter and surface "
              "leave is 1000 um (a cusp is never deeper than the corner radius 1 mm)");
  require_bad({"--tool", "flat", "--diameter", "10", "--target-scallop", "5um"},
              "--target-scallop 5 um: unreachable; a flat end mill on a level floor leaves no "
              "cross-feed cusp at stepovers below its diameter (marks come from the rim, dish, "
              "tilt and runout: use cuspmap simulate)");
  require_bad({"--diameter", "6", "--target-ra", "-2um"}, "--target-ra -2 um: must be > 0");
  require_bad({"--tool", "flat", "--diameter", "6", "--surface", "convex", "--surface-radius", "5",
               "--stepover", "1"},
              "--surface convex: cylinder closed forms hold for --tool ball only (a flat-bottomed "
              "cutter's contact jumps across its flat face); use a ball, or --surface flat with "
              "--slope");
  require_bad({"--diameter", "6", "--surface", "concave", "--stepover", "1"},
              "--surface-radius is required for --surface concave");
  require_bad({"--diameter", "6", "--slope", "95", "--stepover", "1"},
              "--slope 95 deg: must be greater than -90 and less than 90 deg");
  require_bad({"--diameter", "6", "--slope", "2rad", "--stepover", "1"},
              "--slope '2rad': unknown angle unit; allowed suffix is deg");
  require_bad({"--diameter", "6", "--stepover", "1", "--feed-per-tooth", "7"},
              "--feed-per-tooth 7 mm: must be smaller than twice the ball radius (6 mm)");
  require_bad({"--diameter", "6", "--stepover", "1", "--teeth", "2.5"},
              "--teeth 2.5: must be a whole number >= 1");
  require_bad({"--tool", "bullnose", "--diameter", "10", "--corner-radius", "1", "--dish", "-1",
               "--stepover", "1"},
              "--dish -1 deg: must be >= 0 and < 45 deg");
  require_bad({"--tool", "insert", "--feed-per-rev", "0.2"},
              "--nose-radius is required for --tool insert");
  require_bad({"--tool", "insert", "--nose-radius", "0.8", "--feed-per-rev", "2"},
              "--feed-per-rev 2 mm: must be smaller than twice the nose radius (1.6 mm)");
  require_bad({"--diameter", "abc", "--stepover", "1"}, "--diameter 'abc': not a number");
}

TEST_CASE("issue_13: stepover --target-sa designs for the marks along the feed", "[cli][areal]") {
  // The case: a 10 mm ball at fz 0.08 mm; the profile alone allows 0.125 mm for
  // Ra 0.1 um (handbook arc), the areal design less (the marks along the feed count).
  const nlohmann::json j = run_json({"--tool", "ball", "--diameter", "10", "--target-sa", "0.1",
                                     "--feed-per-tooth", "0.08", "--teeth", "2"});
  CHECK(j["target"]["quantity"] == "Sa");
  CHECK(j["stepover_mm"].get<double>() < 0.95 * 0.1249);
  CHECK(j["areal_design"]["Sa_um"].get<double>() <= 0.1);
  CHECK(j["areal_design"]["profile_stepover_mm"].get<double>() == Approx(0.1249).epsilon(0.002));
  // Without feed marks Sa is the extruded profile's Ra: the --target-ra stepover (ISO 25178-2 /
  // ISO 4287 definitions over whole periods).
  const nlohmann::json sa = run_json({"--tool", "ball", "--diameter", "10", "--target-sa", "0.1"});
  const nlohmann::json ra = run_json({"--tool", "ball", "--diameter", "10", "--target-ra", "0.1"});
  CHECK(sa["stepover_mm"].get<double>() ==
        Approx(ra["stepover_mm"].get<double>()).epsilon(1e-12));
  // Bad input: one line naming the value, exit 2.
  require_bad({"--tool", "ball", "--diameter", "10", "--target-sa", "0.1", "--slope", "10"},
              "--target-sa: the areal design simulates a level floor; use --surface flat without "
              "--slope, or --target-ra for cylinders and slopes");
  require_bad({"--tool", "ball", "--diameter", "10", "--target-sa", "0.1", "--feed-per-tooth",
               "0.05", "--pass-direction", "sideways"},
              "--pass-direction 'sideways': allowed are one-way, zigzag");
}

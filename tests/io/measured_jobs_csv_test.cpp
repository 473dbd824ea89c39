// Tests of the calibration measurements reader: columns in any order, units at the edge (bare Ra
// um, or uin in inch mode), job paths relative to the file, and one-line refusals.
#include "core/input_error.h"
#include "io/measured_jobs_csv.h"
#include "test_support.h"

namespace cuspmap {

TEST_CASE("parse_measured_jobs: tool rows and job rows, units at the edge", "[io]") {
  const std::string text =
      "# invented mould shop history\n"
      "measured_ra,name,tool,diameter,corner_radius,stepover,job\n"
      "0.62,\"cavity, side A\",ball,6,,0.3,\n"
      "0.9um,core floor,bullnose,10mm,1,1.5,\n"
      "0.45,,,,,,jobs/insert.toml\n";
  const auto rows = parse_measured_jobs(text, "m.csv", "/data", LengthUnit::Millimetre);
  REQUIRE(rows.size() == 3);
  REQUIRE(rows[0].name == "cavity, side A");
  REQUIRE(rows[0].setup->cutter.shape == CutterShape::Ball);
  REQUIRE(rows[0].stepover_mm == 0.3);
  REQUIRE(rows[0].measured_ra_um == 0.62);
  REQUIRE(rows[1].setup->cutter.corner_radius_mm == 1.0);
  REQUIRE(rows[2].name == "row 5");
  REQUIRE(rows[2].line == 5);
  REQUIRE(rows[2].job_path == "/data/jobs/insert.toml");
  REQUIRE_FALSE(rows[2].setup.has_value());
}

TEST_CASE("parse_measured_jobs: inch mode reads bare Ra as micro-inches", "[io]") {
  // 1 uin = 0.0254 um (1 in = 25.4 mm, exact since 1959).
  const auto rows = parse_measured_jobs("tool,diameter,stepover,measured_ra\nball,0.25,0.01,32\n"
                                        "ball,0.25,0.02,63\n",
                                        "m.csv", "", LengthUnit::Inch);
  REQUIRE_NEAR(rows[0].measured_ra_um, 32 * 0.0254, 1e-12);
  REQUIRE_NEAR(rows[0].setup->cutter.diameter_mm, 6.35, 1e-12);
  REQUIRE_NEAR(rows[1].stepover_mm, 0.508, 1e-12);
}

TEST_CASE("parse_measured_jobs: refusals name the line, the column and the value", "[io]") {
  auto message = [](const std::string& text) {
    try {
      parse_measured_jobs(text, "m.csv", "", LengthUnit::Millimetre);
    } catch (const InputError& e) {
      return std::string(e.what());
    }
    return std::string("no error");
  };
  REQUIRE(message("tool,diameter,stepover,ra\n") ==
          "m.csv:1: unknown column 'ra'; allowed: name, job, tool, diameter, corner_radius, "
          "stepover, measured_ra");
  REQUIRE(message("tool,diameter,stepover\n") ==
          "m.csv:1: the header has no measured_ra column (the profilometer's Ra)");
  REQUIRE(message("tool,diameter,stepover,measured_ra\nball,6,,0.5\n") ==
          "m.csv:2: give a job file (job) or tool, diameter and stepover");
  REQUIRE(message("tool,diameter,stepover,measured_ra\ncone,6,0.3,0.5\n") ==
          "m.csv:2: tool 'cone': allowed values are ball, bullnose, flat");
  REQUIRE(message("tool,diameter,stepover,measured_ra\nball,6,0.3,-1\n") ==
          "m.csv:2: measured_ra -1: must be > 0");
  REQUIRE(message("tool,diameter,stepover,measured_ra\nball,6,7,0.5\n") ==
          "m.csv:2: stepover 7: must be smaller than the diameter");
  REQUIRE(message("tool,diameter,stepover,measured_ra\nball,6,0.3,0.5\n") ==
          "m.csv: 1 measured row(s); calibration needs at least 2");
}

}  // namespace cuspmap

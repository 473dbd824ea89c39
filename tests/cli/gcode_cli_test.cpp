// CLI tests of G-code jobs: `cuspmap simulate JOB.toml --out DIR` with [path] kind = "gcode".
// Bad programs exit 2 with one stderr line naming file:line, the word and why, and write no
// output files; good programs write the report. Hidden () until `simulate` lands.
#include <filesystem>
#include <nlohmann/json.hpp>
#include <string>

#include "test_support.h"

namespace cuspmap {
namespace {

// A job around a program in the same folder (DESIGN.md "Job file").
std::string gcode_job(const std::string& program_file, bool with_patch = true) {
  std::string job = "units = \"mm\"\n";
  if (with_patch) {
    job += "[patch]\nsize = [10, 10]\ncell = 0.05\n";
  } else {
    job += "[patch]\ncell = 0.05\n";
  }
  job += "[tool]\nshape = \"ball\"\ndiameter = 6\n"
         "[cut]\nrpm = 10000\nfeed = 600\n"
         "[path]\nkind = \"gcode\"\nfile = \"" + program_file + "\"\n";
  return job;
}

bool ends_with(const std::string& s, const std::string& tail) {
  return s.size() >= tail.size() && s.compare(s.size() - tail.size(), tail.size(), tail) == 0;
}

bool no_output(const std::string& dir) {
  return !std::filesystem::exists(dir) || std::filesystem::is_empty(dir);
}

// Runs simulate on `program` and returns the result; the output folder is `out` under `dir`.
test::RunResult simulate(const test::TempDir& dir, const std::string& program, bool with_patch = true) {
  test::write_text(dir.file("part.nc"), program);
  test::write_text(dir.file("job.toml"), gcode_job("part.nc", with_patch));
  return test::run_cuspmap({"simulate", dir.file("job.toml"), "--out", dir.file("out")});
}

}  // namespace

TEST_CASE("simulate: unsupported G-code exits 2 with file:line, word and why", "[cli]") {
  test::TempDir dir;
  const test::RunResult r = simulate(dir, "G21 G90\nG0 X0 Y0 Z5\nG93 G1 X1 F100\n");
  CHECK(r.exit_code == 2);
  CHECK(r.err.rfind("cuspmap: error: ", 0) == 0);
  CHECK(ends_with(r.err, "part.nc:3: 'G93': inverse-time feed (G93) is not supported; post the "
                         "program with feed per minute (G94)\n"));
  CHECK(r.err.find('\n') == r.err.size() - 1);  // one line
  CHECK(no_output(dir.file("out")));
}

TEST_CASE("simulate: malformed G-code programs exit 2 and write nothing", "[cli]") {
  struct Case {
    const char* program;
    const char* tail;
  };
  const Case cases[] = {
      {"G21 G90 G0 X0 Y0 Z0\nG2 X10 Y0 R4 F100\n",
       "part.nc:2: 'R4': radius 4 mm is smaller than half the chord 5 mm: the end point cannot be "
       "reached\n"},
      {"G21 G90 G0 X0 Y0 Z0\nG2 X10.01 Y0 I5 J0 F100\n",
       "part.nc:2: 'G2': end point is not on the arc: radius 5 mm at the start, 5.01 mm at the end; "
       "RS274NGC v3 allows 0.002 mm difference\n"},
      {"Hello, world\n", "part.nc:1: 'H': the letter H needs a number after it\n"},
      {"", "part.nc:1: empty file: no G-code program in it\n"},
      // issue_16: a feed move from an unknown start now warns; a bad expression is refused.
      {"G21 G90 G0 X0 Y0 Z5\nG1 X[1/0] F100\n", "part.nc:2: 'X[1/0]': division by zero\n"},
  };
  for (const Case& c : cases) {
    CAPTURE(c.program);
    test::TempDir dir;
    const test::RunResult r = simulate(dir, c.program);
    CHECK(r.exit_code == 2);
    CHECK(ends_with(r.err, c.tail));
    CHECK(no_output(dir.file("out")));
  }
}

TEST_CASE("simulate: a 100 MB single-line program exits 2 at line 1", "[cli]") {
  test::TempDir dir;
  test::write_text(dir.file("part.nc"), std::string(100 << 20, 'X'));
  test::write_text(dir.file("job.toml"), gcode_job("part.nc"));
  const test::RunResult r = test::run_cuspmap({"simulate", dir.file("job.toml"), "--out", dir.file("out")});
  CHECK(r.exit_code == 2);
  CHECK(ends_with(r.err, "part.nc:1: line longer than 4096 characters: not a G-code program line\n"));
  CHECK(no_output(dir.file("out")));
}

TEST_CASE("simulate: a G-code floor program writes the report, patch from its extent", "[cli]") {
  // Zigzag of three passes 0.5 mm apart over x in [0, 4], joined by semicircles (G3/G2, R form).
  const std::string program =
      "%\nO3001 (TEST FLOOR)\nG17 G21 G90 G94\nM3 S10000\nG0 X0 Y0 Z2\nG1 Z0 F600\n"
      "X4\nG3 X4 Y0.5 R0.25\nG1 X0\nG2 X0 Y1 R0.25\nG1 X4\nG0 Z2\nM30\n%\n";
  test::TempDir dir;
  const test::RunResult r = simulate(dir, program, false);
  REQUIRE(r.exit_code == 0);
  const nlohmann::json report = nlohmann::json::parse(test::read_text(dir.file("out/report.json")));
  CHECK(report.contains("path_length_mm"));
  CHECK(report.contains("cycle_time_s"));
  // patch_from_extent: the tip's box of the floor moves: x -0.25 .. 4.25 (the arcs bulge out
  // by their radius), y 0 .. 1.
  REQUIRE(report["size_mm"].size() == 2);
  CHECK(std::abs(report["size_mm"][0].get<double>() - 4.5) < 1e-9);
  CHECK(std::abs(report["size_mm"][1].get<double>() - 1.0) < 1e-9);
}

TEST_CASE("simulate: --block-delete off runs the '/' lines, on skips them", "[cli]") {
  // RS274NGC v3 section 3.3 item 1: with the switch on, a line starting with '/' is skipped.
  test::TempDir dir;
  test::write_text(dir.file("part.nc"),
                   "G21 G90 M3 S10000\nG0 X0 Y0 Z2\nG1 Z0 F600\nX4\n/Y1\nG0 Z2\nM30\n");
  double length_mm[2] = {0, 0};
  for (int off = 0; off < 2; ++off) {
    const std::string out = dir.file(off ? "off" : "on");
    const test::RunResult r = test::run_cuspmap(
        {"simulate", "--gcode", dir.file("part.nc"), "--diameter", "6", "--cell", "0.05", "--out",
         out, "--block-delete", off ? "off" : "on"});
    REQUIRE(r.exit_code == 0);
    CHECK(r.out.find(off ? "warning: 1 block-delete line ('/') run: block delete is off"
                         : "warning: 1 block-delete line ('/') skipped") != std::string::npos);
    length_mm[off] = nlohmann::json::parse(test::read_text(out + "/report.json"))["path_length_mm"];
  }
  CHECK(std::abs(length_mm[1] - length_mm[0] - 1.0) < 1e-9);  // the Y1 feed move, derived
  const test::RunResult bad = test::run_cuspmap(
      {"simulate", "--gcode", dir.file("part.nc"), "--diameter", "6", "--out", dir.file("x"),
       "--block-delete", "maybe"});
  CHECK(bad.exit_code == 2);
}

}  // namespace cuspmap

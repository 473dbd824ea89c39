// Tests of the RS-274 reader: modal state, distance modes, units, comments, block delete, line
// and program numbers, '%' markers, numbers without a decimal point, start position, feed,
// spindle direction and warnings. Sources are named beside each check.
#include "path/gcode_reader.h"

#include <string>

#include "core/input_error.h"
#include "path/path_test_geometry.h"
#include "test_support.h"

namespace cuspmap {
namespace {

BuiltPath read(const std::string& text, CutSpec cut = CutSpec{}) {
  return read_gcode_text(text, "part.nc", cut, test::test_patch(), test::test_ball());
}

std::string error_of(const std::string& text) {
  return test::input_error_of([&] { read(text); });
}

void require_point(const Eigen::Vector3d& p, double x, double y, double z) {
  INFO("point (" << p.x() << ", " << p.y() << ", " << p.z() << ")");
  REQUIRE_NEAR(p.x(), x, 1e-12);
  REQUIRE_NEAR(p.y(), y, 1e-12);
  REQUIRE_NEAR(p.z(), z, 1e-12);
}

}  // namespace

TEST_CASE("read_gcode_text: motion mode and feed stay in force (modal)", "[path]") {
  // RS274NGC v3 §3.3.7: "If a G1 command is given on one line, it will be executed again on the
  // next line if one or more axis words is available on the line".
  const BuiltPath b = read(
      "G21 G90 G17\n"
      "G0 X0 Y0 Z5\n"  // start unknown: positioning, not emitted
      "G1 Z0 F600\n"
      "X10\n"
      "Y2\n"
      "G0 Z5\n");
  REQUIRE(b.path.moves.size() == 4);
  const auto& m = b.path.moves;
  require_point(m[0].start_mm, 0, 0, 5);
  require_point(m[0].end_mm, 0, 0, 0);
  require_point(m[1].end_mm, 10, 0, 0);
  require_point(m[2].end_mm, 10, 2, 0);
  require_point(m[3].end_mm, 10, 2, 5);
  CHECK(m[2].feed_mm_per_min == 600.0);
  CHECK_FALSE(m[2].rapid);
  CHECK(m[3].rapid);
  CHECK(m[3].feed_mm_per_min == CutSpec{}.rapid_mm_per_min);
  CHECK(m[0].source_line == 3);
  CHECK(m[3].source_line == 6);
  CHECK(m[0].kind == MoveKind::Line);
}

TEST_CASE("read_gcode_text: G91 adds to the position, G90 sets it", "[path]") {
  // RS274NGC v3 Table 5: G90 absolute, G91 incremental distance mode.
  const BuiltPath b = read("G21 G90 G0 X1 Y1 Z1\nG91 G1 X2 Y-1 Z-1 F100\nX1\nG90 X0\n");
  REQUIRE(b.path.moves.size() == 3);
  require_point(b.path.moves[0].end_mm, 3, 0, 0);
  require_point(b.path.moves[1].end_mm, 4, 0, 0);
  require_point(b.path.moves[2].end_mm, 0, 0, 0);
}

TEST_CASE("read_gcode_text: G20 reads inches, 1 in = 25.4 mm exactly, feed in in/min", "[path]") {
  // 1 in = 25.4 mm exactly (international yard and pound agreement, 1959).
  const BuiltPath b = read("G20 G90 G0 X0 Y0 Z0\nG1 X1 Y0.5 F10\nG21 X2\nF100 X3\n");
  REQUIRE(b.path.moves.size() == 3);
  require_point(b.path.moves[0].end_mm, 25.4, 12.7, 0);
  CHECK(b.path.moves[0].feed_mm_per_min == 254.0);
  // issue_16: a feed set before a G20/G21 change keeps its physical rate (the canonical machining
  // functions of RS274NGC v3 §4 hold the feed as a rate, not as a number of units).
  require_point(b.path.moves[1].end_mm, 2, 12.7, 0);
  CHECK(b.path.moves[1].feed_mm_per_min == 254.0);
  // RS274NGC v3 §2.1.2.5: a new F is in the current length units per minute (mm after G21).
  CHECK(b.path.moves[2].feed_mm_per_min == 100.0);
}

TEST_CASE("read_gcode_text: numbers without a decimal point are read at face value", "[path]") {
  // RS274NGC v3 §3.3.2.1: "An integer does not have a decimal point in it"; §3.3: spaces are
  // allowed anywhere outside comments and input is case insensitive ("g0x +0. 12 34y 7").
  const BuiltPath b = read("G21 G90 G0 X0 Y0 Z0\nG1 X10 F100\ng1x +0. 12 34y 7\nX.5 Y-1.\n");
  REQUIRE(b.path.moves.size() == 3);
  require_point(b.path.moves[0].end_mm, 10, 0, 0);
  require_point(b.path.moves[1].end_mm, 0.1234, 7, 0);
  require_point(b.path.moves[2].end_mm, 0.5, -1, 0);
}

TEST_CASE("read_gcode_text: comments, block delete, N and O numbers, % markers", "[path]") {
  // RS274NGC v3 §3.3 (block delete '/', line number), §3.3.4 comments, §3.1 '%' demarcation:
  // "The useful contents of a file demarcated by percents stop after the second percent line."
  const BuiltPath b = read(
      "%\n"
      "O1234 (BRACKET FLOOR)\n"
      "(setup: G21 mm)\n"
      "N10 G21 G90 ; metric, absolute\n"
      "N20 G0 X0 Y0 Z1 (approach)\n"
      "/N25 G1 X100 F50\n"
      "N30 G1 Z0 F100\n"
      "N40 X5 (cut) Y1\n"
      "\n"
      "%\n"
      "G1 X99 Y99\n");
  REQUIRE(b.path.moves.size() == 2);
  require_point(b.path.moves[1].end_mm, 5, 1, 0);
  CHECK(b.path.moves[1].source_line == 8);
}

TEST_CASE("read_gcode_text: M2 and M30 end the program", "[path]") {
  // RS274NGC v3 §3.6.1: "No more lines of code ... will be executed after the M2 or M30".
  const BuiltPath b = read("G21 G90 G0 X0 Y0 Z0\nG1 X1 F100\nM30\nthis is not G-code\n");
  REQUIRE(b.path.moves.size() == 1);
}

TEST_CASE("read_gcode_text: the start position is unknown until set absolutely", "[path]") {
  // Documented in gcode_reader.h: a positioning G0 from an unknown place is not emitted; a feed
  // move from an unknown place is an error.
  const BuiltPath b = read("G21 G90 G0 Z5\nG0 X1 Y2\nG0 Z1\n");
  REQUIRE(b.path.moves.size() == 1);
  require_point(b.path.moves[0].start_mm, 1, 2, 5);
  // issue_16: a feed move from an unknown start warns and the path begins at its end point.
  const BuiltPath feed = read("G21 G90\nG0 Z5\nG1 X1 Y0 F100\nY2\n");
  REQUIRE(feed.path.moves.size() == 1);
  require_point(feed.path.moves[0].start_mm, 1, 0, 5);
  REQUIRE(!feed.warnings.empty());
  CHECK(feed.warnings[0].line == 3);
  CHECK(feed.warnings[0].message ==
        "G1 from an unknown start (X not yet set): the path begins at its end point, as after a "
        "rapid");
  CHECK(error_of("G21 G91 G0 X1\n") ==
        "part.nc:1: 'X1': position of X unknown: an incremental (G91) move needs an earlier "
        "absolute X");
}

TEST_CASE("read_gcode_text: F must come before the first feed move", "[path]") {
  CHECK(error_of("G21 G90 G0 X0 Y0 Z0\nG1 X1\n") ==
        "part.nc:2: 'G1': no feed rate: program F before the first G1, G2 or G3");
  // RS274NGC v3 Table 8: F is set (3) before motion (20) on the same line.
  CHECK(read("G21 G90 G0 X0 Y0 Z0\nG1 X1 F100\n").path.moves.size() == 1);
}

TEST_CASE("read_gcode_text: spindle direction from M3/M4, one per program", "[path]") {
  const std::string start = "G21 G90 G0 X0 Y0 Z0\n";
  CHECK(read(start + "M4 S10000\nG1 X1 F100\n").spindle == SpindleDirection::Ccw);
  CHECK(read(start + "M3 S10000\nG1 X1 F100\n").spindle == SpindleDirection::Cw);
  CutSpec ccw;
  ccw.spindle = SpindleDirection::Ccw;
  const BuiltPath fallback = read(start + "G1 X1 F100\n", ccw);
  CHECK(fallback.spindle == SpindleDirection::Ccw);
  REQUIRE(fallback.warnings.size() == 1);
  CHECK(fallback.warnings[0].message ==
        "no M3/M4 before the first feed move: the [cut] spindle direction (ccw) is used");
  CHECK(error_of(start + "M3\nG1 X1 F100\nM4\nG1 X2\n") ==
        "part.nc:5: 'G1': the spindle direction changed (line 4) after cutting under the one set "
        "on line 2: cuspmap simulates one direction per program");
}

TEST_CASE("read_gcode_text: warnings for a rapid that reaches the floor, with its line", "[path]") {
  // Patch 10 x 10 mm, floor Z 0, 6 mm ball: reach R = 3 mm (DESIGN.md p(R) = R for a ball).
  const BuiltPath b = read(
      "G21 G90 M3 S10000\n"
      "G0 X-20 Y5 Z10\n"
      "G0 X20\n"       // 10 mm above the floor: clear
      "G0 Z2.5\n"      // outside the patch (x = 20 > 10 + R): clear
      "G0 X-20\n"      // crosses the patch at 2.5 mm < 3 mm: warning
      "G0 X-20 Y20\n"  // at x = -20, beyond R of the patch: clear
      "G0 X5 Y5 Z0.5\n"  // descends into reach over the patch: warning
      "G1 Z0 F100\n"
      "G0 Z5\n");       // straight up from the floor: a retract, no warning
  REQUIRE(b.warnings.size() == 2);
  CHECK(b.warnings[0].line == 5);
  CHECK(b.warnings[1].line == 7);
  CHECK(b.warnings[0].message ==
        "rapid (G0) comes within the cutter's reach (3 mm) of the floor over the patch (tip down "
        "to Z=2.5 mm): it is swept like a cut");
}

TEST_CASE("read_gcode_text: no-op codes are accepted and noted once", "[path]") {
  const BuiltPath b = read(
      "G17 G21 G40 G49 G54 G64 G80 G90 G94 G98\n"
      "T1 M6\nM3 S10000 M8\nG43 H1 G0 X0 Y0 Z1\nG4 P0.5\nG1 Z0 F100\nM1\nG61 X1\nT2 M6\nM9 M5\n"
      "G4 P1\n");
  CHECK(b.path.moves.size() == 2);
  // issue_16: codes that move nothing are read past with one warning per code, in line order.
  REQUIRE(b.warnings.size() == 7);
  CHECK(b.warnings[0].message ==
        "G64 read past (path blending (exact stop / tolerance) does not change the programmed "
        "path): it moves nothing");
  CHECK(b.warnings[1].message ==
        "tool change (M6) ignored: every move is simulated with the job's [tool]");
  CHECK(b.warnings[2].message == "M8 read past (coolant): it moves nothing");
  CHECK(b.warnings[3].message == "dwell (G4) ignored: dwell times are not counted in cycle_time_s");
  CHECK(b.warnings[4].message ==
        "M1 read past (program pause; not counted in cycle_time_s): it moves nothing");
  CHECK(b.warnings[5].line == 8);
  CHECK(b.warnings[6].message == "M9 read past (coolant): it moves nothing");
  CHECK(error_of("G54 G0 X0 Y0 Z0\nG55 G0 X1\n") ==
        "part.nc:2: 'G55': the program switches work coordinate systems ('G54' before) and their "
        "offsets are not set in the program (G10 L2): cuspmap reads one system per program "
        "otherwise");
}

TEST_CASE("read_gcode_text: an S word that differs from [cut] rpm warns once", "[path]") {
  const BuiltPath b = read("G21 G90 M3 S12000\nG0 X0 Y0 Z0\nG1 X1 F100 S13000\n");
  REQUIRE(b.warnings.size() == 1);
  CHECK(b.warnings[0].message ==
        "program speed S12000 differs from [cut] rpm 10000: the tooth-resolved sweep uses [cut] rpm");
}

TEST_CASE("read_gcode_text: zero-length lines are dropped, CR LF and CR line ends read", "[path]") {
  const BuiltPath b = read("G21 G90\r\nG0 X0 Y0 Z0\rG1 X0 F100\r\nX1\r\n");
  REQUIRE(b.path.moves.size() == 1);
  CHECK(b.path.moves[0].source_line == 4);
}

}  // namespace cuspmap

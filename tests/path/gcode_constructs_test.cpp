// Tests of the RS-274 constructs real controllers and posts write (issue 16), each against a path
// computed by hand: modal motion without axis words, safe-start lines, codes read past, arcs in
// G18/G19, helices and full circles, G28/G53 retracts, G92 and G10 offsets, feed across G20/G21,
// dwell by X, lines after M30, block delete, canned cycles and the floor warning.
// Reference: RS274NGC v3 (Kramer, Proctor & Messina, NIST IR 6556, 2000), sections beside checks.
#include <cmath>
#include <numbers>
#include <string>

#include "core/input_error.h"
#include "path/gcode_interpreter.h"
#include "path/gcode_reader.h"
#include "path/gcode_test_support.h"

namespace cuspmap {
namespace {

BuiltPath read(const std::string& text, const GcodeReadOptions& options = {}) {
  return test::read_part(text, options);
}

std::string error_of(const std::string& text) { return test::part_error(text); }

bool has_warning(const BuiltPath& b, const std::string& text) {
  for (const PathWarning& w : b.warnings) {
    if (w.message == text) return true;
  }
  return false;
}

}  // namespace

TEST_CASE("read_gcode_text: modal motion with no axis words and safe-start lines", "[path]") {
  // RS274NGC v3 §3.3.7: a motion mode runs again only when axis words are on the line, so
  // "G1 F300" and "G00 S10000" move nothing. The safe-start line puts G80 beside G00: G80 is
  // dropped and G0 stands (issue 16).
  const BuiltPath b = read(
      "G00 G17 G40 G49 G80 G90\n"
      "G90 G17 G40 G80 G00 G21\n"
      "G00 S10000 M3\n"
      "X0 Y0 Z1\n"
      "G1 F300\n"
      "Z0\n"
      "X10\n");
  REQUIRE(b.path.moves.size() == 2);
  CHECK(b.path.moves[0].feed_mm_per_min == 300.0);
  CHECK(b.path.moves[1].end_mm == Eigen::Vector3d(10, 0, 0));
  CHECK(error_of("G80 G1 G0 X1\n") ==
        "part.nc:1: 'G0': two codes of one modal group on one line ('G1' and 'G0'); RS274NGC "
        "allows one");
}

TEST_CASE("read_gcode_text: arcs in G18 and G19 become chords on the true circle", "[path]") {
  // RS274NGC v3 §3.5.3: G18 arcs lie in Z-X with I, K for the centre, G19 in Y-Z with J, K; G2
  // is clockwise seen from the positive end of the third axis. Derived: from X0 to X10 about
  // X5 clockwise seen from +Y (Z to the right, X up) the tool passes Z = -5.
  const std::string start = "G21 G90 M3 S10000\nG0 X0 Y0 Z0\n";
  for (const char* prog : {"G18 G2 X10 Z0 I5 K0 F100\n", "G19 G3 Y10 Z0 J5 F100\n"}) {
    CAPTURE(prog);
    const BuiltPath b = read(start + prog);
    const bool xz = std::string(prog).find("G18") != std::string::npos;
    REQUIRE(b.path.moves.size() > 10);
    double lowest = 0.0;
    for (const Move& m : b.path.moves) {
      CHECK(m.kind == MoveKind::Line);
      const Eigen::Vector3d c = xz ? Eigen::Vector3d(5, 0, 0) : Eigen::Vector3d(0, 5, 0);
      REQUIRE_NEAR((m.end_mm - c).norm(), 5.0, 1e-9);  // every chord end on the circle
      lowest = std::min(lowest, m.end_mm.z());
    }
    // Half circle of radius 5: length 5 pi; chords within kPlaneArcChordToleranceMm of the arc.
    REQUIRE_NEAR(path_length_mm(b.path, false), 5.0 * std::numbers::pi, 0.001);
    REQUIRE_NEAR(lowest, -5.0, kPlaneArcChordToleranceMm);
    CHECK(b.path.moves.back().end_mm == (xz ? Eigen::Vector3d(10, 0, 0) : Eigen::Vector3d(0, 10, 0)));
  }
}

TEST_CASE("read_gcode_text: full circles by I/J alone and helices", "[path]") {
  // Derived: G2 with I5 only and Z-1 is one turn of radius 5 about (5, 0) descending 1 mm:
  // length sqrt((2 pi 5)^2 + 1).
  const BuiltPath b = read("G21 G90 M3 S10000\nG0 X0 Y0 Z0\nG17 G2 I5 Z-1 F100\nG3 J-2\n");
  REQUIRE(b.path.moves.size() == 2);
  const Move& h = b.path.moves[0];
  CHECK(h.kind == MoveKind::Arc);
  CHECK(h.centre_mm == Eigen::Vector2d(5, 0));
  CHECK(h.end_mm == Eigen::Vector3d(0, 0, -1));
  REQUIRE_NEAR(move_length_mm(h), std::sqrt(std::pow(10 * std::numbers::pi, 2) + 1), 1e-9);
  REQUIRE_NEAR(move_length_mm(b.path.moves[1]), 4 * std::numbers::pi, 1e-9);
  CHECK(b.path.moves[1].centre_mm == Eigen::Vector2d(0, -2));
}

TEST_CASE("read_gcode_text: codes that move nothing are read past, one warning per code", "[path]") {
  const BuiltPath b = read(
      "G21 G90 M3 S10000 (MSG, roughing done)\nM8\nM62 P1\nM19\nM100\nM8\nG0 X0 Y0 Z1\nG1 Z0 "
      "F100\nM9\nM50 P0\n");
  REQUIRE(b.path.moves.size() == 1);
  CHECK(has_warning(b, "program messages (MSG, DEBUG, PRINT) read past"));
  CHECK(has_warning(b, "M8 read past (coolant): it moves nothing"));
  CHECK(has_warning(b, "M62 read past (digital/analog output or input wait): it moves nothing"));
  CHECK(has_warning(b, "M19 read past (spindle orient): it moves nothing"));
  CHECK(has_warning(b, "M100 read past (user M-code): it moves nothing"));
  // issue_16: an override switch with its P word (M50 P0: feed override off) is read past too.
  CHECK(has_warning(b, "M50 read past (feed/speed override switch; programmed feeds are used): "
                       "it moves nothing"));
  CHECK(b.warnings.size() == 7);  // the second M8 adds nothing
  // issue_16: a message on a line of its own (the usual form) warns too, with its line.
  const BuiltPath own = read("G21 G90 M3 S10000\n(MSG, finish pass next)\nG0 X0 Y0 Z1\nG1 Z0 F100\n");
  REQUIRE(own.warnings.size() == 1);
  CHECK(own.warnings[0].line == 2);
  CHECK(own.warnings[0].message == "program messages (MSG, DEBUG, PRINT) read past");
}

TEST_CASE("read_gcode_text: G28, G30 and G53 read as retracts", "[path]") {
  // RS274NGC v3 §3.5.8: G28 moves through the intermediate point given by the axis words, then
  // home; the machine's home is unknown, so the axes sent home are unknown (issue 16).
  const BuiltPath b = read(
      "G21 G90 M3 S10000\nG0 X0 Y0 Z1\nG1 Z0 F100\nX10\nG91 G28 Z5\nG28 X0 Y0\nG90 G0 X2 Y2\n"
      "G0 Z1\nG1 Z0\nG53 G0 Z0\n");
  // Derived: plunge, X10, the intermediate retract to Z5 (rapid), then X/Y/Z unknown until
  // "G0 Z1" sets the last axis: the plunge from (2, 2, 1).
  REQUIRE(b.path.moves.size() == 4);
  CHECK(b.path.moves[2].rapid);
  CHECK(b.path.moves[2].end_mm == Eigen::Vector3d(10, 0, 5));
  CHECK(b.path.moves[3].start_mm == Eigen::Vector3d(2, 2, 1));
  CHECK(has_warning(b, "G28 (return to home) read as a retract: the machine's home is not in the "
                       "program, so axes sent home are unknown until the next absolute move"));
  CHECK(has_warning(b, "G53 (machine coordinates) read as a retract: machine positions are not "
                       "in the program, so axes it moves are unknown until the next absolute "
                       "move"));
  // 6 mm ball: reach 3 mm above floor_z 0; at Z0 an XY home move would drag across the floor.
  CHECK(error_of("G21 G90 G0 X0 Y0 Z0\nG28 X5\n") ==
        "part.nc:2: 'G28': the intermediate point moves X/Y or down with the tool within its "
        "reach of the floor; retract Z first");
  CHECK(error_of("G21 G90 G0 X0 Y0 Z1\nG53 G0 X0\n") ==
        "part.nc:2: 'G53': moves X/Y in machine coordinates with the tool within its reach of "
        "the floor; retract Z first");
}

TEST_CASE("read_gcode_text: G92 and G10 L2/L20 offsets move the program's origin", "[path]") {
  // RS274NGC v3 §3.5.18: G92 makes the current point read the given coordinates.
  const BuiltPath g92 = read("G21 G90 G0 X10 Y10 Z5\nG92 X0 Y0\nG0 X5\nG92.1\nG0 X5\n");
  REQUIRE(g92.path.moves.size() == 2);
  CHECK(g92.path.moves[0].end_mm == Eigen::Vector3d(15, 10, 5));
  CHECK(g92.path.moves[1].end_mm == Eigen::Vector3d(5, 10, 5));  // G92.1 clears the offset
  // RS274NGC v3 §3.5.5: G10 L2 P2 sets G55's origin; G55 X0 is then 100 mm from G54's X0.
  const BuiltPath l2 = read(
      "G21 G10 L2 P1 X0 Y0 Z0\nG10 L2 P2 X100 Y0 Z0\nG54 G90 G0 X0 Y0 Z5\nG55 G0 X1\n");
  REQUIRE(l2.path.moves.size() == 1);
  CHECK(l2.path.moves[0].end_mm == Eigen::Vector3d(101, 0, 5));
  // G10 L20: the current point (X10 Y0 Z5) is X0 Y0 Z5 in G55, so G55 X1 is X11 of the first
  // system. An axis whose G55 offset the program never sets stays unknown (refused).
  const BuiltPath l20 = read("G21 G90 G0 X10 Y0 Z5\nG10 L20 P2 X0 Y0 Z5\nG55 G0 X1\n");
  REQUIRE(l20.path.moves.size() == 1);
  CHECK(l20.path.moves[0].end_mm == Eigen::Vector3d(11, 0, 5));
  CHECK(error_of("G21 G90 G0 X10 Y0 Z5\nG10 L20 P2 X0\nG55 G0 X1\n") ==
        "part.nc:3: 'G55': the program switches work coordinate systems ('G54' before) and their "
        "offsets are not set in the program (G10 L2): cuspmap reads one system per program "
        "otherwise");
}

TEST_CASE("read_gcode_text: dwell by X or P, lines after M30, block delete", "[path]") {
  // G4 X1.5 is a dwell in seconds as industrial controls write it: X is not an axis word there.
  const std::string prog =
      "G21 G90 M3 S10000\nG0 X0 Y0 Z1\nG1 Z0 F100\nG04 X1.5\n/G1 X5\nX2\nM30\nG1 X7\n(end)\nY3\n";
  const BuiltPath on = read(prog);
  REQUIRE(on.path.moves.size() == 2);
  CHECK(on.path.moves[1].end_mm == Eigen::Vector3d(2, 0, 0));
  CHECK(has_warning(on, "2 lines after M30 on line 7 are not run (RS274NGC v3 section 3.6.1)"));
  CHECK(has_warning(on, "1 block-delete line ('/') skipped: block delete is on (--block-delete "
                        "off runs them)"));
  GcodeReadOptions off;
  off.block_delete = false;
  const BuiltPath run = read(prog, off);
  REQUIRE(run.path.moves.size() == 3);
  CHECK(run.path.moves[1].end_mm == Eigen::Vector3d(5, 0, 0));
  CHECK(has_warning(run, "1 block-delete line ('/') run: block delete is off"));
}

TEST_CASE("read_gcode_text: canned cycles are plunges with their retracts", "[path]") {
  // RS274NGC v3 §3.5.16: rapid to the hole, rapid to R, feed to Z, retract to the starting Z
  // (G98) or to R (G99); in G91, R is measured from the starting Z and Z from R; L repeats.
  const BuiltPath g98 = read("G21 G90 M3 S10000\nG0 X0 Y0 Z10\nG98 G81 X5 Y5 Z-2 R1 F100\nX10\nG80\n");
  REQUIRE(g98.path.moves.size() == 8);
  CHECK(g98.path.moves[2].end_mm == Eigen::Vector3d(5, 5, -2));
  CHECK_FALSE(g98.path.moves[2].rapid);
  CHECK(g98.path.moves[3].end_mm == Eigen::Vector3d(5, 5, 10));
  CHECK(g98.path.moves[4].end_mm == Eigen::Vector3d(10, 5, 10));
  REQUIRE_NEAR(path_length_mm(g98.path, false), 2 * 3.0, 1e-12);  // two 3 mm plunges
  const BuiltPath g99 = read("G21 G90 M3 S10000\nG0 X0 Y0 Z10\nG91 G99 G81 X2 Z-3 R-9 L3 F100\n");
  // Derived: R = 10 - 9 = 1, bottom = 1 - 3 = -2; holes at X2, X4, X6; retract to R, so the
  // later holes need no rapid down to R (4 + 3 + 3 moves).
  REQUIRE(g99.path.moves.size() == 10);
  CHECK(g99.path.moves[2].end_mm == Eigen::Vector3d(2, 0, -2));
  CHECK(g99.path.moves[3].end_mm == Eigen::Vector3d(2, 0, 1));
  CHECK(g99.path.moves[4].end_mm == Eigen::Vector3d(4, 0, 1));
  CHECK(g99.path.moves[8].end_mm == Eigen::Vector3d(6, 0, -2));
  CHECK(error_of("G21 G90 G0 X0 Y0 Z10\nG81 X1 Y1 R1 F100\n") ==
        "part.nc:2: 'G81': a canned cycle needs its bottom Z (Z word)");
}

TEST_CASE("read_gcode_text: a program cutting below floor_z warns with the floor it implies", "[path]") {
  // issue_16: 0.1 in = 2.54 mm below floor_z 0 ran silently before.
  const BuiltPath b = read("G20 G90 M3 S10000\nG0 X0 Y0 Z0.1\nG1 Z-0.1 F10\nX1\nG0 Z1\n");
  REQUIRE(!b.warnings.empty());
  CHECK(b.warnings.back().line == 3);
  CHECK(b.warnings.back().message ==
        "the program cuts down to Z=-2.54 mm, 2.54 mm below floor_z 0: its lowest feed moves "
        "imply floor_z = -2.54");
  for (const PathWarning& w : read("G21 G90 M3 S10000\nG0 X0 Y0 Z1\nG1 Z0 F10\nX1\n").warnings) {
    CHECK(w.message.find("below floor_z") == std::string::npos);  // on the floor: no warning
  }
}

}  // namespace cuspmap

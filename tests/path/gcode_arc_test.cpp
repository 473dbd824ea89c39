// Tests of G2/G3 arcs read from G-code: centre (I/J) and radius (R) forms of the same arc agree,
// the R sign rule, full circles, helices, P turns, G90.1 absolute centres, and the end-point
// tolerance of the centre format.
// Source: NIST RS274NGC interpreter version 3 (Kramer, Proctor & Messina, NIST IR 6556, 2000),
// §3.5.3.1 Radius Format Arc and §3.5.3.2 Center Format Arc (clauses checked against the text).
#include "path/gcode_arc.h"

#include <numbers>
#include <string>

#include "core/input_error.h"
#include "path/gcode_reader.h"
#include "path/path_test_geometry.h"
#include "test_support.h"

namespace cuspmap {
namespace {

Move one_arc(const std::string& text) {
  const BuiltPath b = read_gcode_text("G21 G90 G17\nG0 X0 Y0 Z0\n" + text, "part.nc", CutSpec{},
                                      test::test_patch(), test::test_ball());
  REQUIRE(b.path.moves.size() == 1);
  REQUIRE(b.path.moves[0].kind == MoveKind::Arc);
  return b.path.moves[0];
}

std::string error_of(const std::string& text) {
  return test::input_error_of(
      [&] { read_gcode_text(text, "part.nc", CutSpec{}, test::test_patch(), test::test_ball()); });
}

void require_centre(const Move& m, double x, double y) {
  REQUIRE_NEAR(m.centre_mm.x(), x, 1e-12);
  REQUIRE_NEAR(m.centre_mm.y(), y, 1e-12);
}

}  // namespace

TEST_CASE("read_gcode_text: I/J and R forms of the same arc give the same centre", "[path]") {
  // Start (0,0), end (8,-4): both (3,-4) and (5,0) are 5 mm from each end (3-4-5 triangles).
  // §3.5.3.1: "A positive radius indicates that the arc turns through 180 degrees or less, while
  // a negative radius indicates a turn of 180 degrees to 359.999 degrees."
  const Move g2_ij = one_arc("G2 X8 Y-4 I3 J-4 F100\n");
  const Move g2_r = one_arc("G2 X8 Y-4 R5 F100\n");
  require_centre(g2_ij, 3, -4);
  require_centre(g2_r, 3, -4);
  CHECK_FALSE(g2_r.ccw);
  // Same short clockwise sweep: from 126.87 deg down to 0 deg.
  REQUIRE_NEAR(arc_sweep_rad(g2_ij), -std::atan2(4.0, -3.0), 1e-12);
  REQUIRE_NEAR(arc_sweep_rad(g2_r), arc_sweep_rad(g2_ij), 1e-12);
  // G3 with R > 0 takes the other centre (short ccw arc); I/J of that centre agree.
  const Move g3_r = one_arc("G3 X8 Y-4 R5 F100\n");
  require_centre(g3_r, 5, 0);
  require_centre(one_arc("G3 X8 Y-4 I5 J0 F100\n"), 5, 0);
  CHECK(g3_r.ccw);
  CHECK(arc_sweep_rad(g3_r) > 0.0);
  CHECK(arc_sweep_rad(g3_r) <= std::numbers::pi);
}

TEST_CASE("read_gcode_text: a negative R turns more than 180 degrees", "[path]") {
  // §3.5.3.1 sign rule: G2 with R-5 is the long clockwise arc about (5,0), 233.13 deg.
  const Move m = one_arc("G2 X8 Y-4 R-5 F100\n");
  require_centre(m, 5, 0);
  const double expected = -(std::numbers::pi + std::atan2(4.0, 3.0));  // 180 + 53.13 deg, cw
  REQUIRE_NEAR(arc_sweep_rad(m), expected, 1e-12);
  CHECK(std::abs(arc_sweep_rad(m)) > std::numbers::pi);
  const Move n = one_arc("G3 X8 Y-4 R-5 F100\n");
  require_centre(n, 3, -4);
  CHECK(arc_sweep_rad(n) > std::numbers::pi);
}

TEST_CASE("read_gcode_text: a centre-format arc ending at its start is a full circle", "[path]") {
  // §3.5.3.2: "In this format, it is OK if the end point of the arc is the same as the current
  // point."; §3.5.3.1: for the radius format that is an error.
  const Move m = one_arc("G2 X0 Y0 I5 J0 F100\n");
  require_centre(m, 5, 0);
  REQUIRE_NEAR(arc_sweep_rad(m), -2.0 * std::numbers::pi, 1e-12);
  REQUIRE_NEAR(move_length_mm(m), 10.0 * std::numbers::pi, 1e-12);
  CHECK(error_of("G21 G90 G0 X0 Y0 Z0\nG2 X0 Y0 R5 F100\n") ==
        "part.nc:2: 'R5': an R-form arc cannot end where it starts; program a full circle with I/J");
}

TEST_CASE("read_gcode_text: helix, P turns and absolute centres (G90.1)", "[path]") {
  const Move helix = one_arc("G3 X10 Y0 Z-1 I5 J0 F100\n");
  REQUIRE_NEAR(helix.end_mm.z(), -1.0, 1e-12);
  REQUIRE_NEAR(move_length_mm(helix), std::hypot(5.0 * std::numbers::pi, 1.0), 1e-12);
  // P: number of turns, common controls' extension (RS274NGC v3 has no P on G2/G3).
  const Move turns = one_arc("G3 X0 Y0 I5 P3 F100\n");
  CHECK(turns.extra_turns == 2);
  REQUIRE_NEAR(arc_sweep_rad(turns), 6.0 * std::numbers::pi, 1e-12);
  const BuiltPath b = read_gcode_text(
      "G21 G90 G0 X2 Y3 Z0\nG91.1 G2 X12 Y3 I5 J0 F100\nG90.1 G3 X2 Y3 I7 J3\n", "part.nc",
      CutSpec{}, test::test_patch(), test::test_ball());
  REQUIRE(b.path.moves.size() == 2);
  require_centre(b.path.moves[0], 7, 3);
  require_centre(b.path.moves[1], 7, 3);
  CHECK(error_of("G21 G90 G90.1 G0 X0 Y0 Z0\nG2 X10 Y0 I5 F100\n") ==
        "part.nc:2: 'G2': absolute arc centres (G90.1) need both I and J");
}

TEST_CASE("read_gcode_text: the end of an I/J arc must lie on its circle within 0.002 mm", "[path]") {
  // §3.5.3.2: an error if the distances from the centre to the current point and to the end
  // point "differ ... by more than 0.0002 inch (if inches are being used) or 0.002 millimeter".
  CHECK(one_arc("G2 X10.0015 Y0 I5 J0 F100\n").kind == MoveKind::Arc);
  CHECK(error_of("G21 G90 G0 X0 Y0 Z0\nG2 X10.01 Y0 I5 J0 F100\n") ==
        "part.nc:2: 'G2': end point is not on the arc: radius 5 mm at the start, 5.01 mm at the "
        "end; RS274NGC v3 allows 0.002 mm difference");
  // Inches: 0.0002 in = 0.00508 mm, so 0.00015 in passes and 0.0003 in fails.
  CHECK(error_of("G20 G90 G0 X0 Y0 Z0\nG2 X0.50015 Y0 I0.25 F10\n") == "(no error)");
  CHECK(error_of("G20 G90 G0 X0 Y0 Z0\nG2 X0.5003 Y0 I0.25 F10\n") ==
        "part.nc:2: 'G2': end point is not on the arc: radius 6.35 mm at the start, 6.35762 mm "
        "at the end; RS274NGC v3 allows 0.0002 in difference");
}

TEST_CASE("read_gcode_text: an R smaller than half the chord cannot reach the end", "[path]") {
  CHECK(error_of("G21 G90 G0 X0 Y0 Z0\nG2 X10 Y0 R4 F100\n") ==
        "part.nc:2: 'R4': radius 4 mm is smaller than half the chord 5 mm: the end point cannot "
        "be reached");
  // Within the 0.002 mm tolerance the arc is taken as the semicircle (documented in gcode_arc.h).
  const Move semi = one_arc("G2 X10 Y0 R4.999 F100\n");
  require_centre(semi, 5, 0);
}

TEST_CASE("arc_centre_from_radius: centre side follows direction and sign", "[path]") {
  // Plane geometry: the centre lies on the chord's perpendicular bisector at sqrt(R^2 - h^2).
  const Eigen::Vector2d a(0, 0), b(2, 0);
  const double d = std::sqrt(4.0 - 1.0);
  struct Case { double r; bool ccw; double y; };
  for (const Case c : {Case{2, false, -d}, Case{-2, false, d}, Case{2, true, d}, Case{-2, true, -d}}) {
    CAPTURE(c.r, c.ccw);
    const ArcCentre out = arc_centre_from_radius(a, b, c.r, c.ccw, kArcEndToleranceMm);
    REQUIRE(out.status == ArcCentreStatus::Ok);
    REQUIRE_NEAR(out.centre_mm.x(), 1.0, 1e-12);
    REQUIRE_NEAR(out.centre_mm.y(), c.y, 1e-12);
  }
  CHECK(arc_centre_from_offsets(a, b, a, kArcEndToleranceMm).status == ArcCentreStatus::ZeroRadius);
}

}  // namespace cuspmap

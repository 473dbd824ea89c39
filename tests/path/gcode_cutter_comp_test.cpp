// Tests of cutter radius compensation G41/G42/G40 in the RS-274 reader, each against a tool-centre
// path computed by hand (end points, arc centres and radii, lengths): the straight and arc entry
// moves, offset lines and arcs, arcs around outside corners, inside corners cut where the offset
// moves meet, moves without X/Y motion, D from the tool or a D-word table, D changes while on,
// the exit, and the refusals.
// Reference: RS274NGC v3 (Kramer, Proctor & Messina, NIST IR 6556, 2000) §3.5.10 and its chapter
// on cutter radius compensation; inside corners "derived" (intersection of the offset moves).
#include <cmath>
#include <numbers>
#include <string>

#include "path/gcode_cutter_comp.h"
#include "path/gcode_reader.h"
#include "path/gcode_test_support.h"

namespace cuspmap {
namespace {

constexpr double kPi = std::numbers::pi;
// The test ball is 6 mm: r = 3 mm unless a D-word table says otherwise.
const std::string kStart = "G21 G90 G17 M3 S10000 F500\n";

BuiltPath read(const std::string& text, const GcodeReadOptions& options = {}) {
  return test::read_part(text, options);
}

std::string error_of(const std::string& text, const GcodeReadOptions& options = {}) {
  return test::input_error_of([&] { test::read_part(text, options); });
}

Eigen::Vector2d xy(const Eigen::Vector3d& p) { return p.head<2>(); }

void check_line(const Move& m, Eigen::Vector2d a, Eigen::Vector2d b) {
  CAPTURE(m.source_line);
  CHECK(m.kind == MoveKind::Line);
  REQUIRE_NEAR((xy(m.start_mm) - a).norm(), 0.0, 1e-9);
  REQUIRE_NEAR((xy(m.end_mm) - b).norm(), 0.0, 1e-9);
}

void check_arc(const Move& m, Eigen::Vector2d centre, double radius, double sweep_rad) {
  CAPTURE(m.source_line);
  CHECK(m.kind == MoveKind::Arc);
  REQUIRE_NEAR((m.centre_mm - centre).norm(), 0.0, 1e-9);
  REQUIRE_NEAR(arc_radius_mm(m), radius, 1e-9);
  REQUIRE_NEAR(arc_sweep_rad(m), sweep_rad, 1e-9);
}

}  // namespace

TEST_CASE("cutter comp: the straight entry move ends one radius off, square to its end", "[path]") {
  // RS274NGC v3 compensation chapter, first move a straight line: the tool runs along the
  // tangent from where it stands to the circle of the tool radius about the programmed end, and
  // stops where that tangent touches it. From T (0,-10) to P (0,0) with r = 3 on the left
  // (G41), derived: |E - T| = sqrt(10^2 - 3^2) = sqrt(91), E = (-3 sqrt(0.91), -0.9). The G40
  // move after it has no exit move: it runs from E straight to (0,-10), sqrt(91) again.
  const BuiltPath b = read(kStart + "G0 X0 Y-10 Z1\nG1 Z-1\nG41 G1 X0 Y0\nG40 G1 X0 Y-10\n");
  REQUIRE(b.path.moves.size() == 3);  // the first G0 starts from an unknown place: no move
  const Move& entry = b.path.moves[1];
  const Eigen::Vector2d e(-3.0 * std::sqrt(0.91), -0.9);
  check_line(entry, {0, -10}, e);
  REQUIRE_NEAR(move_length_mm(entry), std::sqrt(91.0), 1e-9);
  REQUIRE_NEAR(xy(entry.end_mm).norm(), 3.0, 1e-9);                        // one radius off P
  REQUIRE_NEAR(xy(entry.end_mm).dot(xy(entry.end_mm - entry.start_mm)), 0.0, 1e-9);  // square
  CHECK(entry.end_mm.z() == -1.0);
  check_line(b.path.moves[2], e, {0, -10});
  REQUIRE_NEAR(path_length_mm(b.path, false), 2.0 + 2.0 * std::sqrt(91.0), 1e-9);
  // G42 mirrors it about the Y axis.
  const BuiltPath r = read(kStart + "G0 X0 Y-10 Z1\nG1 Z-1\nG42 G1 X0 Y0\nG40\n");
  check_line(r.path.moves[1], {0, -10}, {3.0 * std::sqrt(0.91), -0.9});
}

TEST_CASE("cutter comp: outside corners get an arc of the tool radius about the corner", "[path]") {
  // RS274NGC v3: "If a convex corner is on the path, an arc is inserted to go around the
  // corner"; its radius is the tool radius. A 20 mm square run clockwise with G41 keeps the
  // 3 mm tool outside. Derived: entry (-3,-10) -> (-3,0) (E - P = (-3,0) is square to the
  // entry), sides at 3 mm, quarter arcs about (0,20), (20,20), (20,0). Feed length: plunge 2 +
  // entry 10 + 4 x 20 + 3 x (3 pi / 2).
  const BuiltPath b = read(kStart +
                           "G0 X-3 Y-10 Z1\nG1 Z-1\nG41 G1 X0 Y0\nY20\nX20\nY0\nX0\nG40 G0 Z5\n");
  REQUIRE(b.path.moves.size() == 10);
  const auto& m = b.path.moves;
  check_line(m[1], {-3, -10}, {-3, 0});
  check_line(m[2], {-3, 0}, {-3, 20});
  check_arc(m[3], {0, 20}, 3.0, -kPi / 2);
  check_line(m[4], {0, 23}, {20, 23});
  check_arc(m[5], {20, 20}, 3.0, -kPi / 2);
  check_line(m[6], {23, 20}, {23, 0});
  check_arc(m[7], {20, 0}, 3.0, -kPi / 2);
  check_line(m[8], {20, -3}, {0, -3});
  CHECK(m[3].source_line == 6);  // the corner arc runs with the move after the corner
  CHECK(m[9].rapid);
  CHECK(m[9].end_mm == Eigen::Vector3d(0, -3, 5));  // G40: no exit move
  REQUIRE_NEAR(path_length_mm(b.path, false), 92.0 + 4.5 * kPi, 1e-9);
}

TEST_CASE("cutter comp: inside corners are cut where the offset moves meet", "[path]") {
  // A 30 x 20 mm pocket run counter-clockwise with G41 keeps the tool inside; derived: the
  // offset lines at 3 mm meet at (27,3), (27,17), (3,17), (3,3), so the tool centre runs the
  // 24 x 14 mm rectangle. Feed length: plunge 2 + entry 5 + 12 + 14 + 24 + 14 + 12 + exit 7.
  const BuiltPath b = read(kStart +
                           "G0 X10 Y3 Z1\nG1 Z-1\nG41 G1 X15 Y0\nX30\nY20\nX0\nY0\nX15\n"
                           "G40 G1 X15 Y10\n");
  REQUIRE(b.path.moves.size() == 8);
  const auto& m = b.path.moves;
  check_line(m[1], {10, 3}, {15, 3});
  check_line(m[2], {15, 3}, {27, 3});
  check_line(m[3], {27, 3}, {27, 17});
  check_line(m[4], {27, 17}, {3, 17});
  check_line(m[5], {3, 17}, {3, 3});
  check_line(m[6], {3, 3}, {15, 3});
  check_line(m[7], {15, 3}, {15, 10});
  REQUIRE_NEAR(path_length_mm(b.path, false), 90.0, 1e-9);
  // A Z move at the corner waits for the corner: it runs at the trimmed point (27,3).
  const BuiltPath z = read(kStart + "G0 X10 Y3 Z1\nG1 Z-1\nG41 G1 X15 Y0\nX30\nZ-2\nY20\nG40\n");
  REQUIRE(z.path.moves.size() == 5);
  check_line(z.path.moves[2], {15, 3}, {27, 3});
  CHECK(z.path.moves[3].start_mm == Eigen::Vector3d(27, 3, -1));
  CHECK(z.path.moves[3].end_mm == Eigen::Vector3d(27, 3, -2));
  CHECK(z.path.moves[4].start_mm == Eigen::Vector3d(27, 3, -2));
  REQUIRE_NEAR((z.path.moves[4].end_mm - Eigen::Vector3d(27, 20, -2)).norm(), 0.0, 1e-9);
}

TEST_CASE("cutter comp: arcs keep their centre, radius minus or plus the tool radius", "[path]") {
  // Derived: a pocket with 5 mm corner radii run ccw with G41: the tool (r = 3) runs inside each
  // corner arc on radius 5 - 3 = 2 about the same centre; the joins stay tangent. Feed length:
  // plunge 2 + entry 5 + 10 + 10 + 20 + 10 + 10 + 4 quarter circles of radius 2 + exit 7.
  const BuiltPath b = read(kStart +
                           "G0 X10 Y3 Z1\nG1 Z-1\nG41 G1 X15 Y0\nX25\nG3 X30 Y5 I0 J5\n"
                           "G1 Y15\nG3 X25 Y20 I-5 J0\nG1 X5\nG3 X0 Y15 I0 J-5\nG1 Y5\n"
                           "G3 X5 Y0 I5 J0\nG1 X15\nG40 G1 X15 Y10\n");
  REQUIRE(b.path.moves.size() == 12);
  const auto& m = b.path.moves;
  check_line(m[2], {15, 3}, {25, 3});
  check_arc(m[3], {25, 5}, 2.0, kPi / 2);
  check_line(m[4], {27, 5}, {27, 15});
  check_arc(m[5], {25, 15}, 2.0, kPi / 2);
  check_arc(m[9], {5, 5}, 2.0, kPi / 2);
  check_line(m[10], {5, 3}, {15, 3});
  REQUIRE_NEAR(path_length_mm(b.path, false), 74.0 + 4.0 * kPi, 1e-9);
  // G42 on a ccw circle runs outside it: a full turn of radius 10 + 3 = 13 (P2: two turns).
  const BuiltPath c = read(kStart + "G0 X13 Y-10 Z1\nG1 Z-1\nG42 G1 X10 Y0\nG3 I-10 P2\n"
                                    "G40 G1 X20\n");
  REQUIRE(c.path.moves.size() == 4);
  check_line(c.path.moves[1], {13, -10}, {13, 0});
  check_arc(c.path.moves[2], {0, 0}, 13.0, 4.0 * kPi);
  check_line(c.path.moves[3], {13, 0}, {20, 0});
  REQUIRE_NEAR(path_length_mm(c.path, false), 2.0 + 10.0 + 52.0 * kPi + 7.0, 1e-9);
}

TEST_CASE("cutter comp: an arc as the entry move keeps the programmed centre", "[path]") {
  // RS274NGC v3, first move an arc: an auxiliary arc about the programmed centre through the
  // programmed end, tangent to the tool where it stands; the tool stays tangent to it. Tool at
  // (13,0), centre (0,0), end (-10,0), G42 ccw: derived, the tool runs radius 13 to (-13,0).
  const BuiltPath b = read(kStart + "G0 X13 Y0 Z1\nG1 Z-1\nG42 G3 X-10 Y0 I-13 J0\nG40 G1 X-20\n");
  REQUIRE(b.path.moves.size() == 3);
  check_arc(b.path.moves[1], {0, 0}, 13.0, kPi);
  check_line(b.path.moves[2], {-13, 0}, {-20, 0});
  CHECK(error_of(kStart + "G0 X13 Y0 Z1\nG1 Z-1\nG42 G3 X-10 Y0 I-12 J0\n") ==
        "part.nc:4: 'G3': the first move after G42 is an arc whose start lies 12 mm from its "
        "centre; entering on the arc needs 14 mm (the programmed radius 11 mm + the tool radius); "
        "enter with a straight move");
  CHECK(error_of(kStart + "G0 X13 Y0 Z1\nG42 G3 X-10 Y0 R10\n") ==
        "part.nc:3: 'R10': an R-form arc cannot be the first move after G41/G42: give its centre "
        "with I/J or enter with a straight move");
}

TEST_CASE("cutter comp: D from a D-word table, and D changes while on", "[path]") {
  GcodeReadOptions options;
  options.d_radius_mm = {{1, 3.0}, {2, 2.0}};
  // Derived: the square of the convex-corner case with D2 (r = 2): corner arcs of radius 2.
  const BuiltPath b = read(kStart + "G0 X-2 Y-10 Z1\nG1 Z-1\nG41 D2 G1 X0 Y0\nY20\nX20\nG40\n",
                           options);
  REQUIRE(b.path.moves.size() == 5);
  check_line(b.path.moves[1], {-2, -10}, {-2, 0});
  check_arc(b.path.moves[3], {0, 20}, 2.0, -kPi / 2);
  check_line(b.path.moves[4], {0, 22}, {20, 22});
  // A new D while on ends the move at its own offset (no corner) and enters again: along
  // Y = 0 the tool steps from 3 mm (D1) to 2 mm (D2) off. Derived: entry (-10,3) -> (0,3);
  // (0,3) -> (20,3); re-entry from (20,3) towards (40,0) with r = 2, cut where it meets the
  // D2 offset line Y = 2; then Y = 2 to (60,2). "D1 X70" (D alone) steps back to Y = 3.
  const BuiltPath d = read(kStart + "G0 X-10 Y3 Z1\nG1 Z-1\nG41 D1 G1 X0 Y0\nX20\nG41 D2 X40\n"
                                    "X60\nD1 X70\nX90\nG40\n",
                           options);
  // D1 again at (70,0) turns away from the tool: an arc of 3 mm about (70,0), then Y = 3.
  REQUIRE(d.path.moves.size() == 8);
  check_line(d.path.moves[1], {-10, 3}, {0, 3});
  check_line(d.path.moves[2], {0, 3}, {20, 3});
  CHECK(d.path.moves[3].start_mm == Eigen::Vector3d(20, 3, -1));
  REQUIRE_NEAR(d.path.moves[3].end_mm.y(), 2.0, 1e-9);
  REQUIRE_NEAR(d.path.moves[4].end_mm.y(), 2.0, 1e-9);
  CHECK(d.path.moves[4].end_mm.x() == 60.0);
  check_arc(d.path.moves[6], {70, 0}, 3.0, arc_sweep_rad(d.path.moves[6]));
  check_line(d.path.moves[7], {70, 3}, {90, 3});
  for (const PathWarning& w : d.warnings) {  // the table gives every D: no D warning
    CHECK(w.message.find("read as the job's tool radius") == std::string::npos);
  }
  // No table: D3 is the job's tool radius, with one warning.
  const BuiltPath w = read(kStart + "G0 X-3 Y-10 Z1\nG41 D3 G1 X0 Y0\nG40\n");
  REQUIRE(w.warnings.size() == 1);
  CHECK(w.warnings[0].message ==
        "D3 read as the job's tool radius 3 mm (no D-word table: [path] d_radius or --d-radius "
        "gives other radii)");
  CHECK(error_of(kStart + "G0 X-3 Y-10 Z1\nG41 D7 G1 X0 Y0\n", options) ==
        "part.nc:3: 'D7': D7 is not in the D-word table (D1, D2): add it to [path] d_radius (or "
        "--d-radius)");
}

TEST_CASE("issue_16: the side-wall fixture posted with compensation on is read", "[path]") {
  // tests/data/gcode/cutter_comp.nc: T (-5,-5), G41 D3 to (0,0) with r = 3 (no table: the tool
  // radius), then X40. Derived: the entry ends at E with |E| = 3 and E square to the entry; the
  // turn to +X is to the right, away from the tool: an arc about (0,0) from E to (0,3), then the
  // line Y = 3 to (40,3); G40 G0 Z5 rises there.
  const BuiltPath b = read_gcode_file(test::data_path("gcode/cutter_comp.nc"), CutSpec{},
                                      test::test_patch(), test::test_ball());
  REQUIRE(b.path.moves.size() == 4);
  const Move& entry = b.path.moves[0];
  REQUIRE_NEAR(move_length_mm(entry), std::sqrt(50.0 - 9.0 + 36.0), 1e-9);  // Z falls 6 mm too
  REQUIRE_NEAR(xy(entry.end_mm).norm(), 3.0, 1e-9);
  check_arc(b.path.moves[1], {0, 0}, 3.0, arc_sweep_rad(b.path.moves[1]));
  CHECK(arc_sweep_rad(b.path.moves[1]) < 0.0);  // clockwise around the corner (G41)
  check_line(b.path.moves[2], {0, 3}, {40, 3});
  CHECK(b.path.moves[3].end_mm == Eigen::Vector3d(40, 3, 5));
}

}  // namespace cuspmap

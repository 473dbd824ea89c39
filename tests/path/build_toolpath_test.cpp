// Tests of build_toolpath's dispatch (G-code file, offset, spiral, trochoidal) and of the
// hand-written example program examples/bracket_pocket_floor.nc.
#include "path/build_toolpath.h"

#include "path/gcode_reader.h"
#include "path/patch_from_extent.h"
#include "path/path_test_geometry.h"
#include "test_support.h"

namespace cuspmap {

TEST_CASE("build_toolpath: G-code jobs read the file, with its spindle direction", "[path]") {
  test::TempDir dir;
  test::write_text(dir.file("p.nc"), "G21 G90 M4 S10000\nG0 X0 Y0 Z0\nG1 X5 F200\n");
  PathSpec spec;
  spec.kind = PathKind::Gcode;
  spec.file = dir.file("p.nc");
  const BuiltPath b = build_toolpath(spec, CutSpec{}, test::test_patch(), test::test_ball());
  REQUIRE(b.path.moves.size() == 1);
  CHECK(b.spindle == SpindleDirection::Ccw);
  CHECK(b.path.moves[0].source_line == 3);
}

TEST_CASE("build_toolpath: built-in strategies carry the [cut] spindle", "[path]") {
  CutSpec cut;
  cut.spindle = SpindleDirection::Ccw;
  for (const PathKind kind : {PathKind::Offset, PathKind::Spiral, PathKind::Trochoidal}) {
    PathSpec spec;
    spec.kind = kind;
    spec.stepover_mm = 1.0;
    const BuiltPath b = build_toolpath(spec, cut, test::test_patch(), test::test_ball());
    CAPTURE(static_cast<int>(kind));
    CHECK(b.path.moves.size() > 4);
    CHECK(b.spindle == SpindleDirection::Ccw);
    CHECK(b.warnings.empty());
    for (const Move& m : b.path.moves) CHECK(m.feed_mm_per_min == (m.rapid ? cut.rapid_mm_per_min : cut.feed_mm_per_min));
  }
}

TEST_CASE("read_gcode_file: the example bracket pocket program", "[path]") {
  CutSpec cut;
  cut.rpm = 9000;
  Patch pocket = test::test_patch();  // the pocket's box, as examples/bracket_pocket_gcode.toml
  pocket.origin_x_mm = pocket.origin_y_mm = 5.0;
  pocket.size_x_mm = 30.0;
  pocket.size_y_mm = 20.0;
  Cutter bull;  // as the example job: 6 mm bull-nose, 1 mm corner, 0.5 deg dish
  bull.shape = CutterShape::BullNose;
  bull.diameter_mm = 6.0;
  bull.corner_radius_mm = 1.0;
  bull.dish_deg = 0.5;
  const BuiltPath b = read_gcode_file(test::source_path("examples/bracket_pocket_floor.nc"), cut,
                                      pocket, bull);
  std::string notes;
  for (const PathWarning& w : b.warnings) notes += std::to_string(w.line) + ": " + w.message + "\n";
  CAPTURE(notes);
  CHECK(b.warnings.size() == 1);  // the M6 note
  int arcs = 0;
  for (const Move& m : b.path.moves) {
    if (m.kind != MoveKind::Arc) continue;
    ++arcs;
    // Every arc's end is on its circle (the program's centres are exact).
    REQUIRE_NEAR(arc_radius_mm(m), (m.end_mm.head<2>() - m.centre_mm).norm(), 1e-12);
    CHECK(m.ccw);
  }
  CHECK(arcs == 9);
  // Ring 0 runs 3 mm inside the pocket walls (X5..35, Y5..25): its box is the floor extent.
  const Patch p = patch_from_extent(b.path, 0.05, 0.0, 3.0);
  REQUIRE_NEAR(p.origin_x_mm, 8.0, 1e-12);
  REQUIRE_NEAR(p.origin_y_mm, 8.0, 1e-12);
  REQUIRE_NEAR(p.size_x_mm, 24.0, 1e-12);
  REQUIRE_NEAR(p.size_y_mm, 14.0, 1e-12);
}

namespace {
Move feed_line(double x0, double y0, double x1, double y1) {
  Move m;
  m.start_mm = {x0, y0, 0.0};
  m.end_mm = {x1, y1, 0.0};
  m.feed_mm_per_min = 500.0;
  return m;
}
}  // namespace

// Collinearity by distance from the line through the farthest pair (derived, see the function).
TEST_CASE("single_groove_note: one straight groove only", "[path]") {
  Toolpath one;
  Move plunge = feed_line(1.0, 1.0, 1.0, 1.0);
  plunge.start_mm.z() = 2.0;  // straight down: no spread in XY
  Move rapid = feed_line(9.0, 9.0, 1.0, 1.0);
  rapid.rapid = true;  // rapids cut nothing the note counts
  one.moves = {rapid, plunge, feed_line(1.0, 1.0, 4.0, 5.0), feed_line(4.0, 5.0, 7.0, 9.0)};
  CHECK_FALSE(single_groove_note(one).empty());

  Toolpath two = one;  // a second pass 0.5 mm to the side (off the line by 0.4 mm)
  two.moves.push_back(feed_line(1.4, 0.7, 7.4, 8.7));
  CHECK(single_groove_note(two).empty());

  Toolpath arc = one;
  arc.moves[2].kind = MoveKind::Arc;
  CHECK(single_groove_note(arc).empty());

  Toolpath only_rapids;
  only_rapids.moves = {rapid};
  CHECK(single_groove_note(only_rapids).empty());
  CHECK(single_groove_note(Toolpath{}).empty());
}

TEST_CASE("single_groove_note: a one-line program is one groove, a raster is not", "[path]") {
  test::TempDir dir;
  test::write_text(dir.file("one.nc"), "G21 G90 M3 S10000\nG0 X-4 Y2.5 Z5\nG1 Z0 F300\nG1 X9 F600\nG0 Z5\n");
  PathSpec spec;
  spec.kind = PathKind::Gcode;
  spec.file = dir.file("one.nc");
  const BuiltPath one = build_toolpath(spec, CutSpec{}, test::test_patch(), test::test_ball());
  CHECK_FALSE(single_groove_note(one.path).empty());
  spec = PathSpec{};
  spec.kind = PathKind::Raster;
  spec.stepover_mm = 0.5;
  const BuiltPath many = build_toolpath(spec, CutSpec{}, test::test_patch(), test::test_ball());
  CHECK(single_groove_note(many.path).empty());
}

}  // namespace cuspmap

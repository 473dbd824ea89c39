// Tests of the trochoidal path: loop diameter, advance per loop and lane spacing as specified,
// tangent-continuous loops, coverage of the patch by the cutter, lane linking, loop sense and
// the documented defaults and refusals.
#include "path/trochoidal_path.h"

#include <numbers>
#include <vector>

#include "core/input_error.h"
#include "path/path_test_geometry.h"
#include "test_support.h"

namespace cuspmap {
namespace {

PathSpec troch(double stepover, double loop_d, double advance, double angle_deg = 0.0,
               RasterDirection dir = RasterDirection::OneWay) {
  PathSpec spec;
  spec.kind = PathKind::Trochoidal;
  spec.stepover_mm = stepover;
  spec.loop_diameter_mm = loop_d;
  spec.advance_mm = advance;
  spec.angle_deg = angle_deg;
  spec.direction = dir;
  return spec;
}

std::vector<Move> loops_of(const Toolpath& path) {
  std::vector<Move> loops;
  for (const Move& m : path.moves) {
    if (m.kind == MoveKind::Arc) loops.push_back(m);
  }
  return loops;
}

std::string error_of(const PathSpec& spec) {
  return test::input_error_of(
      [&] { trochoidal_path(spec, CutSpec{}, test::test_patch(), test::test_ball()); });
}

}  // namespace

TEST_CASE("trochoidal_path: loop diameter, advance and lane spacing as specified", "[path]") {
  const Toolpath path = trochoidal_path(troch(2.0, 2.0, 0.4), CutSpec{}, test::test_patch(),
                                        test::test_ball());
  const std::vector<Move> loops = loops_of(path);
  REQUIRE(loops.size() > 20);
  std::vector<double> lanes;
  for (std::size_t i = 0; i < loops.size(); ++i) {
    CAPTURE(i);
    REQUIRE_NEAR(arc_radius_mm(loops[i]), 1.0, 1e-12);                    // loop diameter 2
    REQUIRE_NEAR(std::abs(arc_sweep_rad(loops[i])), 2 * std::numbers::pi, 1e-12);  // full circle
    if (i > 0 && loops[i].centre_mm.y() == loops[i - 1].centre_mm.y()) {
      REQUIRE_NEAR(loops[i].centre_mm.x() - loops[i - 1].centre_mm.x(), 0.4, 1e-12);  // advance
    } else {
      lanes.push_back(loops[i].centre_mm.y());
    }
  }
  // Lanes at y = k stepover, k = 0 .. ceil(10 / 2), as the raster contract (DESIGN.md).
  REQUIRE(lanes.size() == 6);
  for (std::size_t k = 0; k < lanes.size(); ++k) REQUIRE_NEAR(lanes[k], 2.0 * k, 1e-12);
  // Loop centres run from -(R + rho) = -4 to at least 10 + 4 = 14.
  REQUIRE_NEAR(loops.front().centre_mm.x(), -4.0, 1e-12);
  double lane0_last = -1e9;
  for (const Move& m : loops) {
    if (m.centre_mm.y() == 0.0) lane0_last = std::max(lane0_last, m.centre_mm.x());
  }
  REQUIRE_NEAR(lane0_last, 14.0, 1e-9);  // -4 + 45 x 0.4
}

TEST_CASE("trochoidal_path: loops and connecting lines are tangent-continuous", "[path]") {
  for (const bool climb : {true, false}) {
    PathSpec spec = troch(2.0, 2.0, 0.4, 0.0, RasterDirection::Zigzag);
    spec.climb = climb;
    const Toolpath path = trochoidal_path(spec, CutSpec{}, test::test_patch(), test::test_ball());
    int joints = 0;
    for (std::size_t i = 0; i + 1 < path.moves.size(); ++i) {
      const Move& a = path.moves[i];
      const Move& b = path.moves[i + 1];
      // Within a lane: loop -> line (advance) -> loop.
      if (a.kind == MoveKind::Arc && b.kind == MoveKind::Line && i + 2 < path.moves.size() &&
          path.moves[i + 2].kind == MoveKind::Arc && std::abs((b.end_mm - b.start_mm).norm() - 0.4) < 1e-9) {
        CAPTURE(i, climb);
        REQUIRE_NEAR(test::tangent_xy(a, true).dot(test::tangent_xy(b, false)), 1.0, 1e-12);
        REQUIRE_NEAR(test::tangent_xy(b, true).dot(test::tangent_xy(path.moves[i + 2], false)), 1.0, 1e-12);
        ++joints;
      }
    }
    CHECK(joints > 100);
  }
}

TEST_CASE("trochoidal_path: the cutter covers the whole patch, at any angle", "[path]") {
  // Coverage: every patch point within R (3 mm) of a cutting move, so the tool passes over it.
  for (const double angle : {0.0, 30.0, 90.0}) {
    const Toolpath path = trochoidal_path(troch(4.0, 0.0, 0.0, angle), CutSpec{},
                                          test::test_patch(), test::test_ball());
    double worst = 0.0;
    for (double y = 0.0; y <= 10.0; y += 0.1) {
      for (double x = 0.0; x <= 10.0; x += 0.1) worst = std::max(worst, test::distance_to_cuts({x, y}, path, 0.0));
    }
    CAPTURE(angle);
    CHECK(worst <= 3.0);
  }
}

TEST_CASE("trochoidal_path: defaults, loop sense, lane links and refusals", "[path]") {
  // path_spec.h defaults: loop diameter D/2 = 3 mm, advance D/10 = 0.6 mm for a 6 mm cutter.
  const Toolpath path = trochoidal_path(troch(2.0, 0.0, 0.0), CutSpec{}, test::test_patch(), test::test_ball());
  const std::vector<Move> loops = loops_of(path);
  REQUIRE_NEAR(arc_radius_mm(loops[0]), 1.5, 1e-12);
  REQUIRE_NEAR(loops[1].centre_mm.x() - loops[0].centre_mm.x(), 0.6, 1e-12);
  // Climb with M3: ccw loops (trochoidal_path.h); conventional: cw.
  CHECK(loops[0].ccw);
  PathSpec conv = troch(2.0, 0.0, 0.0);
  conv.climb = false;
  CHECK_FALSE(loops_of(trochoidal_path(conv, CutSpec{}, test::test_patch(), test::test_ball()))[0].ccw);
  // One-way: lanes linked by rapids; zigzag: no rapids until the final retract.
  int rapids = 0;
  for (const Move& m : path.moves) rapids += m.rapid ? 1 : 0;
  CHECK(rapids == 2 * 5 + 1);  // 6 lanes: 5 links of retract + rapid across, then the retract
  const Toolpath zz = trochoidal_path(troch(2.0, 0.0, 0.0, 0.0, RasterDirection::Zigzag),
                                      CutSpec{}, test::test_patch(), test::test_ball());
  rapids = 0;
  for (const Move& m : zz.moves) rapids += m.rapid ? 1 : 0;
  CHECK(rapids == 1);
  CHECK(error_of(troch(10.0, 2.0, 0.4)) ==
        "path.stepover 10 mm: trochoidal lanes further apart than their swept width 2 (R + loop "
        "radius) = 8 mm leave uncut strips");
  CHECK(error_of(troch(2.0, -1.0, 0.4)) == "path.loop_diameter -1: must be > 0 mm (or 0 for the default)");
  CHECK(error_of(troch(2.0, 2.0, 1e-6)) ==
        "path.advance 1e-06 mm and path.stepover 2 mm: the path would need about 2.16e+08 moves; use "
        "larger values");
}

}  // namespace cuspmap

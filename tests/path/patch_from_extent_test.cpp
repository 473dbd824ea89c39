// Tests of patch_from_extent (box of the floor-running feed moves), move_bounds_xy (arc boxes)
// and the floor-reach test used for rapid warnings.
#include "path/patch_from_extent.h"

#include <numbers>

#include "core/input_error.h"
#include "path/floor_reach.h"
#include "path/move_bounds.h"
#include "path/path_test_geometry.h"
#include "test_support.h"

namespace cuspmap {
namespace {

Move line(Eigen::Vector3d a, Eigen::Vector3d b, bool rapid = false) {
  Move m;
  m.start_mm = a;
  m.end_mm = b;
  m.rapid = rapid;
  m.feed_mm_per_min = 100;
  return m;
}

Move arc(Eigen::Vector3d a, Eigen::Vector3d b, Eigen::Vector2d c, bool ccw) {
  Move m = line(a, b);
  m.kind = MoveKind::Arc;
  m.centre_mm = c;
  m.ccw = ccw;
  return m;
}

}  // namespace

TEST_CASE("move_bounds_xy: arcs include the quadrant points they pass", "[path]") {
  // Quarter circle ccw from (1,0) to (0,1) about the origin: box [0,1] x [0,1].
  BoxXY q = move_bounds_xy(arc({1, 0, 0}, {0, 1, 0}, {0, 0}, true));
  REQUIRE_NEAR(q.lo_mm.x(), 0, 1e-12);
  REQUIRE_NEAR(q.hi_mm.y(), 1, 1e-12);
  // The same ends clockwise: three quarters through (0,-1) and (-1,0): box [-1,1] x [-1,1].
  q = move_bounds_xy(arc({1, 0, 0}, {0, 1, 0}, {0, 0}, false));
  REQUIRE_NEAR(q.lo_mm.x(), -1, 1e-12);
  REQUIRE_NEAR(q.lo_mm.y(), -1, 1e-12);
  // Half of the quarter arc (t in [0, 0.5]): from (1,0) to (cos 45, sin 45).
  q = move_bounds_xy(arc({1, 0, 0}, {0, 1, 0}, {0, 0}, true), 0.0, 0.5);
  REQUIRE_NEAR(q.hi_mm.y(), std::sqrt(0.5), 1e-12);
  REQUIRE_NEAR(q.lo_mm.x(), std::sqrt(0.5), 1e-12);
  // Full circle from (2,0) about (0,0).
  q = move_bounds_xy(arc({2, 0, 0}, {2, 0, 0}, {0, 0}, false));
  REQUIRE_NEAR(q.lo_mm.x(), -2, 1e-12);
  REQUIRE_NEAR(q.hi_mm.y(), 2, 1e-12);
}

TEST_CASE("patch_from_extent: box of the feed moves on the floor, ramps clipped", "[path]") {
  Toolpath path;
  path.moves.push_back(line({-50, -50, 10}, {0, 0, 5}, true));   // rapid: ignored
  path.moves.push_back(line({0, 0, 5}, {0, 0, 0}));              // plunge: contributes (0,0)
  path.moves.push_back(line({0, 0, 0}, {30, 0, 0}));
  path.moves.push_back(arc({30, 0, 0}, {30, 10, 0}, {30, 5}, true));  // bulges to x = 35
  path.moves.push_back(line({30, 10, 0}, {30, 50, 2}));          // ramp up: on floor until z = 0.01
  path.moves.push_back(line({0, 20, 0.5}, {20, 20, 0.5}));       // 0.5 above: ignored
  const Patch p = patch_from_extent(path, 0.05, 0.0, 3.0);
  REQUIRE_NEAR(p.origin_x_mm, 0.0, 1e-12);
  REQUIRE_NEAR(p.origin_y_mm, 0.0, 1e-12);
  REQUIRE_NEAR(p.size_x_mm, 35.0, 1e-12);
  // The ramp climbs 2 mm over 40 mm: it is within the 0.01 mm band for its first 0.2 mm.
  REQUIRE_NEAR(p.size_y_mm, 10.0 + 40.0 * kFloorContactBandMm / 2.0, 1e-12);
  CHECK(p.cell_mm == 0.05);
  Toolpath high;
  high.moves.push_back(line({0, 0, 1}, {5, 0, 1}));
  CHECK_THROWS_WITH(patch_from_extent(high, 0.05, 0.0, 3.0),
                    "no feed move of the program reaches the floor Z=0 mm (within 0.01 mm): give "
                    "[patch] size and origin, or check patch.floor_z");
  // A single straight pass along X (derived): across it the patch spans the cutter's cut,
  // y = 2 -+ R; along it the tip's run (wider than the cutter) as before.
  Toolpath one;
  one.moves.push_back(line({0, 2, 0}, {8, 2, 0}));
  const Patch thin = patch_from_extent(one, 0.1, 0.0, 3.0);
  REQUIRE_NEAR(thin.origin_y_mm, -1.0, 1e-12);
  REQUIRE_NEAR(thin.size_y_mm, 6.0, 1e-12);
  REQUIRE_NEAR(thin.origin_x_mm, 0.0, 1e-12);
  REQUIRE_NEAR(thin.size_x_mm, 8.0, 1e-12);
  // Two passes 1 mm apart: the tip's box (the floor both passes finish), not grown.
  one.moves.push_back(line({8, 3, 0}, {0, 3, 0}));
  const Patch slot = patch_from_extent(one, 0.1, 0.0, 3.0);
  REQUIRE_NEAR(slot.origin_y_mm, 2.0, 1e-12);
  REQUIRE_NEAR(slot.size_y_mm, 1.0, 1e-12);
}

TEST_CASE("cutter_reach_mm and move_reaches_floor", "[path]") {
  // DESIGN.md "Geometry": ball p(R) = R; bull-nose p(R) = rc; dished flat p(0) = R tan(dish).
  Cutter ball = test::test_ball();
  REQUIRE_NEAR(cutter_reach_mm(ball), 3.0, 1e-12);
  Cutter bull = ball;
  bull.shape = CutterShape::BullNose;
  bull.corner_radius_mm = 1.0;
  REQUIRE_NEAR(cutter_reach_mm(bull), 1.0, 1e-12);
  Cutter flat = ball;
  flat.shape = CutterShape::Flat;
  flat.dish_deg = 2.0;
  REQUIRE_NEAR(cutter_reach_mm(flat), 3.0 * std::tan(2.0 * std::numbers::pi / 180.0), 1e-12);
  const Patch patch = test::test_patch();
  CHECK(move_reaches_floor(line({-20, 5, 2}, {20, 5, 2}, true), patch, ball));
  CHECK_FALSE(move_reaches_floor(line({-20, 5, 3}, {20, 5, 3}, true), patch, ball));
  CHECK_FALSE(move_reaches_floor(line({-20, 14, 0}, {20, 14, 0}, true), patch, ball));  // 4 > R away
  CHECK(move_reaches_floor(line({-20, 12.5, 0}, {20, 12.5, 0}, true), patch, ball));    // 2.5 < R
  // A descending rapid that is low only outside the grown patch does not reach.
  CHECK_FALSE(move_reaches_floor(line({5, 5, 10}, {30, 5, 0}, true), patch, ball));
}

}  // namespace cuspmap

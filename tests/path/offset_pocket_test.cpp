// Offset rings of a square pocket against hand-computed geometry: ring perimeters, centre passes
// on the spines of what the rings leave, links, the whole path length; no ring crosses itself;
// an open edge puts ring 0 on the boundary.
// Method: derived plane geometry (each number's derivation beside it).
#include <cmath>

#include "path/offset_path.h"
#include "path/offset_rings.h"
#include "path/path_test_geometry.h"
#include "path/point_in_polygon.h"
#include "test_support.h"

namespace cuspmap {
namespace {

using Polygon = std::vector<Eigen::Vector2d>;

double perimeter(const OffsetLoop& loop) {
  double sum = 0.0;
  for (const LoopElement& e : loop.elements) sum += (e.end_mm - e.start_mm).norm();
  return sum;
}

bool segments_cross(const Eigen::Vector2d& a, const Eigen::Vector2d& b, const Eigen::Vector2d& c,
                    const Eigen::Vector2d& d) {
  auto cross = [](const Eigen::Vector2d& u, const Eigen::Vector2d& v) { return u.x() * v.y() - u.y() * v.x(); };
  const double d1 = cross(b - a, c - a), d2 = cross(b - a, d - a);
  const double d3 = cross(d - c, a - c), d4 = cross(d - c, b - c);
  return ((d1 > 0 && d2 < 0) || (d1 < 0 && d2 > 0)) && ((d3 > 0 && d4 < 0) || (d3 < 0 && d4 > 0));
}

bool self_crossing(const Polygon& p) {
  const std::size_t n = p.size();
  for (std::size_t i = 0; i < n; ++i) {
    for (std::size_t j = i + 2; j < n; ++j) {
      if (i == 0 && j + 1 == n) continue;  // neighbours through the closing edge
      if (segments_cross(p[i], p[(i + 1) % n], p[j], p[(j + 1) % n])) return true;
    }
  }
  return false;
}

const Polygon kPocket = {{0, 0}, {30, 0}, {30, 30}, {0, 30}};

}  // namespace

TEST_CASE("issue_13: 30 x 30 pocket, 10 mm tool, 6 mm stepover: rings, spines, length",
          "[path]") {
  const OffsetRings rings = offset_rings(kPocket, 5.0, 6.0, 100000);
  int ring_count = 0, centre_count = 0;
  for (const OffsetLoop& loop : rings.loops) {
    CHECK_FALSE(self_crossing(loop.polygon_mm));
    if (loop.level == 0) REQUIRE_NEAR(perimeter(loop), 80.0, 1e-5);  // derived: 20 x 20 square
    if (loop.level == 1) REQUIRE_NEAR(perimeter(loop), 32.0, 1e-5);  // derived: 8 x 8 square
    CHECK(loop.level <= 1);  // offset 17 > 15: nothing left for ring 2
    ring_count += loop.level >= 0 ? 1 : 0;
    if (loop.level < 0) {
      ++centre_count;
      // A spine: the uncovered pieces (four corner wedges, the 2 x 2 centre) each shrink to
      // a point (derived: convex pieces, one inscribed circle each).
      CHECK(perimeter(loop) < 0.01);
    }
  }
  CHECK(ring_count == 2);
  CHECK(centre_count == 5);

  PathSpec spec;
  spec.kind = PathKind::Offset;
  spec.stepover_mm = 6.0;
  spec.edge = OffsetEdge::Wall;
  Patch patch;
  patch.size_x_mm = patch.size_y_mm = 30.0;
  patch.cell_mm = 0.05;
  Cutter ball;
  ball.shape = CutterShape::Ball;
  ball.diameter_mm = 10.0;
  const Toolpath path = offset_path(spec, CutSpec{}, patch, ball);
  // Derived: a corner wedge lies between x = 8, y = 8 and the circle of 3 about (11, 11); its
  // inscribed circle has radius r = 3 (sqrt 2 - 1)^2 = 0.5147 at (8 + r, 8 + r), so each detour
  // from the ring corner (5, 5) is 2 sqrt2 (3 + r) = 9.941; the centre (15, 15) is a detour of
  // 2 x 4 sqrt2 from a ring-1 corner; ring 0 -> ring 1 is 6 sqrt2; plunge and retract 2 mm each.
  const double r = 3.0 * std::pow(std::sqrt(2.0) - 1.0, 2);
  const double expected = 80.0 + 32.0 + 4.0 * 2.0 * std::sqrt(2.0) * (3.0 + r) +
                          6.0 * std::sqrt(2.0) + 8.0 * std::sqrt(2.0) + 4.0;
  const double length = path_length_mm(path, true);
  REQUIRE_NEAR(length, expected, 0.02 * expected);  // issue 13: within 2 % (main: 210 mm)
}

TEST_CASE("offset_rings: no ring crosses itself on an L and a notched boundary", "[path]") {
  const Polygon ell = {{0, 0}, {20, 0}, {20, 8}, {8, 8}, {8, 20}, {0, 20}};
  const Polygon notch = {{0, 0}, {24, 0}, {24, 12}, {13, 7.5}, {11, 7.5}, {0, 12}};
  for (const Polygon& b : {ell, notch}) {
    for (const OffsetLoop& loop : offset_rings(b, 3.0, 0.7, 1000000).loops) {
      CHECK_FALSE(self_crossing(loop.polygon_mm));
    }
  }
}

TEST_CASE("offset_path: an open edge puts ring 0 on the boundary", "[path]") {
  PathSpec spec;
  spec.kind = PathKind::Offset;
  spec.stepover_mm = 0.5;
  spec.edge = OffsetEdge::Open;
  std::vector<std::vector<Eigen::Vector2d>> wall_region;
  const Toolpath path =
      offset_path(spec, CutSpec{}, test::test_patch(), test::test_ball(), &wall_region);
  CHECK(wall_region.empty());
  // The plunge lands on the patch corner nearest the boundary's first point (0, 0) (derived:
  // ring 0 is the 10 x 10 patch outline itself).
  REQUIRE_NEAR(path.moves.front().end_mm.x(), 0.0, 1e-6);
  REQUIRE_NEAR(path.moves.front().end_mm.y(), 0.0, 1e-6);
  spec.edge = OffsetEdge::Wall;
  offset_path(spec, CutSpec{}, test::test_patch(), test::test_ball(), &wall_region);
  REQUIRE(wall_region.size() == 1);
  CHECK(std::abs(polygon_signed_area_mm2(wall_region[0])) == Approx(16.0).epsilon(1e-6));  // 4 x 4
}

}  // namespace cuspmap

// Tests of the offset path: rings nested and one stepover apart, corners about reflex vertices
// kept as exact arcs, coverage (every point of the region within R of a pass; every allowed
// tool-centre point within s/2 of one), direction for climb/conventional, links, refusals.
#include "path/offset_path.h"

#include <numbers>
#include <vector>

#include "core/input_error.h"
#include "path/offset_rings.h"
#include "path/point_in_polygon.h"
#include "path/path_test_geometry.h"
#include "test_support.h"

namespace cuspmap {
namespace {

using Polygon = std::vector<Eigen::Vector2d>;

double distance_to_boundary(const Eigen::Vector2d& q, const Polygon& p) {
  double best = 1e300;
  for (std::size_t i = 0; i < p.size(); ++i) {
    best = std::min(best, test::distance_to_segment(q, p[i], p[(i + 1) % p.size()]));
  }
  return best;
}

// A round cutter cannot reach into a convex corner of interior angle t: the points it misses
// lie within R / tan(t/2) of the vertex (the tangent points of the corner's fillet circle).
bool in_corner_zone(const Eigen::Vector2d& q, const Polygon& p, double r) {
  const double area = polygon_signed_area_mm2(p);
  for (std::size_t i = 0; i < p.size(); ++i) {
    const Eigen::Vector2d a = p[(i + p.size() - 1) % p.size()], v = p[i], b = p[(i + 1) % p.size()];
    const Eigen::Vector2d e0 = v - a, e1 = b - v;
    const double turn = e0.x() * e1.y() - e0.y() * e1.x();
    if (turn * area <= 0.0) continue;  // reflex (or straight): no corner zone
    const double interior = std::acos(std::clamp((a - v).normalized().dot((b - v).normalized()), -1.0, 1.0));
    if ((q - v).norm() < r / std::tan(0.5 * interior) + 1e-9) return true;
  }
  return false;
}

// Samples the polygon's interior on a grid: every point the cutter can reach (all but the
// convex-corner zones) within R of a pass, and every point at least R from the boundary (an
// allowed tool centre) within s/2 of a pass.
void require_coverage(const Toolpath& path, const Polygon& boundary, double r, double s) {
  double lo_x = 1e300, hi_x = -1e300, lo_y = 1e300, hi_y = -1e300;
  for (const auto& p : boundary) {
    lo_x = std::min(lo_x, p.x()), hi_x = std::max(hi_x, p.x());
    lo_y = std::min(lo_y, p.y()), hi_y = std::max(hi_y, p.y());
  }
  double worst_cut = 0.0, worst_centre = 0.0;
  int centres = 0;
  for (double y = lo_y + 0.013; y < hi_y; y += 0.07) {
    for (double x = lo_x + 0.011; x < hi_x; x += 0.07) {
      const Eigen::Vector2d q(x, y);
      if (!point_in_polygon(q, boundary)) continue;
      const double d = test::distance_to_cuts(q, path, 0.0);
      if (!in_corner_zone(q, boundary, r)) worst_cut = std::max(worst_cut, d);
      if (distance_to_boundary(q, boundary) >= r) {
        worst_centre = std::max(worst_centre, d);
        ++centres;
      }
    }
  }
  CHECK(centres > 100);
  CHECK(worst_cut <= r + 1e-9);
  // Tolerance: Clipper's polylines stand in for arcs within kOffsetArcToleranceMm.
  CHECK(worst_centre <= 0.5 * s + kOffsetArcToleranceMm + 1e-9);
}

Toolpath offset(const Polygon& boundary, double s, bool climb = true,
                SpindleDirection spindle = SpindleDirection::Cw) {
  PathSpec spec;
  spec.kind = PathKind::Offset;
  spec.stepover_mm = s;
  spec.boundary_mm = boundary;
  spec.climb = climb;
  spec.edge = OffsetEdge::Wall;
  CutSpec cut;
  cut.spindle = spindle;
  return offset_path(spec, cut, test::test_patch(), test::test_ball());
}

const Polygon kEll = {{0, 0}, {20, 0}, {20, 8}, {8, 8}, {8, 20}, {0, 20}};  // L, reflex at (8, 8)

}  // namespace

TEST_CASE("offset_rings: rectangle rings are nested and one stepover apart", "[path]") {
  // Ring k of a 10 x 10 square sits at R + k s = 3 + 0.4 k from every side.
  const Polygon square = {{0, 0}, {10, 0}, {10, 10}, {0, 10}};
  const OffsetRings rings = offset_rings(square, 3.0, 0.4, 1000000);
  int ring_count = 0;
  for (const OffsetLoop& loop : rings.loops) {
    if (loop.level < 0) continue;
    ++ring_count;
    const double d = 3.0 + 0.4 * loop.level;
    for (const LoopElement& e : loop.elements) {
      CAPTURE(loop.level);
      REQUIRE_FALSE(e.arc);  // a convex boundary has no reflex vertex: sharp inner corners
      const Eigen::Vector2d mid = 0.5 * (e.start_mm + e.end_mm);
      REQUIRE_NEAR(distance_to_boundary(mid, square), d, 1e-6);  // Clipper's 1 nm grid
    }
  }
  // Rings while R + k s < 5: k = 0 .. 4 (k = 5 gives 5.0: a zero-area ring, dropped).
  CHECK(ring_count == 5);
  // 5 - 4.6 = 0.4 > s/2: the middle is farther than s/2 from ring 4, so a centre pass exists.
  CHECK(rings.loops.back().level == -1);
}

TEST_CASE("offset_rings: each ring lies inside a ring of the level before (nested)", "[path]") {
  for (const Polygon& boundary : {kEll, Polygon{{0, 0}, {24, 0}, {24, 12}, {13, 7.5}, {11, 7.5}, {0, 12}}}) {
    const OffsetRings rings = offset_rings(boundary, 3.0, 0.5, 1000000);
    for (const OffsetLoop& loop : rings.loops) {
      if (loop.level <= 0) continue;
      bool nested = false;
      for (const OffsetLoop& outer : rings.loops) {
        if (outer.level != loop.level - 1) continue;
        bool all = true;
        for (const Eigen::Vector2d& v : loop.polygon_mm) all = all && point_in_polygon(v, outer.polygon_mm);
        nested = nested || all;
      }
      CAPTURE(loop.level);
      CHECK(nested);
    }
  }
}

TEST_CASE("offset_path: L-shaped boundary keeps round corners as exact arcs", "[path]") {
  // Each ring's corner at the reflex vertex (8, 8) is an arc of radius R + k s about it, a full
  // quarter circle (the 90 deg corner) while the ring is whole; the innermost ring (at 4.5 mm,
  // beyond the arms' half-width of 4 mm) keeps only a part of it.
  const Toolpath path = offset(kEll, 0.5);
  std::vector<double> radii;
  for (const Move& m : path.moves) {
    if (m.kind != MoveKind::Arc) continue;
    REQUIRE_NEAR((m.centre_mm - Eigen::Vector2d(8, 8)).norm(), 0.0, 1e-6);
    const double r = arc_radius_mm(m);
    const double k = (r - 3.0) / 0.5;
    REQUIRE_NEAR(k, std::round(k), 1e-6);
    REQUIRE_NEAR(arc_radius_mm(m), (m.end_mm.head<2>() - m.centre_mm).norm(), 1e-9);
    if (r < 4.25) REQUIRE_NEAR(std::abs(arc_sweep_rad(m)), 0.5 * std::numbers::pi, 1e-6);
    CHECK(std::abs(arc_sweep_rad(m)) <= 0.5 * std::numbers::pi + 1e-6);
    radii.push_back(r);
  }
  std::sort(radii.begin(), radii.end());
  REQUIRE(radii.size() == 4);
  for (std::size_t k = 0; k < radii.size(); ++k) REQUIRE_NEAR(radii[k], 3.0 + 0.5 * k, 1e-6);
  require_coverage(path, kEll, 3.0, 0.5);
}

TEST_CASE("offset_path: every point is cut and every tool centre lies within s/2 of a pass", "[path]") {
  const Polygon square = {{0, 0}, {10, 0}, {10, 10}, {0, 10}};
  for (const double s : {0.4, 0.7, 1.3}) {
    CAPTURE(s);
    require_coverage(offset(square, s), square, 3.0, s);
  }
  // A pentagon with two reflex vertices and a narrow neck that splits the rings.
  const Polygon odd = {{0, 0}, {24, 0}, {24, 12}, {13, 7.5}, {11, 7.5}, {0, 12}};
  require_coverage(offset(odd, 0.6), odd, 3.0, 0.6);
}

TEST_CASE("offset_path: rings run clockwise for climb with M3, and reverse otherwise", "[path]") {
  // Derivation in offset_path.h. The sense of a loop: sign of its shoelace area.
  auto first_ring_area = [](const Toolpath& path) {
    double twice = 0.0;
    for (const Move& m : path.moves) {
      if (m.rapid || m.start_mm.z() != m.end_mm.z()) continue;
      twice += m.start_mm.x() * m.end_mm.y() - m.end_mm.x() * m.start_mm.y();
      if (twice != 0.0 && (m.end_mm - path.moves[1].start_mm).norm() < 1e-12) break;
    }
    return twice;
  };
  const Polygon square = {{0, 0}, {10, 0}, {10, 10}, {0, 10}};
  CHECK(first_ring_area(offset(square, 0.5)) < 0.0);
  CHECK(first_ring_area(offset(square, 0.5, false)) > 0.0);
  CHECK(first_ring_area(offset(square, 0.5, true, SpindleDirection::Ccw)) > 0.0);
  CHECK(first_ring_area(offset(square, 0.5, false, SpindleDirection::Ccw)) < 0.0);
}

TEST_CASE("offset_path: links stay down inside, patch default, refusals", "[path]") {
  // A square: every link from ring to ring is short and inside ring 0, so the only rapid is the
  // final retract.
  PathSpec spec;
  spec.kind = PathKind::Offset;
  spec.stepover_mm = 0.5;
  spec.edge = OffsetEdge::Wall;
  const Toolpath path = offset_path(spec, CutSpec{}, test::test_patch(), test::test_ball());
  int rapids = 0;
  for (const Move& m : path.moves) rapids += m.rapid ? 1 : 0;
  CHECK(rapids == 1);
  // Default boundary = the patch: first ring's corner at (R, R) = (3, 3).
  CHECK(path.moves[0].end_mm.x() >= 3.0 - 1e-9);
  spec.boundary_mm = {{0, 0}, {1, 1}};
  CHECK_THROWS_WITH(offset_path(spec, CutSpec{}, test::test_patch(), test::test_ball()),
                    "path.boundary: needs at least 3 points [x, y] enclosing an area");
  spec.boundary_mm = {{0, 0}, {5, 0}, {5, 5}, {0, 5}};
  CHECK_THROWS_WITH(offset_path(spec, CutSpec{}, test::test_patch(), test::test_ball()),
                    "path.boundary: the region is narrower than the cutter (D 6 mm) everywhere; "
                    "no offset pass fits");
}

}  // namespace cuspmap

// Tests of the spiral path: turns concentric and one stepover apart along rays, tangent
// continuity, deviation from the Archimedean spiral as documented, coverage of the patch,
// rotation sense for climb and conventional cutting.
#include "path/spiral_path.h"

#include <numbers>
#include <vector>

#include "core/input_error.h"
#include "path/path_test_geometry.h"
#include "test_support.h"

namespace cuspmap {
namespace {

constexpr double kS = 0.5;  // stepover, mm

std::vector<Move> arcs_of(const Toolpath& path) {
  std::vector<Move> arcs;
  for (const Move& m : path.moves) {
    if (m.kind == MoveKind::Arc) arcs.push_back(m);
  }
  return arcs;
}

Toolpath spiral(bool outward, bool climb, SpindleDirection spindle = SpindleDirection::Cw) {
  PathSpec spec;
  spec.kind = PathKind::Spiral;
  spec.stepover_mm = kS;
  spec.outward = outward;
  spec.climb = climb;
  CutSpec cut;
  cut.spindle = spindle;
  return spiral_path(spec, cut, test::test_patch(), test::test_ball());
}

}  // namespace

TEST_CASE("spiral_path: turns about each centre are concentric and one stepover apart", "[path]") {
  // Two-centre construction: half turn n has radius n s/2, so half turns n and n + 2 share a
  // centre and differ by s in radius: along any ray from that centre they are s apart.
  const std::vector<Move> arcs = arcs_of(spiral(true, true));
  REQUIRE(arcs.size() > 10);
  for (std::size_t n = 0; n + 2 < arcs.size(); ++n) {
    CAPTURE(n);
    REQUIRE_NEAR((arcs[n + 2].centre_mm - arcs[n].centre_mm).norm(), 0.0, 1e-12);
    REQUIRE_NEAR(arc_radius_mm(arcs[n + 2]) - arc_radius_mm(arcs[n]), kS, 1e-12);
    REQUIRE_NEAR(std::abs(arc_sweep_rad(arcs[n])), std::numbers::pi, 1e-9);
  }
  // The centres are s/2 apart, about the patch centre (5, 5).
  REQUIRE_NEAR((arcs[0].centre_mm - arcs[1].centre_mm).norm(), kS / 2, 1e-12);
  REQUIRE_NEAR((0.5 * (arcs[0].centre_mm + arcs[1].centre_mm) - Eigen::Vector2d(5, 5)).norm(), 0.0, 1e-12);
}

TEST_CASE("spiral_path: consecutive turns are a stepover apart along rays from the middle", "[path]") {
  // Along rays from the midpoint M the spacing departs from s by at most twice the documented
  // deviation from the Archimedean spiral (whose spacing along rays is exactly s).
  const Toolpath path = spiral(true, true);
  const Eigen::Vector2d mid(5, 5);
  for (double deg : {10.0, 60.0, 135.0, 200.0, 300.0}) {
    const Eigen::Vector2d dir(std::cos(deg * std::numbers::pi / 180), std::sin(deg * std::numbers::pi / 180));
    // Crossings: for each arc, the radius t along the ray where |M + t dir - c| = r.
    std::vector<double> hits;
    for (const Move& m : arcs_of(path)) {
      const Eigen::Vector2d w = mid - m.centre_mm;
      const double r = arc_radius_mm(m), bq = w.dot(dir), cq = w.squaredNorm() - r * r;
      const double t = -bq + std::sqrt(bq * bq - cq);  // the root beyond M (M is inside)
      if (test::distance_to_arc(mid + t * dir, m) < 1e-9) hits.push_back(t);
    }
    std::sort(hits.begin(), hits.end());
    REQUIRE(hits.size() > 10);
    for (std::size_t i = 1; i + 1 < hits.size(); ++i) {
      CAPTURE(deg, i);
      REQUIRE_NEAR(hits[i + 1] - hits[i], kS, 2.0 * kSpiralMaxDeviationFraction * kS);
    }
  }
}

TEST_CASE("spiral_path: arcs join with continuous position and tangent", "[path]") {
  const std::vector<Move> arcs = arcs_of(spiral(false, true));
  for (std::size_t i = 0; i + 1 < arcs.size(); ++i) {
    CAPTURE(i);
    REQUIRE_NEAR((arcs[i].end_mm - arcs[i + 1].start_mm).norm(), 0.0, 1e-12);
    REQUIRE_NEAR(test::tangent_xy(arcs[i], true).dot(test::tangent_xy(arcs[i + 1], false)), 1.0, 1e-12);
  }
}

TEST_CASE("spiral_path: deviation from the Archimedean spiral is as documented", "[path]") {
  // Archimedean spiral about M through the joints: rho = s/4 + s phi / (2 pi), phi the polar
  // angle about M unwrapped from the start point (at rho = s/4). Measured along each arc.
  const std::vector<Move> arcs = arcs_of(spiral(true, true));
  const Eigen::Vector2d mid(5, 5);
  double phi = 0.0, max_dev = 0.0, first_dev = 0.0, late_dev = 0.0;
  Eigen::Vector2d prev = arcs[0].start_mm.head<2>() - mid;
  for (std::size_t n = 0; n < arcs.size(); ++n) {
    for (int k = 1; k <= 2000; ++k) {
      const Eigen::Vector2d p = move_point_mm(arcs[n], k / 2000.0).head<2>() - mid;
      phi += std::atan2(prev.x() * p.y() - prev.y() * p.x(), prev.dot(p));
      prev = p;
      const double dev = std::abs(p.norm() - (kS / 4 + kS * phi / (2 * std::numbers::pi)));
      max_dev = std::max(max_dev, dev);
      if (n == 0) first_dev = std::max(first_dev, dev);
      if (n + 4 >= arcs.size()) late_dev = std::max(late_dev, dev);
    }
  }
  CHECK(max_dev <= kSpiralMaxDeviationFraction * kS);
  REQUIRE_NEAR(first_dev / kS, 0.091, 0.001);   // spiral_path.h: 0.091 s on the first half turn
  REQUIRE_NEAR(late_dev / kS, 0.0533, 0.001);   // tends to 0.0526 s (radius ~10 mm here)
}

TEST_CASE("spiral_path: every point of the patch lies within s/2 of a turn", "[path]") {
  const Toolpath path = spiral(true, true);
  const Patch patch = test::test_patch();
  double worst = 0.0;
  for (double y = 0.0; y <= patch.size_y_mm; y += 0.1) {
    for (double x = 0.0; x <= patch.size_x_mm; x += 0.1) {
      worst = std::max(worst, test::distance_to_cuts({x, y}, path, patch.floor_z_mm));
    }
  }
  CHECK(worst <= 0.5 * kS + 1e-9);
  // The last turns about both centres reach beyond every corner by R (3 mm).
  const std::vector<Move> arcs = arcs_of(path);
  for (std::size_t n = arcs.size() - 2; n < arcs.size(); ++n) {
    const double far = std::max({(arcs[n].centre_mm - Eigen::Vector2d(0, 0)).norm(),
                                 (arcs[n].centre_mm - Eigen::Vector2d(10, 0)).norm(),
                                 (arcs[n].centre_mm - Eigen::Vector2d(0, 10)).norm(),
                                 (arcs[n].centre_mm - Eigen::Vector2d(10, 10)).norm()});
    CHECK(arc_radius_mm(arcs[n]) >= far + 3.0);
  }
}

TEST_CASE("spiral_path: rotation sense follows climb, direction and spindle", "[path]") {
  // offset_path.h derivation: with an M3 spindle, climb milling keeps the uncut side on the
  // cutter's right: outside when spiralling out (ccw), inside when spiralling in (cw).
  CHECK(arcs_of(spiral(true, true)).front().ccw);
  CHECK_FALSE(arcs_of(spiral(false, true)).front().ccw);
  CHECK_FALSE(arcs_of(spiral(true, false)).front().ccw);
  CHECK_FALSE(arcs_of(spiral(true, true, SpindleDirection::Ccw)).front().ccw);
  // Inward paths start outside the patch and end at the middle.
  const Toolpath in = spiral(false, true);
  CHECK((arcs_of(in).back().end_mm.head<2>() - Eigen::Vector2d(5 - kS / 4, 5)).norm() < 1e-12);
  CHECK(in.moves.front().start_mm.z() > in.moves.front().end_mm.z());  // plunge first
  CHECK(in.moves.back().rapid);                                       // retract last
  PathSpec bad;
  bad.stepover_mm = 0.0;
  CHECK_THROWS_WITH(spiral_path(bad, CutSpec{}, test::test_patch(), test::test_ball()),
                    "path.stepover 0: must be > 0 mm");
}

}  // namespace cuspmap

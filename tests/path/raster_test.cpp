// Tests of raster_path against DESIGN.md's raster contract: pass count and positions, lead-in
// and lead-out, one-way links (rapids) and zigzag links (feed, outside the patch), any angle.
// Method: DESIGN.md raster contract; coverage checked point by point on a 0.1 mm lattice.
#include "path/raster.h"

#include <algorithm>
#include <cmath>
#include <numbers>
#include <vector>

#include "test_support.h"

namespace cuspmap {
namespace {

// Geometry is built from a handful of mm-sized products: 1e-9 mm is rounding, not a tolerance.
constexpr double kExactMm = 1e-9;

std::vector<Move> feed_passes(const Toolpath& path, const PathSpec& spec) {
  // Passes are the feed moves; zigzag side links are feed moves too, told apart by direction:
  // a pass runs along the raster angle (or against it), a link across it.
  const double a = spec.angle_deg * std::numbers::pi / 180.0;
  const Eigen::Vector2d d(std::cos(a), std::sin(a));
  std::vector<Move> out;
  for (const Move& m : path.moves) {
    const Eigen::Vector2d v = (m.end_mm - m.start_mm).head<2>();
    if (!m.rapid && std::abs(v.normalized().dot(d)) > 0.999) out.push_back(m);
  }
  return out;
}

double point_rect_distance(const Eigen::Vector2d& p, const Patch& patch) {
  const double dx =
      std::max({patch.origin_x_mm - p.x(), 0.0, p.x() - patch.origin_x_mm - patch.size_x_mm});
  const double dy =
      std::max({patch.origin_y_mm - p.y(), 0.0, p.y() - patch.origin_y_mm - patch.size_y_mm});
  return std::hypot(dx, dy);
}

// Distance from a segment to the patch rectangle, by dense sampling of the segment (the exact
// value is approached to within length / 4000, the tolerance the checks below allow for).
double segment_rect_distance(const Eigen::Vector2d& a, const Eigen::Vector2d& b,
                             const Patch& patch) {
  double best = 1e300;
  for (int k = 0; k <= 4000; ++k)
    best = std::min(best, point_rect_distance(a + (b - a) * (k / 4000.0), patch));
  return best;
}

}  // namespace

TEST_CASE(
    "raster_path: passes at y = k stepover, k = 0..ceil(size_y/stepover), x from -R to size_x + R",
    "[path]") {
  // DESIGN.md raster contract, at angle 0, relative to the patch origin.
  Patch patch;
  patch.size_x_mm = 10.0;
  patch.size_y_mm = 10.0;
  patch.origin_x_mm = 5.0;
  patch.origin_y_mm = -3.0;
  patch.floor_z_mm = 2.0;
  Cutter ball;
  ball.diameter_mm = 6.0;
  CutSpec cut;
  cut.depth_mm = -0.1;
  PathSpec spec;
  for (double step : {0.3, 0.25, 3.0, 12.0}) {
    CAPTURE(step);
    spec.stepover_mm = step;
    const Toolpath path = raster_path(spec, cut, patch, ball);
    const std::vector<Move> passes = feed_passes(path, spec);
    const int expected = static_cast<int>(std::ceil(10.0 / step - 1e-9)) + 1;
    REQUIRE(static_cast<int>(passes.size()) == expected);
    for (int k = 0; k < expected; ++k) {
      CAPTURE(k);
      const Move& m = passes[k];
      REQUIRE_NEAR(m.start_mm.y(), -3.0 + k * step, kExactMm);
      REQUIRE_NEAR(m.end_mm.y(), -3.0 + k * step, kExactMm);
      REQUIRE_NEAR(m.start_mm.x(), 5.0 - 3.0, kExactMm);
      REQUIRE_NEAR(m.end_mm.x(), 5.0 + 10.0 + 3.0, kExactMm);
      REQUIRE_NEAR(m.start_mm.z(), 2.0 - 0.1, kExactMm);
      REQUIRE_NEAR(m.end_mm.z(), 2.0 - 0.1, kExactMm);
      REQUIRE(m.feed_mm_per_min == cut.feed_mm_per_min);
    }
    // The last pass lies on or past the top edge, the one before it below.
    REQUIRE(passes.back().start_mm.y() >= 7.0 - kExactMm);
    if (expected > 1) REQUIRE(passes[expected - 2].start_mm.y() < 7.0);
  }
}

TEST_CASE("raster_path: one-way links retract, rapid back and plunge", "[path]") {
  Patch patch;
  patch.size_x_mm = 4.0;
  patch.size_y_mm = 1.0;
  Cutter flat;
  flat.shape = CutterShape::Flat;
  flat.diameter_mm = 2.0;
  CutSpec cut;
  cut.retract_mm = 1.5;
  cut.rapid_mm_per_min = 8000.0;
  PathSpec spec;
  spec.stepover_mm = 0.5;  // passes at y = 0, 0.5, 1.0
  const Toolpath path = raster_path(spec, cut, patch, flat);
  REQUIRE(path.moves.size() == 3 + 2 * 3);
  for (int k = 0; k < 3; ++k) {
    const Move& pass = path.moves[4 * k];
    CAPTURE(k);
    REQUIRE_FALSE(pass.rapid);
    REQUIRE(pass.end_mm.x() > pass.start_mm.x());  // every pass along +X
    if (k == 2) break;
    const Move& up = path.moves[4 * k + 1];
    const Move& back = path.moves[4 * k + 2];
    const Move& down = path.moves[4 * k + 3];
    for (const Move* m : {&up, &back, &down}) {
      REQUIRE(m->rapid);
      REQUIRE(m->feed_mm_per_min == 8000.0);
    }
    REQUIRE(up.start_mm == pass.end_mm);
    REQUIRE_NEAR(up.end_mm.z(), 1.5, kExactMm);
    REQUIRE(up.end_mm.head<2>() == pass.end_mm.head<2>());
    REQUIRE_NEAR(back.end_mm.x(), -1.0, kExactMm);
    REQUIRE_NEAR(back.end_mm.z(), 1.5, kExactMm);
    REQUIRE(down.end_mm == path.moves[4 * k + 4].start_mm);
  }
}

TEST_CASE("raster_path: zigzag alternates and links along the side outside the patch", "[path]") {
  Patch patch;
  patch.size_x_mm = 4.0;
  patch.size_y_mm = 2.0;
  Cutter ball;
  ball.diameter_mm = 2.0;
  CutSpec cut;
  PathSpec spec;
  spec.stepover_mm = 0.5;
  spec.direction = RasterDirection::Zigzag;
  const Toolpath path = raster_path(spec, cut, patch, ball);
  REQUIRE(path.moves.size() == 5 + 4);
  for (std::size_t i = 0; i < path.moves.size(); ++i) {
    const Move& m = path.moves[i];
    CAPTURE(i);
    REQUIRE_FALSE(m.rapid);
    if (i % 2 == 0) {
      const int k = static_cast<int>(i / 2);
      REQUIRE_NEAR(m.start_mm.y(), 0.5 * k, kExactMm);
      REQUIRE((m.end_mm.x() > m.start_mm.x()) == (k % 2 == 0));
    } else {
      // Link: at x = -R or size_x + R, from one pass to the next, at cutting feed.
      REQUIRE(m.start_mm == path.moves[i - 1].end_mm);
      REQUIRE(m.end_mm == path.moves[i + 1].start_mm);
      REQUIRE_NEAR(m.start_mm.x(), m.end_mm.x(), kExactMm);
      REQUIRE(std::abs(m.start_mm.x() - 2.0) == Approx(2.0 + 1.0));
      REQUIRE(m.feed_mm_per_min == cut.feed_mm_per_min);
    }
  }
}

TEST_CASE("raster_path: any angle covers the patch, leaves it fully and links outside it",
          "[path]") {
  Patch patch;
  patch.size_x_mm = 5.0;
  patch.size_y_mm = 3.0;
  patch.origin_x_mm = -1.0;
  patch.origin_y_mm = 2.0;
  Cutter ball;
  ball.diameter_mm = 1.6;
  const double reach = 0.8;
  CutSpec cut;
  PathSpec spec;
  spec.stepover_mm = 0.35;
  spec.direction = RasterDirection::Zigzag;
  for (double angle : {30.0, 90.0, 135.0, -20.0}) {
    CAPTURE(angle);
    spec.angle_deg = angle;
    const Toolpath path = raster_path(spec, cut, patch, ball);
    const std::vector<Move> passes = feed_passes(path, spec);
    const double a = angle * std::numbers::pi / 180.0;
    const Eigen::Vector2d d(std::cos(a), std::sin(a)), n(-d.y(), d.x());
    // Neighbouring passes one stepover apart.
    for (std::size_t k = 1; k < passes.size(); ++k) {
      REQUIRE_NEAR((passes[k].start_mm - passes[k - 1].start_mm).head<2>().dot(n), 0.35, kExactMm);
    }
    // Every patch point: within half a stepover of a pass line, and every pass line within
    // the reach passes over it fully (its foot lies inside the pass, a reach from either end).
    for (int iy = 0; iy <= 30; ++iy) {
      for (int ix = 0; ix <= 50; ++ix) {
        const Eigen::Vector2d p(-1.0 + 0.1 * ix, 2.0 + 0.1 * iy);
        double nearest = 1e300;
        for (const Move& m : passes) {
          const Eigen::Vector2d s = m.start_mm.head<2>(), e = m.end_mm.head<2>();
          const double off = std::abs((p - s).dot(n));
          nearest = std::min(nearest, off);
          if (off > reach) continue;
          const double along = (p - s).dot((e - s).normalized());
          REQUIRE(along >= reach - kExactMm);
          REQUIRE(along <= (e - s).norm() - reach + kExactMm);
        }
        REQUIRE(nearest <= 0.5 * 0.35 + kExactMm);
      }
    }
    // Zigzag links never come within the reach of the patch (sampling slack 2e-3 mm).
    for (const Move& m : path.moves) {
      const Eigen::Vector2d v = (m.end_mm - m.start_mm).head<2>();
      if (std::abs(v.normalized().dot(d)) > 0.999) continue;
      REQUIRE(segment_rect_distance(m.start_mm.head<2>(), m.end_mm.head<2>(), patch) >=
              reach - 2e-3);
    }
  }
}

}  // namespace cuspmap

// Tests of revolved_profile: without runout it is p(r) itself (DESIGN.md "Geometry"); with
// runout it is the envelope of the turning offset body, checked against its definition.
// Method: definition of the envelope of a turning offset body (Kline & DeVor 1983 runout).
#include "tool/revolved_profile.h"

#include <algorithm>
#include <cmath>
#include <numbers>
#include <vector>

#include "test_support.h"
#include "tool/dense_scan_min.h"

namespace cuspmap {
namespace {

std::vector<Cutter> sample_cutters() {
  std::vector<Cutter> out;
  Cutter ball;
  ball.shape = CutterShape::Ball;
  ball.diameter_mm = 6.0;
  out.push_back(ball);
  Cutter bull;
  bull.shape = CutterShape::BullNose;
  bull.diameter_mm = 8.0;
  bull.corner_radius_mm = 1.0;
  out.push_back(bull);
  bull.dish_deg = 2.0;
  out.push_back(bull);
  Cutter flat;
  flat.shape = CutterShape::Flat;
  flat.diameter_mm = 10.0;
  out.push_back(flat);
  flat.dish_deg = 1.0;
  out.push_back(flat);
  return out;
}

// The turning body's lowest point at spindle radius r: the body is offset by e, so it meets r at
// body radii |r u - e v| for all directions v: min of p over angles, sampled and then refined by
// golden section around the best sample (p is unimodal in the angle there).
double turning_body_min(const Cutter& c, double e, double r) {
  // Half a turn suffices (the body radius is symmetric in the angle).
  return test::dense_scan_min(
      [&](double phi) {
        return profile_height_mm(c, std::hypot(r - e * std::cos(phi), e * std::sin(phi)));
      },
      0.0, std::numbers::pi, 2000);
}

}  // namespace

TEST_CASE("revolved_profile: without runout it is the cutter profile p(r)", "[tool]") {
  for (const Cutter& c : sample_cutters()) {
    CAPTURE(static_cast<int>(c.shape), c.dish_deg);
    const RevolvedProfile q = revolved_profile(c, 0.0);
    REQUIRE(q.reach_mm == c.radius_mm());
    REQUIRE(q.pieces.front().r0_mm == 0.0);
    REQUIRE(q.pieces.back().r1_mm == q.reach_mm);
    for (std::size_t k = 1; k < q.pieces.size(); ++k) {
      REQUIRE(q.pieces[k].r0_mm == q.pieces[k - 1].r1_mm);
    }
    for (int i = 0; i <= 1000; ++i) {
      const double r = c.radius_mm() * i / 1000.0;
      CAPTURE(r);
      REQUIRE_NEAR(q.height_mm(r), profile_height_mm(c, r), 1e-12);
    }
    REQUIRE(q.argmin_mm == profile_argmin_mm(c));
    REQUIRE(std::isinf(q.height_mm(c.radius_mm() + 1e-6)));
  }
}

TEST_CASE("revolved_profile: with runout it is the envelope of the turning offset body", "[tool]") {
  // Tolerance: the refined angle search converges far below 1e-9 mm; rounding of mm values.
  constexpr double kTolMm = 1e-9;
  for (const Cutter& c : sample_cutters()) {
    for (double e : {0.01, 0.2}) {
      CAPTURE(static_cast<int>(c.shape), c.dish_deg, e);
      const RevolvedProfile q = revolved_profile(c, e);
      REQUIRE(q.reach_mm == Approx(c.radius_mm() + e));
      double lowest = std::numeric_limits<double>::infinity();
      for (int i = 0; i <= 400; ++i) {
        // Stay 5% of R inside the rim, where a ball's slope is still moderate.
        const double r = (c.radius_mm() * 0.95 + e) * i / 400.0;
        CAPTURE(r);
        const double expected = turning_body_min(c, e, r);
        REQUIRE_NEAR(q.height_mm(r), expected, kTolMm);
        lowest = std::min(lowest, expected);
      }
      REQUIRE(q.min_mm <= lowest + kTolMm);
      REQUIRE_NEAR(q.min_mm, turning_body_min(c, e, q.argmin_mm), kTolMm);
      REQUIRE_NEAR(q.height_mm(q.argmin_mm), q.min_mm, 1e-12);
      REQUIRE(q.max_mm == std::max(q.height_mm(0.0), q.height_mm(q.reach_mm)));
    }
  }
}

TEST_CASE("RevolvedProfile::min_over_mm: lowest point of an interval of radii", "[tool]") {
  for (const Cutter& c : sample_cutters()) {
    const RevolvedProfile q = revolved_profile(c, 0.05);
    const double reach = q.reach_mm;
    for (double lo : {0.0, 0.3 * reach, 0.8 * reach}) {
      for (double hi : {lo, lo + 0.1, 0.9 * reach, 2.0 * reach}) {
        CAPTURE(static_cast<int>(c.shape), c.dish_deg, lo, hi);
        double best = std::numeric_limits<double>::infinity();
        for (int i = 0; i <= 5000; ++i) {
          best = std::min(best, q.height_mm(lo + (std::min(hi, reach) - lo) * i / 5000.0));
        }
        // Sampling step <= reach / 5000 at slope < 10 (away from the rim): < 1e-2 reach / 5000.
        REQUIRE(q.min_over_mm(lo, hi) <= best + 1e-12);
        REQUIRE(q.min_over_mm(lo, hi) >= best - 10.0 * reach / 5000.0);
      }
    }
    REQUIRE(std::isinf(q.min_over_mm(reach + 0.01, reach + 1.0)));
  }
}

}  // namespace cuspmap

// Tests of chord_min against a dense scan with golden-section refinement (test oracle
// tests/tool/dense_scan_min.h, independent of the piece-by-piece method), and of its
// local-minimum candidates.
// Method: dense scan plus golden section (Kiefer 1953) as the independent reference.
#include "tool/chord_min.h"

#include <algorithm>
#include <cmath>
#include <random>

#include "test_support.h"
#include "tool/dense_scan_min.h"

namespace cuspmap {
namespace {

double f(const RevolvedProfile& q, double w, double k, double x) {
  return q.height_mm(std::sqrt(w * w + x * x)) - k * x;
}

}  // namespace

TEST_CASE("chord_min: equals a dense scan for every profile kind, ramps and tilt", "[tool]") {
  // 1e-9 mm: the scan's golden refinement converges far below; rounding of mm-sized values.
  constexpr double kTolMm = 1e-9;
  std::vector<std::pair<Cutter, double>> cases;  // cutter, runout
  Cutter ball;
  ball.diameter_mm = 4.0;
  cases.push_back({ball, 0.0});
  cases.push_back({ball, 0.05});
  Cutter bull;
  bull.shape = CutterShape::BullNose;
  bull.diameter_mm = 6.0;
  bull.corner_radius_mm = 0.8;
  cases.push_back({bull, 0.0});
  bull.dish_deg = 2.0;
  cases.push_back({bull, 0.0});
  cases.push_back({bull, 0.1});
  Cutter flat;
  flat.shape = CutterShape::Flat;
  flat.diameter_mm = 6.0;
  cases.push_back({flat, 0.0});
  flat.dish_deg = 1.0;
  cases.push_back({flat, 0.0});
  cases.push_back({flat, 0.02});
  std::mt19937 rng(7);
  std::uniform_real_distribution<double> unit(-1.0, 1.0);
  for (const auto& [cutter, runout] : cases) {
    const RevolvedProfile q = revolved_profile(cutter, runout);
    const double reach = q.reach_mm;
    for (int trial = 0; trial < 60; ++trial) {
      const double w = 0.98 * reach * unit(rng);
      const double k = trial % 3 == 0 ? 0.0 : 0.05 * unit(rng);
      double a = 1.2 * reach * unit(rng), b = 1.2 * reach * unit(rng);
      if (a > b) std::swap(a, b);
      CAPTURE(static_cast<int>(cutter.shape), cutter.dish_deg, runout, w, k, a, b);
      const ChordMin m = chord_min(q, w, k, a, b, false);
      const double half = std::sqrt(reach * reach - w * w);
      const double lo = std::max(a, -half), hi = std::min(b, half);
      if (lo > hi) {
        REQUIRE(std::isinf(m.value_mm));
        continue;
      }
      const double ref =
          test::dense_scan_min([&](double x) { return f(q, w, k, x); }, lo, hi, 20000);
      REQUIRE_NEAR(m.value_mm, ref, kTolMm);
      REQUIRE_NEAR(f(q, w, k, m.x_mm), m.value_mm, 1e-12);
      // Local minima: each candidate is no higher than its neighbours (up to 1e-9 mm: the
      // golden-section piece inside a runout envelope converges that far), and the global
      // minimum is among them.
      const ChordMin local = chord_min(q, w, k, a, b, true);
      REQUIRE(local.count >= 1);
      bool has_global = false;
      for (int i = 0; i < local.count; ++i) {
        const ChordPoint p = local.candidates[i];
        for (double dx : {-1e-5, 1e-5}) {
          const double x = p.x_mm + dx;
          if (x >= lo && x <= hi) REQUIRE(f(q, w, k, x) >= p.value_mm - kTolMm);
        }
        has_global |= std::abs(p.value_mm - m.value_mm) <= kTolMm;
      }
      REQUIRE(has_global);
    }
  }
}

}  // namespace cuspmap

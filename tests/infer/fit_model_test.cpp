// The floor fit's forward model across the lay (infer/fit_model): the lowest of one pass's
// profile shifted to every pass, against the project's own sweep of all the passes over a
// window (sweep/simulate_floor), on a tilted undished flat whose rim steps the floor.
#include "infer/fit_model.h"

#include <catch2/catch.hpp>
#include <cmath>
#include <limits>
#include <numbers>

namespace cuspmap {

TEST_CASE("issue_17: the pass-profile model matches a window sweep, steps included", "[infer]") {
  // Random round trip (tools/diagnose_campaign.py seed 2029 rs14): 9.4 mm undished flat,
  // 2.724 mm stepover, 0.0637 deg toward 278.9 deg from the passes (a 2.26 um step per pass
  // where each pass's rim ends), one-way, passes at 39.5 deg, 0.1 mm samples.
  FitModel m;
  m.cutter.shape = CutterShape::Flat;
  m.cutter.diameter_mm = 9.4;
  m.cutter.dish_deg = 0.0;
  m.lay_deg = 39.5;
  m.window.cell_mm = 0.1;
  m.window.origin_x_mm = -3.0;
  m.window.origin_y_mm = -3.0;
  m.window.size_x_mm = 5.95;  // 60 x 60 samples
  m.window.size_y_mm = 5.95;
  m.threads = 1;
  Eigen::VectorXd p(kFitParams);
  const double dir = 278.9 * std::numbers::pi / 180.0;
  p << 0.0637 * std::cos(dir), 0.0637 * std::sin(dir), 2.724, 0.3;
  const Heightfield sweep = simulate_fit_window(m, p);
  const FitProfile prof = simulate_fit_profile(m, p);
  int compared = 0, near_step = 0;
  double worst = 0.0;
  for (int b = 0; b < sweep.ny; ++b) {
    for (int a = 0; a < sweep.nx; ++a) {
      const double want = sweep.z_um(b, a);
      if (!std::isfinite(want)) continue;
      double other = 0.0;
      const double got = prof.at(across_lay_mm(m, sweep.x_mm(a), sweep.y_mm(b)), &other);
      REQUIRE(std::isfinite(got));
      // The candidate passes at() weighs hold the lowest of all passes in reach (derived).
      const double v = across_lay_mm(m, sweep.x_mm(a), sweep.y_mm(b));
      double all = std::numeric_limits<double>::infinity();
      for (long k = -10; k <= 10; ++k) {
        const double z = prof.pass_at(v - prof.offset_mm - static_cast<double>(k) * 2.724);
        if (std::isfinite(z)) all = std::min(all, z);
      }
      if (!std::isfinite(other)) CHECK(got == all);
      double err = std::abs(got - want);
      if (std::isfinite(other)) {
        // Within a strip cell of a step: one of the two sides is the sweep's.
        ++near_step;
        err = std::min(err, std::abs(other - want));
      }
      worst = std::max(worst, err);
      ++compared;
    }
  }
  CAPTURE(compared, near_step, worst);
  // Derived: the floor is the lowest of the passes' swept profiles, the same profile shifted
  // (the swept volume of a line move); the strip's linear interpolation errs by under 0.005 um
  // (curvature x cell^2 / 8; sqrt(reach - |w|) chords near the reach, fit_model). Samples within
  // a strip cell (12.5 um) of the 2 steps crossing the window: ~2 x 2 x 12.5 / 100 per row.
  CHECK(compared == sweep.nx * sweep.ny);
  CHECK(near_step > 0);
  CHECK(worst < 0.005);
}

}  // namespace cuspmap

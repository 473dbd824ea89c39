// Circle marks: turning theory (Boothroyd & Knight) and the ball feed-mark formula.
#include "cusp/feed_mark.h"

#include <cmath>

#include "test_support.h"

TEST_CASE("feed_mark: turning theory Rt = f^2/(8r), Ra = f^2/(18 sqrt3 r)", "[cusp]") {
  // Boothroyd & Knight, Fundamentals of Machining and Machine Tools (ideal roughness of a
  // round-nosed tool, from memory): Rt = f^2/(8r), Ra = f^2/(18 sqrt(3) r) ~= 0.0321 f^2/r.
  const double r = 0.8, f = 0.2;
  const cuspmap::CuspResult m = cuspmap::feed_mark(r, f);
  REQUIRE_NEAR(m.scallop_approx_um, f * f / (8.0 * r) * 1000.0, 1e-12);
  REQUIRE_NEAR(m.stats_approx.ra_um, f * f / (18.0 * std::sqrt(3.0) * r) * 1000.0, 1e-12);
  REQUIRE_NEAR(m.stats_approx.ra_um, 0.0321 * f * f / r * 1000.0, 0.001 * m.stats_approx.ra_um);
  // The exact arc profile lies within 0.5% of the parabolic forms at f/r = 0.25.
  REQUIRE_NEAR(m.scallop_um, m.scallop_approx_um, 0.005 * m.scallop_um);
  REQUIRE_NEAR(m.stats.ra_um, m.stats_approx.ra_um, 0.005 * m.stats.ra_um);
  REQUIRE(m.effective_radius_mm.value() == r);
}

TEST_CASE("feed_mark: published turning worked example", "[cusp]") {
  // machinecalcs.com surface-finish calculator, worked example: f = 0.2 mm/rev, r = 0.8 mm ->
  // Ra ~= 1.60 um, Rz ~= 6.25 um (parabolic forms).
  const cuspmap::CuspResult m = cuspmap::feed_mark(0.8, 0.2);
  REQUIRE_NEAR(m.stats_approx.ra_um, 1.60, 0.005);
  REQUIRE_NEAR(m.stats_approx.rz_um, 6.25, 0.005);
}

TEST_CASE("feed_mark: ball feed mark R - sqrt(R^2 - (fz/2)^2)", "[cusp]") {
  // DESIGN.md "Closed forms": feed mark of a ball, feed per tooth fz.
  const double big_r = 3.0, fz = 0.1;
  const double h = big_r - std::sqrt(big_r * big_r - fz * fz / 4.0);
  REQUIRE_NEAR(cuspmap::feed_mark(big_r, fz).scallop_um, h * 1000.0, 1e-9);
}

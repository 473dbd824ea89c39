// Ball end-mill cusp on level and sloped floors against the handbook formula, published worked
// examples, and the general sloped-plane solver.
#include "cusp/scallop_ball.h"

#include <cmath>

#include "cusp/scallop_plane.h"
#include "test_support.h"

TEST_CASE("scallop_ball_mm: handbook cusp formula h = R - sqrt(R^2 - (s/2)^2)", "[cusp]") {
  // Machinery's Handbook, 30th ed., cusp height of a ball end mill h = R - sqrt(R^2 - (s/2)^2)
  // (formula from memory), evaluated here in long double the naive way; the library's
  // cancellation-free form must agree to rounding for cusps from 1e-8 mm to the full radius.
  for (double big_r : {0.5, 3.0, 12.7}) {
    for (double frac : {1e-4, 1e-2, 0.1, 0.5, 0.9, 1.0}) {
      const double s = 2.0 * big_r * frac;
      const long double half = 0.5L * s;
      const long double naive = big_r - std::sqrt((long double)big_r * big_r - half * half);
      CAPTURE(big_r, s);
      REQUIRE_NEAR(cuspmap::scallop_ball_mm(big_r, s), static_cast<double>(naive), 1e-12 * big_r);
    }
  }
}

TEST_CASE("scallop_ball_mm: published worked examples", "[cusp]") {
  // machinecalcs.com ball-nose stepover calculator, worked example: 6 mm ball, 0.5 mm stepover
  // -> h ~= 0.0104 mm (3 significant digits given).
  REQUIRE_NEAR(cuspmap::scallop_ball_mm(3.0, 0.5), 0.0104, 0.00005);
  // Same source, inverse: 0.005 mm cusp -> stepover ~= 0.346 mm.
  REQUIRE_NEAR(cuspmap::ball_chord_for_scallop_mm(3.0, 0.005), 0.346, 0.0005);
  // hypecalculator.com ball nose step over calculator: 10 mm ball, 0.5 mm -> about 0.0063 mm.
  REQUIRE_NEAR(cuspmap::scallop_ball_mm(5.0, 0.5), 0.0063, 0.00005);
  // calcady.com CNC ball endmill cusp height calculator, default display: 0.5 in ball,
  // S/2 = 0.025 in -> H = 0.001253 in (31.8 um).
  REQUIRE_NEAR(cuspmap::scallop_ball_mm(0.25, 0.050), 0.001253, 0.0000005);
  // Same page, practical example: 0.25 in ball, 0.020 in stepover -> 0.000402 in (10.2 um).
  // The page rounds sqrt(0.125^2 - 0.010^2) to 0.124598 (it is 0.1245993), so its last digit is
  // high by ~1.4e-6 in: tolerance 2e-6 in.
  REQUIRE_NEAR(cuspmap::scallop_ball_mm(0.125, 0.020), 0.000402, 0.000002);
}

TEST_CASE("scallop_ball_mm: trade rule, 1/4 in ball at 0.020 in leaves about 0.4 thou", "[cusp]") {
  // Common practice, no source (computed from the handbook formula): ~0.4 thou.
  const double h_in = cuspmap::scallop_ball_mm(0.25 * 25.4 / 2.0, 0.020 * 25.4) / 25.4;
  REQUIRE_NEAR(h_in * 1000.0, 0.4, 0.01);
}

TEST_CASE("ball_chord_for_scallop_mm: inverts the cusp formula", "[cusp]") {
  for (double h : {1e-7, 1e-3, 0.3, 2.9, 3.0}) {
    CAPTURE(h);
    REQUIRE_NEAR(cuspmap::scallop_ball_mm(3.0, cuspmap::ball_chord_for_scallop_mm(3.0, h)), h,
                 1e-12 * 3.0);
  }
}

TEST_CASE("scallop_ball: slope uses the contact spacing s / cos(slope)", "[cusp]") {
  // DESIGN.md "Closed forms": on a slope the plan stepover s becomes s / cos(alpha) along the
  // surface. Independent check: the sloped-plane solver (swept-section crossing) agrees.
  cuspmap::Cutter ball;
  ball.diameter_mm = 6.0;
  for (double slope : {0.0, 15.0, 30.0, 45.0, 60.0}) {
    const double s = 0.9 * cuspmap::ball_sphere_limit_mm(3.0, slope);
    CAPTURE(slope, s);
    const cuspmap::CuspResult a = cuspmap::scallop_ball(3.0, s, slope);
    const cuspmap::CuspResult b = cuspmap::scallop_on_plane(ball, s, slope);
    REQUIRE_NEAR(a.chord_mm, s / std::cos(slope * M_PI / 180.0), 1e-12);
    REQUIRE_NEAR(a.scallop_um, b.scallop_um, 1e-9 * a.scallop_um);
    REQUIRE_NEAR(a.stats.ra_um, b.stats.ra_um, 1e-9 * a.stats.ra_um);
    REQUIRE_NEAR(a.stats.rq_um, b.stats.rq_um, 1e-9 * a.stats.rq_um);
    REQUIRE_FALSE(b.side_forms_cusp);
  }
}

TEST_CASE("ball_sphere_limit_mm: beyond 2R cos^2(slope) the side bounds the cusp", "[cusp]") {
  cuspmap::Cutter ball;
  ball.diameter_mm = 6.0;
  const double limit = cuspmap::ball_sphere_limit_mm(3.0, 60.0);
  REQUIRE_NEAR(limit, 1.5, 1e-12);  // 2 * 3 * cos^2(60 deg) = 1.5 mm
  REQUIRE_FALSE(cuspmap::scallop_on_plane(ball, 0.99 * limit, 60.0).side_forms_cusp);
  const cuspmap::CuspResult past = cuspmap::scallop_on_plane(ball, 1.01 * limit, 60.0);
  REQUIRE(past.side_forms_cusp);
  // The straight side removes more than the sphere would: a lower cusp than the circle formula.
  REQUIRE(past.scallop_um <
          cuspmap::scallop_ball_mm(3.0, std::min(6.0, 1.01 * limit / 0.5)) * 1000.0);
}

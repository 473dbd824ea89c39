// Ball cusp on convex and concave cylinders: the small-stepover limit (Lin & Koren 1996), the
// level-floor limit for large radii, the closed-form inverse and the model's edges.
#include "cusp/scallop_curved.h"

#include <cmath>

#include "cusp/scallop_ball.h"
#include "test_support.h"

TEST_CASE("scallop_curved_mm: small-stepover limit (s^2/8)(1/R +- 1/rho)", "[cusp]") {
  // Lin & Koren 1996 (iso-scallop paths): h ~ (s^2/8)(1/R + 1/rho) convex, (1/R - 1/rho) concave;
  // the exact form must approach it with a relative error of order s^2.
  const double big_r = 3.0, rho = 20.0;
  for (double s : {0.01, 0.05}) {
    const double vex = s * s / 8.0 * (1.0 / big_r + 1.0 / rho);
    const double cave = s * s / 8.0 * (1.0 / big_r - 1.0 / rho);
    CAPTURE(s);
    REQUIRE_NEAR(cuspmap::scallop_curved_mm(big_r, rho, true, s), vex, 2e-4 * vex);
    REQUIRE_NEAR(cuspmap::scallop_curved_mm(big_r, rho, false, s), cave, 2e-4 * cave);
  }
}

TEST_CASE("scallop_curved_mm: convex cusps exceed, concave fall short of a level floor", "[cusp]") {
  const double level = cuspmap::scallop_ball_mm(3.0, 0.5);
  REQUIRE(cuspmap::scallop_curved_mm(3.0, 20.0, true, 0.5) > level);
  REQUIRE(cuspmap::scallop_curved_mm(3.0, 20.0, false, 0.5) < level);
  // A very large radius is a level floor (handbook formula), differing by about s^2/(8 rho).
  const double dev = 0.5 * 0.5 / (8.0 * 1e6);
  REQUIRE_NEAR(cuspmap::scallop_curved_mm(3.0, 1e6, true, 0.5), level + dev, 0.01 * dev);
  REQUIRE_NEAR(cuspmap::scallop_curved_mm(3.0, 1e6, false, 0.5), level - dev, 0.01 * dev);
}

TEST_CASE("scallop_curved_mm: exact circle intersection, evaluated directly", "[cusp]") {
  // Centres on radius rho + R at angles 0 and phi; the cusp lies on the bisecting ray at
  // t = (rho+R) cos(phi/2) - sqrt(R^2 - (rho+R)^2 sin^2(phi/2)); h = t - rho (long double).
  const long double big_r = 3.0L, rho = 8.0L, s = 2.0L, phi = s / rho, a = rho + big_r;
  const long double t = a * std::cos(phi / 2) -
                        std::sqrt(big_r * big_r - a * a * std::sin(phi / 2) * std::sin(phi / 2));
  REQUIRE_NEAR(cuspmap::scallop_curved_mm(3.0, 8.0, true, 2.0), static_cast<double>(t - rho),
               1e-13);
  const long double ac = rho - big_r;
  const long double tc = ac * std::cos(phi / 2) +
                         std::sqrt(big_r * big_r - ac * ac * std::sin(phi / 2) * std::sin(phi / 2));
  REQUIRE_NEAR(cuspmap::scallop_curved_mm(3.0, 8.0, false, 2.0), static_cast<double>(rho - tc),
               1e-13);
}

TEST_CASE("curved_stepover_for_scallop_mm: inverts the exact form", "[cusp]") {
  for (bool convex : {true, false}) {
    for (double h : {1e-6, 0.01, 0.4}) {
      CAPTURE(convex, h);
      const double s = cuspmap::curved_stepover_for_scallop_mm(3.0, 12.0, convex, h);
      REQUIRE_NEAR(cuspmap::scallop_curved_mm(3.0, 12.0, convex, s), h, 1e-12);
    }
  }
}

TEST_CASE("scallop_curved: edges of the model", "[cusp]") {
  // A concave radius no larger than the ball: the ball cannot follow it.
  const cuspmap::CuspResult tight = cuspmap::scallop_curved(3.0, 2.5, false, 0.5);
  REQUIRE(tight.limit == cuspmap::CuspLimit::ToolTooLargeForConcave);
  REQUIRE(tight.scallop_um == 0.0);
  // Convex: past the reach the tool circles no longer meet.
  const double reach = cuspmap::curved_reach_mm(3.0, 3.0, true);
  REQUIRE_NEAR(reach, 2.0 * 3.0 * std::asin(0.5), 1e-12);  // 2 rho asin(R / (rho + R))
  REQUIRE(cuspmap::scallop_curved(3.0, 3.0, true, 0.99 * reach).limit == cuspmap::CuspLimit::None);
  REQUIRE(cuspmap::scallop_curved(3.0, 3.0, true, 1.01 * reach).limit ==
          cuspmap::CuspLimit::PassesDoNotOverlap);
}

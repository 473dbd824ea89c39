// Dispatcher: effective radius and small-stepover approximation per cutter and surface.
#include "cusp/cross_feed_cusp.h"

#include <cmath>

#include "cusp/cusp_setups.h"
#include "test_support.h"

namespace {
using cuspmap::CutterShape;
using cuspmap::SurfaceKind;
// Shape, D, rc, surface, rho, slope (the order these tests read best in).
cuspmap::CuspSetup make(CutterShape shape, double d, double rc, SurfaceKind k, double rho,
                        double slope) {
  return cuspmap::test::make_setup(shape, d, rc, k, slope, rho);
}
}  // namespace

TEST_CASE("cross_feed_cusp: effective radius per DESIGN.md", "[cusp]") {
  // DESIGN.md "Command line": R on a flat or sloped floor, R rho/(rho +- R) on cylinders,
  // rc for a bull-nose beyond its flat width.
  auto eff = [](const cuspmap::CuspSetup& s, double step) {
    return cuspmap::cross_feed_cusp(s, step).effective_radius_mm;
  };
  REQUIRE(eff(make(CutterShape::Ball, 6, 0, SurfaceKind::Plane, 0, 0), 0.5).value() == 3.0);
  REQUIRE(eff(make(CutterShape::Ball, 6, 0, SurfaceKind::Plane, 0, 30), 0.5).value() == 3.0);
  REQUIRE_NEAR(eff(make(CutterShape::Ball, 6, 0, SurfaceKind::Convex, 20, 0), 0.5).value(),
               3.0 * 20.0 / 23.0, 1e-12);
  REQUIRE_NEAR(eff(make(CutterShape::Ball, 6, 0, SurfaceKind::Concave, 20, 0), 0.5).value(),
               3.0 * 20.0 / 17.0, 1e-12);
  REQUIRE(eff(make(CutterShape::BullNose, 10, 1, SurfaceKind::Plane, 0, 0), 9.0).value() == 1.0);
  REQUIRE_FALSE(eff(make(CutterShape::BullNose, 10, 1, SurfaceKind::Plane, 0, 0), 7.0).has_value());
  REQUIRE_FALSE(eff(make(CutterShape::Flat, 10, 0, SurfaceKind::Plane, 0, 0), 7.0).has_value());
}

TEST_CASE("cross_feed_cusp: approximation s^2/(8 R_eff) beside the exact value", "[cusp]") {
  // Handbook small-cusp form h ~ s^2/(8R); Lin & Koren 1996 with R_eff on cylinders.
  const auto ball =
      cuspmap::cross_feed_cusp(make(CutterShape::Ball, 6, 0, SurfaceKind::Plane, 0, 0), 0.5);
  REQUIRE_NEAR(ball.scallop_approx_um, 0.25 / 24.0 * 1000.0, 1e-9);
  const auto vex =
      cuspmap::cross_feed_cusp(make(CutterShape::Ball, 6, 0, SurfaceKind::Convex, 20, 0), 0.5);
  REQUIRE_NEAR(vex.scallop_approx_um, 0.25 / 8.0 * (1.0 / 3.0 + 1.0 / 20.0) * 1000.0, 1e-9);
  // Exact above the parabola for a ball (the circle rises faster), within 0.2% at s = R/6.
  REQUIRE(ball.scallop_um > ball.scallop_approx_um);
  REQUIRE_NEAR(ball.scallop_um, ball.scallop_approx_um, 0.002 * ball.scallop_um);
  // Bull-nose on a level floor: (s/2 - (R - rc))^2 / (2 rc).
  const auto bull =
      cuspmap::cross_feed_cusp(make(CutterShape::BullNose, 10, 1, SurfaceKind::Plane, 0, 0), 8.4);
  REQUIRE_NEAR(bull.scallop_approx_um, 0.2 * 0.2 / 2.0 * 1000.0, 1e-9);
}

TEST_CASE("cross_feed_cusp: stepover at or past the diameter is outside the model", "[cusp]") {
  const auto r =
      cuspmap::cross_feed_cusp(make(CutterShape::Ball, 6, 0, SurfaceKind::Plane, 0, 0), 6.0);
  REQUIRE(r.limit == cuspmap::CuspLimit::PassesDoNotOverlap);
  REQUIRE_NEAR(r.scallop_um, 3000.0, 1e-9);  // the ball radius: a lower bound
  const auto f =
      cuspmap::cross_feed_cusp(make(CutterShape::Flat, 6, 0, SurfaceKind::Plane, 0, 0), 7.0);
  REQUIRE(f.limit == cuspmap::CuspLimit::PassesDoNotOverlap);
}

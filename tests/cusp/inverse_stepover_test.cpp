// Inverse stepover: round trips through the forward model, closed form vs bisection,
// published inverse examples and unreachable targets.
#include "cusp/inverse_stepover.h"

#include <cmath>

#include "cusp/cross_feed_cusp.h"
#include "cusp/cusp_setups.h"
#include "test_support.h"

namespace {
using cuspmap::CutterShape;
using cuspmap::FinishTarget;
using cuspmap::SurfaceKind;

using cuspmap::test::make_setup;

double value(const cuspmap::CuspResult& r, FinishTarget t) {
  return t == FinishTarget::Ra   ? r.stats.ra_um
         : t == FinishTarget::Rz ? r.stats.rz_um
                                 : r.scallop_um;
}
}  // namespace

TEST_CASE("inverse_stepover: published inverse example", "[cusp]") {
  // machinecalcs.com ball-nose stepover calculator: 6 mm ball, 0.005 mm cusp -> ~0.346 mm.
  const auto sol = cuspmap::inverse_stepover(make_setup(CutterShape::Ball, 6.0, 0.0),
                                             FinishTarget::Scallop, 5.0);
  REQUIRE(sol.reachable);
  REQUIRE_NEAR(sol.stepover_mm, 0.346, 0.0005);
  // The approximation s = sqrt(8 R h) (handbook small-cusp form) beside it.
  REQUIRE_NEAR(sol.stepover_approx_mm, std::sqrt(8.0 * 3.0 * 0.005), 1e-9);
}

TEST_CASE("inverse_stepover: forward(inverse(target)) == target on every surface", "[cusp]") {
  const cuspmap::CuspSetup setups[] = {
      make_setup(CutterShape::Ball, 6.0, 0.0),
      make_setup(CutterShape::Ball, 6.0, 0.0, SurfaceKind::Plane, 35.0),
      make_setup(CutterShape::Ball, 6.0, 0.0, SurfaceKind::Plane, 70.0),
      make_setup(CutterShape::BullNose, 10.0, 1.0),
      make_setup(CutterShape::BullNose, 10.0, 1.0, SurfaceKind::Plane, 20.0),
      make_setup(CutterShape::Flat, 10.0, 0.0, SurfaceKind::Plane, 15.0),
      make_setup(CutterShape::Ball, 6.0, 0.0, SurfaceKind::Convex, 0.0, 20.0),
      make_setup(CutterShape::Ball, 6.0, 0.0, SurfaceKind::Concave, 0.0, 20.0),
  };
  for (const cuspmap::CuspSetup& s : setups) {
    for (FinishTarget t : {FinishTarget::Scallop, FinishTarget::Ra, FinishTarget::Rz}) {
      for (double target : {0.4, 3.2, 25.0}) {
        CAPTURE(static_cast<int>(s.cutter.shape), static_cast<int>(s.surface), s.slope_deg,
                static_cast<int>(t), target);
        const auto sol = cuspmap::inverse_stepover(s, t, target);
        REQUIRE(sol.reachable);
        const cuspmap::CuspResult fwd = cuspmap::cross_feed_cusp(s, sol.stepover_mm);
        REQUIRE_NEAR(value(fwd, t), target, 1e-9 * target);
        REQUIRE(sol.stepover_approx_mm > 0.0);
        // The approximation differs from the exact stepover by less than 2% at these cusps,
        // except the flat end mill, whose "approximation" is its exact linear form.
        REQUIRE_NEAR(sol.stepover_approx_mm, sol.stepover_mm, 0.02 * sol.stepover_mm);
      }
    }
  }
}

TEST_CASE("inverse_stepover: closed forms agree with bisection", "[cusp]") {
  // Rz = cusp height for a periodic profile, so the Rz target takes the closed form while the
  // same cusp reached through Ra uses bisection: both must land on one stepover.
  const cuspmap::CuspSetup s = make_setup(CutterShape::BullNose, 10.0, 1.0);
  const auto by_rz = cuspmap::inverse_stepover(s, FinishTarget::Rz, 20.0);
  const auto by_ra = cuspmap::inverse_stepover(s, FinishTarget::Ra, by_rz.cusp.stats.ra_um);
  REQUIRE_NEAR(by_ra.stepover_mm, by_rz.stepover_mm, 1e-10 * by_rz.stepover_mm);
}

TEST_CASE("inverse_stepover: unreachable targets", "[cusp]") {
  // A bull-nose's cusp is never deeper than its corner radius (DESIGN.md closed form).
  const auto bull = cuspmap::inverse_stepover(make_setup(CutterShape::BullNose, 10.0, 1.0),
                                              FinishTarget::Scallop, 1500.0);
  REQUIRE_FALSE(bull.reachable);
  REQUIRE_NEAR(bull.max_target_um, 1000.0, 1e-6);
  // A flat end mill on a level floor leaves no cusp at all.
  const auto flat = cuspmap::inverse_stepover(make_setup(CutterShape::Flat, 10.0, 0.0),
                                              FinishTarget::Scallop, 5.0);
  REQUIRE_FALSE(flat.reachable);
  REQUIRE(flat.max_target_um == 0.0);
  // A concave radius smaller than the ball.
  const auto tight = cuspmap::inverse_stepover(
      make_setup(CutterShape::Ball, 6.0, 0.0, SurfaceKind::Concave, 0.0, 2.0), FinishTarget::Ra,
      1.0);
  REQUIRE_FALSE(tight.reachable);
}

TEST_CASE("inverse_feed_mark: turning feed for a target Ra", "[cusp]") {
  // machinecalcs.com surface-finish calculator: Ra 1.60 um with r = 0.8 mm -> f ~= 0.2 mm/rev
  // through the parabolic form f = sqrt(Ra 31.2 r) (Boothroyd & Knight's 18 sqrt 3 ~= 31.18).
  const auto sol = cuspmap::inverse_feed_mark(0.8, FinishTarget::Ra, 1.60);
  REQUIRE(sol.reachable);
  REQUIRE_NEAR(sol.stepover_approx_mm, 0.2, 0.001);
  REQUIRE_NEAR(sol.cusp.stats.ra_um, 1.60, 1e-9);
  const auto rt = cuspmap::inverse_feed_mark(0.8, FinishTarget::Rz, 6.25);
  REQUIRE_NEAR(rt.stepover_approx_mm, 0.2, 1e-9);  // Rt = f^2/(8r) solved for f
  REQUIRE_FALSE(cuspmap::inverse_feed_mark(0.8, FinishTarget::Scallop, 900.0).reachable);
}

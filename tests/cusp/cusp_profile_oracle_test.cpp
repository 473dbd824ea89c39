// Independent numeric check of every cusp closed form and the sloped-plane solver: the profile
// built as the pointwise minimum of neighbouring tool sections on a fine grid (min_of_sections.h)
// must give the same cusp height, Ra and Rq within 0.5%.
#include <string>

#include "cusp/cross_feed_cusp.h"
#include "cusp/cusp_setups.h"
#include "cusp/feed_mark.h"
#include "cusp/min_of_sections.h"
#include "cusp/scallop_plane.h"
#include "test_support.h"

namespace {

using cuspmap::CuspResult;
using cuspmap::CuspSetup;
using cuspmap::CutterShape;
using cuspmap::SurfaceKind;
using cuspmap::test::OracleStats;

// The brute-force grid resolves the cusp to ~1e-5 of the period; 0.5% is the bound.
constexpr double kOracleRelTol = 0.005;
constexpr int kSamples = 200000;

void require_matches(const CuspResult& r, const OracleStats& o) {
  INFO("library h " << r.scallop_um << " Ra " << r.stats.ra_um << " Rq " << r.stats.rq_um);
  INFO("oracle  h " << o.scallop_um << " Ra " << o.ra_um << " Rq " << o.rq_um);
  REQUIRE_NEAR(r.scallop_um, o.scallop_um, kOracleRelTol * o.scallop_um);
  REQUIRE_NEAR(r.stats.ra_um, o.ra_um, kOracleRelTol * o.ra_um);
  REQUIRE_NEAR(r.stats.rq_um, o.rq_um, kOracleRelTol * o.rq_um);
  REQUIRE_NEAR(r.stats.rz_um, r.scallop_um, 1e-9 * r.scallop_um);  // Rz of a periodic profile
}

CuspSetup plane_setup(CutterShape shape, double d, double rc, double slope_deg) {
  return cuspmap::test::make_setup(shape, d, rc, SurfaceKind::Plane, slope_deg);
}

}  // namespace

TEST_CASE("cross_feed_cusp: planes match the min-of-sections profile", "[cusp]") {
  struct Case {
    const char* name;
    CutterShape shape;
    double d, rc, slope_deg, stepover;
  };
  const Case cases[] = {
      {"ball level small", CutterShape::Ball, 6.0, 3.0, 0.0, 0.5},
      {"ball level large", CutterShape::Ball, 6.0, 3.0, 0.0, 4.0},
      {"ball slope 30", CutterShape::Ball, 6.0, 3.0, 30.0, 0.5},
      {"ball slope -30 (mirror)", CutterShape::Ball, 6.0, 3.0, -30.0, 0.5},
      {"ball slope 60 past the sphere (side cuts)", CutterShape::Ball, 6.0, 3.0, 60.0, 2.0},
      {"bull-nose level past flat", CutterShape::BullNose, 10.0, 1.0, 0.0, 9.0},
      {"bull-nose slope 20 small", CutterShape::BullNose, 10.0, 1.0, 20.0, 0.5},
      {"bull-nose slope 20 large", CutterShape::BullNose, 10.0, 1.0, 20.0, 3.0},
      {"bull-nose slope 45 large", CutterShape::BullNose, 12.0, 2.0, 45.0, 8.0},
      {"flat slope 10 (saw-tooth)", CutterShape::Flat, 10.0, 0.0, 10.0, 1.0},
      {"flat slope 40", CutterShape::Flat, 8.0, 0.0, 40.0, 3.0},
  };
  for (const Case& c : cases) {
    CAPTURE(c.name);
    const CuspSetup setup = plane_setup(c.shape, c.d, c.rc, c.slope_deg);
    const CuspResult r = cuspmap::cross_feed_cusp(setup, c.stepover);
    const OracleStats o = cuspmap::test::oracle_stats(
        cuspmap::test::plane_profile(0.5 * c.d, c.shape == CutterShape::Ball ? 0.5 * c.d : c.rc,
                                     c.stepover, c.slope_deg, kSamples));
    require_matches(r, o);
  }
}

TEST_CASE("cross_feed_cusp: flat faces that overlap leave no cusp (oracle agrees)", "[cusp]") {
  const CuspSetup setup = plane_setup(CutterShape::BullNose, 10.0, 1.0, 0.0);
  const CuspResult r = cuspmap::cross_feed_cusp(setup, 7.9);  // flat width 2(R - rc) = 8
  const OracleStats o =
      cuspmap::test::oracle_stats(cuspmap::test::plane_profile(5.0, 1.0, 7.9, 0.0, 20000));
  REQUIRE(r.scallop_um == 0.0);
  REQUIRE(o.scallop_um < 1e-9);
  REQUIRE_FALSE(r.effective_radius_mm.has_value());
}

TEST_CASE("cross_feed_cusp: cylinders match the min-of-circles profile", "[cusp]") {
  struct Case {
    const char* name;
    bool convex;
    double d, rho, stepover;
  };
  const Case cases[] = {
      {"convex rho 20", true, 6.0, 20.0, 0.5},        {"concave rho 20", false, 6.0, 20.0, 0.5},
      {"convex rho 3, large s", true, 6.0, 3.0, 2.0}, {"concave rho 5 < 2R", false, 6.0, 5.0, 2.0},
      {"concave rho 100", false, 10.0, 100.0, 1.5},
  };
  for (const Case& c : cases) {
    CAPTURE(c.name);
    CuspSetup setup;
    setup.cutter.shape = CutterShape::Ball;
    setup.cutter.diameter_mm = c.d;
    setup.surface = c.convex ? SurfaceKind::Convex : SurfaceKind::Concave;
    setup.surface_radius_mm = c.rho;
    const CuspResult r = cuspmap::cross_feed_cusp(setup, c.stepover);
    const OracleStats o = cuspmap::test::oracle_stats(
        cuspmap::test::cylinder_profile(0.5 * c.d, c.rho, c.convex, c.stepover, kSamples));
    require_matches(r, o);
  }
}

TEST_CASE("feed_mark: circle marks match the min-of-circles profile", "[cusp]") {
  // A turning nose (r 0.8 mm, f 0.2 mm/rev) and a ball's feed marks (R 3, fz 0.15) are circles
  // stepped along a line: the level-floor oracle with a ball section of that radius.
  for (const auto& [radius, spacing] : {std::pair{0.8, 0.2}, std::pair{3.0, 0.15}}) {
    const CuspResult r = cuspmap::feed_mark(radius, spacing);
    const OracleStats o = cuspmap::test::oracle_stats(
        cuspmap::test::plane_profile(radius, radius, spacing, 0.0, kSamples));
    require_matches(r, o);
  }
}

TEST_CASE("scallop_on_plane: uncut strips beyond one diameter are flagged", "[cusp]") {
  cuspmap::Cutter ball;
  ball.diameter_mm = 6.0;
  const CuspResult r = cuspmap::scallop_on_plane(ball, 7.0, 0.0);
  REQUIRE(r.limit == cuspmap::CuspLimit::PassesDoNotOverlap);
  // The strip stands at least as high as the ball's rim: R (geometry of the section).
  REQUIRE_NEAR(r.scallop_um, 3000.0, 1e-9);
}

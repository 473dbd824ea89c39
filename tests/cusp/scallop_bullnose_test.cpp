// Bull-nose and flat end-mill cusp on a level floor: DESIGN.md closed form, its inverse, and
// agreement with the general sloped-plane solver at slope 0.
#include "cusp/scallop_bullnose.h"

#include <cmath>

#include "cusp/scallop_ball.h"
#include "cusp/scallop_plane.h"
#include "test_support.h"

TEST_CASE("scallop_bullnose_mm: no cusp while the flat faces overlap", "[cusp]") {
  // DESIGN.md "Closed forms": h = 0 while s <= 2(R - rc).
  REQUIRE(cuspmap::scallop_bullnose_mm(5.0, 1.0, 8.0) == 0.0);
  REQUIRE(cuspmap::scallop_bullnose_mm(5.0, 1.0, 0.1) == 0.0);
  REQUIRE(cuspmap::scallop_bullnose_mm(5.0, 1.0, 8.0001) > 0.0);
  // A flat end mill (rc = 0) leaves none for any s < D.
  REQUIRE(cuspmap::scallop_bullnose_mm(5.0, 0.0, 9.99) == 0.0);
}

TEST_CASE("scallop_bullnose_mm: corner-arc formula beyond the flat width", "[cusp]") {
  // DESIGN.md: h = rc - sqrt(rc^2 - (s/2 - (R - rc))^2), evaluated directly here.
  for (double s : {8.2, 8.5, 9.0, 9.9, 10.0}) {
    const double w = s / 2.0 - 4.0;
    CAPTURE(s);
    REQUIRE_NEAR(cuspmap::scallop_bullnose_mm(5.0, 1.0, s), 1.0 - std::sqrt(1.0 - w * w), 1e-12);
  }
  // rc = R is a ball: the same as the handbook ball formula.
  REQUIRE_NEAR(cuspmap::scallop_bullnose_mm(3.0, 3.0, 0.5), cuspmap::scallop_ball_mm(3.0, 0.5),
               1e-15);
}

TEST_CASE("bullnose_stepover_for_scallop_mm: inverse of the corner-arc formula", "[cusp]") {
  REQUIRE_NEAR(cuspmap::bullnose_stepover_for_scallop_mm(5.0, 1.0, 0.0), 8.0, 1e-12);
  REQUIRE_NEAR(cuspmap::bullnose_stepover_for_scallop_mm(5.0, 1.0, 1.0), 10.0, 1e-12);
  for (double h : {1e-6, 0.01, 0.5}) {
    CAPTURE(h);
    const double s = cuspmap::bullnose_stepover_for_scallop_mm(5.0, 1.0, h);
    REQUIRE_NEAR(cuspmap::scallop_bullnose_mm(5.0, 1.0, s), h, 1e-12);
  }
}

TEST_CASE("scallop_bullnose: closed form equals the plane solver at slope 0", "[cusp]") {
  cuspmap::Cutter c;
  c.shape = cuspmap::CutterShape::BullNose;
  c.diameter_mm = 10.0;
  c.corner_radius_mm = 1.0;
  c.dish_deg = 2.0;  // the dish must not change the swept section
  for (double s : {8.5, 9.0, 9.9}) {
    CAPTURE(s);
    const cuspmap::CuspResult a = cuspmap::scallop_bullnose(5.0, 1.0, s);
    const cuspmap::CuspResult b = cuspmap::scallop_on_plane(c, s, 0.0);
    REQUIRE_NEAR(a.scallop_um, b.scallop_um, 1e-9 * a.scallop_um);
    REQUIRE_NEAR(a.stats.ra_um, b.stats.ra_um, 1e-9 * a.stats.ra_um);
    REQUIRE_NEAR(a.stats.rq_um, b.stats.rq_um, 1e-9 * a.stats.rq_um);
  }
}

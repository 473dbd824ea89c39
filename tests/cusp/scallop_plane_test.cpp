// Sloped-plane solver: the flat end mill's saw-tooth, mirror symmetry of the slope, the limits.
#include "cusp/scallop_plane.h"

#include <cmath>

#include "cusp/cusp_setups.h"
#include "test_support.h"

namespace {
using cuspmap::test::make_cutter;
}  // namespace

TEST_CASE("scallop_on_plane: a flat end mill on a slope leaves a saw-tooth s sin(a)", "[cusp]") {
  // Geometry derived from first principles (the rim steps s tan(a) vertically between passes,
  // s sin(a) along the normal); a triangular profile has Ra = h/4 and Rq = h/(2 sqrt 3)
  // (Boothroyd & Knight, ideal roughness of a sharp-cornered tool: Ra = Rt/4).
  const cuspmap::Cutter flat = make_cutter(cuspmap::CutterShape::Flat, 10.0, 0.0);
  for (double slope : {5.0, 20.0, 45.0, 70.0}) {
    const double s = 2.0;
    const double h_um = s * std::sin(slope * M_PI / 180.0) * 1000.0;
    const cuspmap::CuspResult r = cuspmap::scallop_on_plane(flat, s, slope);
    CAPTURE(slope);
    REQUIRE_NEAR(r.scallop_um, h_um, 1e-9 * h_um);
    REQUIRE_NEAR(r.stats.ra_um, h_um / 4.0, 1e-6 * h_um);
    REQUIRE_NEAR(r.stats.rq_um, h_um / (2.0 * std::sqrt(3.0)), 1e-6 * h_um);
    REQUIRE(r.side_forms_cusp);
    REQUIRE_FALSE(r.profile_overhangs);
  }
}

TEST_CASE("scallop_on_plane: the sign of the slope does not matter", "[cusp]") {
  const cuspmap::Cutter bull = make_cutter(cuspmap::CutterShape::BullNose, 12.0, 2.0);
  const cuspmap::CuspResult up = cuspmap::scallop_on_plane(bull, 3.0, 25.0);
  const cuspmap::CuspResult down = cuspmap::scallop_on_plane(bull, 3.0, -25.0);
  REQUIRE(up.scallop_um == down.scallop_um);
  REQUIRE(up.stats.ra_um == down.stats.ra_um);
}

TEST_CASE("scallop_on_plane: cusp grows with the stepover", "[cusp]") {
  const cuspmap::Cutter bull = make_cutter(cuspmap::CutterShape::BullNose, 10.0, 1.0);
  double last = 0.0;
  for (double s = 0.25; s < 10.0; s += 0.25) {
    const double h = cuspmap::scallop_on_plane(bull, s, 20.0).scallop_um;
    CAPTURE(s);
    REQUIRE(h > last);
    last = h;
  }
}

TEST_CASE("scallop_on_plane: a bull-nose on a slope forms small cusps with its corner", "[cusp]") {
  // Both neighbouring contacts lie on the uphill corner arc; while the cusp stays on that arc
  // the circle formula with radius rc and contact spacing s / cos(a) holds (as for a ball).
  const cuspmap::Cutter bull = make_cutter(cuspmap::CutterShape::BullNose, 10.0, 1.0);
  const double slope = 30.0, s = 0.3;
  const double c = s / std::cos(slope * M_PI / 180.0);
  const double h_um = (1.0 - std::sqrt(1.0 - c * c / 4.0)) * 1000.0;
  REQUIRE_NEAR(cuspmap::scallop_on_plane(bull, s, slope).scallop_um, h_um, 1e-9 * h_um);
}

TEST_CASE("scallop_on_plane: no overlap at and beyond one diameter", "[cusp]") {
  const cuspmap::Cutter flat = make_cutter(cuspmap::CutterShape::Flat, 6.0, 0.0);
  REQUIRE(cuspmap::scallop_on_plane(flat, 6.0, 0.0).limit ==
          cuspmap::CuspLimit::PassesDoNotOverlap);
  REQUIRE(cuspmap::scallop_on_plane(flat, 5.9, 0.0).limit == cuspmap::CuspLimit::None);
  const cuspmap::Cutter bull = make_cutter(cuspmap::CutterShape::BullNose, 10.0, 1.0);
  const cuspmap::CuspResult r = cuspmap::scallop_on_plane(bull, 12.0, 0.0);
  REQUIRE(r.limit == cuspmap::CuspLimit::PassesDoNotOverlap);
  REQUIRE_NEAR(r.scallop_um, 1000.0, 1e-9);  // lower bound: the corner height rc
}

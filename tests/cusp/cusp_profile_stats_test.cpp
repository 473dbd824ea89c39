// Ideal-profile statistics: the parabolic constants, exact semicircle values, walls.
#include "cusp/cusp_profile_stats.h"

#include <cmath>
#include <numbers>

#include "test_support.h"

TEST_CASE("parabolic_cusp_stats: Ra = 4h/(9 sqrt 3), Rq = 2h/(3 sqrt 5), Rz = h", "[cusp]") {
  // DESIGN.md "Closed forms" (ideal periodic cusp profile); the shop rule Ra ~= h/4
  // (common practice, no source) is its rounded form.
  const cuspmap::ProfileStats s = cuspmap::parabolic_cusp_stats(10.0);
  REQUIRE_NEAR(s.ra_um, 40.0 / (9.0 * std::sqrt(3.0)), 1e-12);
  REQUIRE_NEAR(s.rq_um, 20.0 / (3.0 * std::sqrt(5.0)), 1e-12);
  REQUIRE(s.rz_um == 10.0);
  REQUIRE_NEAR(s.ra_um, 10.0 / 4.0, 0.03 * 10.0 / 4.0);
}

TEST_CASE("parabolic_cusp_stats: arcs with flats match numeric integration", "[cusp]") {
  // Parabolic arcs over a fraction q of the period, flat elsewhere: midpoint sums on 2e5 cells.
  for (double q : {0.2, 0.5, 0.9}) {
    const int n = 200000;
    const double h = 1.0;
    double mean = 0.0;
    auto z = [&](double x) {  // one period [0, 1): arc centred at 0.5 of width q
      const double t = (x - 0.5) / (0.5 * q);
      return std::abs(t) <= 1.0 ? h * t * t : 0.0;
    };
    for (int i = 0; i < n; ++i) mean += z((i + 0.5) / n) / n;
    double ra = 0.0, rq = 0.0;
    for (int i = 0; i < n; ++i) {
      const double d = z((i + 0.5) / n) - mean;
      ra += std::abs(d) / n;
      rq += d * d / n;
    }
    const cuspmap::ProfileStats s = cuspmap::parabolic_cusp_stats(h, q);
    CAPTURE(q);
    REQUIRE_NEAR(s.ra_um, ra, 1e-6);
    REQUIRE_NEAR(s.rq_um, std::sqrt(rq), 1e-6);
  }
}

TEST_CASE("arc_cusp_stats: semicircular marks in closed form", "[cusp]") {
  // Semicircle of radius rho spanning the period 2 rho (derived here from first principles):
  // mean = rho (1 - pi/4), Rq = rho sqrt(2/3 - pi^2/16).
  const double rho = 2.0;
  const cuspmap::ProfileStats s = cuspmap::arc_cusp_stats(rho, rho, 0.0);
  const double pi = std::numbers::pi;
  REQUIRE_NEAR(s.rq_um, rho * std::sqrt(2.0 / 3.0 - pi * pi / 16.0) * 1000.0, 1e-9);
  REQUIRE_NEAR(s.rz_um, rho * 1000.0, 1e-9);
}

TEST_CASE("arc_cusp_stats: small arcs approach the parabolic constants", "[cusp]") {
  const double rho = 3.0, w = 0.003;
  const cuspmap::ProfileStats s = cuspmap::arc_cusp_stats(rho, w, 0.0);
  const cuspmap::ProfileStats p = cuspmap::parabolic_cusp_stats(s.rz_um);
  REQUIRE_NEAR(s.ra_um, p.ra_um, 1e-5 * p.ra_um);
  REQUIRE_NEAR(s.rq_um, p.rq_um, 1e-5 * p.rq_um);
}

TEST_CASE("periodic_profile_stats: a wall and a ramp form a triangle", "[cusp]") {
  // Triangular profile of height h: Ra = h/4, Rq = h/(2 sqrt 3) (Boothroyd & Knight: a
  // sharp-cornered tool's ideal Ra = Rt/4), whether the rise is a wall or a slope.
  const double h = 0.2;
  std::vector<cuspmap::CuspArcPiece> pieces;
  pieces.push_back({0.0, 0.0, 0.0, h, {}});  // wall at u = 0
  pieces.push_back({0.0, 1.0, h, 0.0, [h](double u) { return h * (1.0 - u); }});
  for (double kn : {0.0, 0.3}) {
    const cuspmap::ProfileStats s = cuspmap::periodic_profile_stats(pieces, 1.0, kn);
    CAPTURE(kn);
    REQUIRE_NEAR(s.ra_um, h / 4.0 * 1000.0, 1e-9);
    REQUIRE_NEAR(s.rq_um, h / (2.0 * std::sqrt(3.0)) * 1000.0, 1e-9);
    REQUIRE_NEAR(s.rz_um, h * 1000.0, 1e-12);
  }
}

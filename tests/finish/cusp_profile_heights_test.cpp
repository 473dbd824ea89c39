// Tests of the closed-form cusp-profile heights against values derived here independently:
// the exact circle profile integrated numerically (composite Simpson), the handbook scallop
// formula, and the parabolic limits Sv = h/3, Sp = 2h/3, Ra = 4h/(9 sqrt 3).
#include "finish/cusp_profile_heights.h"

#include <cmath>
#include <functional>
#include <numbers>

#include "cusp/cusp_profile_stats.h"
#include "cusp/scallop_bullnose.h"
#include "test_support.h"

namespace cuspmap {
namespace {

// Simpson intervals for the reference quadrature: the integrands are smooth on each piece, so
// the error is ~(h/n)^4 relative, far below the 1e-9 relative tolerance used with it.
constexpr int kSimpsonIntervals = 20000;
// Relative agreement demanded between closed form and quadrature (quadrature error ~1e-14;
// the crossing point of |z - m| costs the quadrature some accuracy, see below).
constexpr double kQuadratureRel = 1e-7;

double simpson(const std::function<double(double)>& f, double a, double b) {
  const double h = (b - a) / kSimpsonIntervals;
  double sum = f(a) + f(b);
  for (int k = 1; k < kSimpsonIntervals; ++k) sum += f(a + k * h) * (k % 2 ? 4.0 : 2.0);
  return sum * h / 3.0;
}

// Reference heights of a profile z(y) on one half period [0, L], from quadrature (um).
// Ra integrates |z - m| split at the crossing found by bisection, so Simpson sees smooth pieces.
SurfaceHeights reference(const std::function<double(double)>& z_mm, double half_period_mm) {
  const double mean = simpson(z_mm, 0.0, half_period_mm) / half_period_mm;
  double lo = 0.0, hi = half_period_mm;  // z is non-decreasing in y for every profile tested
  for (int k = 0; k < 200; ++k) {
    const double mid = 0.5 * (lo + hi);
    (z_mm(mid) < mean ? lo : hi) = mid;
  }
  const double cross = 0.5 * (lo + hi);
  const double below = simpson([&](double y) { return mean - z_mm(y); }, 0.0, cross);
  const double above = simpson([&](double y) { return z_mm(y) - mean; }, cross, half_period_mm);
  SurfaceHeights h;
  h.sz_um = (z_mm(half_period_mm) - z_mm(0.0)) * 1000.0;
  h.sv_um = (mean - z_mm(0.0)) * 1000.0;
  h.sp_um = h.sz_um - h.sv_um;
  h.ra_um = (below + above) / half_period_mm * 1000.0;
  h.sa_um = h.ra_um;
  return h;
}

void require_same(const SurfaceHeights& got, const SurfaceHeights& want) {
  const double tol = kQuadratureRel * std::max(want.sz_um, 1e-12);
  REQUIRE_NEAR(got.sz_um, want.sz_um, tol);
  REQUIRE_NEAR(got.sv_um, want.sv_um, tol);
  REQUIRE_NEAR(got.sp_um, want.sp_um, tol);
  REQUIRE_NEAR(got.ra_um, want.ra_um, tol);
  REQUIRE_NEAR(got.sa_um, want.ra_um, tol);
}

Cutter make(CutterShape shape, double diameter_mm, double corner_mm = 0.0) {
  Cutter c;
  c.shape = shape;
  c.diameter_mm = diameter_mm;
  c.corner_radius_mm = corner_mm;
  return c;
}

}  // namespace

TEST_CASE("cusp_profile_heights: ball equals the exact circle profile integrated numerically",
          "[finish]") {
  // Exact circle z(y) = R - sqrt(R^2 - y^2) (handbook ball-cusp geometry), derived here by
  // quadrature rather than from the closed form under test.
  for (const double s : {0.05, 0.6, 2.0, 5.9}) {
    CAPTURE(s);
    const double big_r = 3.0;
    const auto z = [&](double y) { return big_r - std::sqrt(big_r * big_r - y * y); };
    const SurfaceHeights got = cusp_profile_heights(make(CutterShape::Ball, 6.0), s);
    require_same(got, reference(z, 0.5 * s));
    // Handbook scallop height h = R - sqrt(R^2 - (s/2)^2).
    REQUIRE_NEAR(got.sz_um, (big_r - std::sqrt(big_r * big_r - 0.25 * s * s)) * 1000.0, 1e-9);
  }
}

TEST_CASE("cusp_profile_heights: parabolic limit Sv = h/3, Sp = 2h/3, Sz = h, Ra = 4h/(9 sqrt 3)",
          "[finish]") {
  // Parabola z = y^2/(2R) over [-s/2, s/2]: mean s^2/(24R) = h/3 with h = s^2/(8R); its Ra is
  // 4h/(9 sqrt 3) (DESIGN.md "Closed forms", ideal periodic cusp profile). The exact circle
  // differs from the parabola by O(h/R) relative; at s = 0.1 mm, R = 5 mm, h/R = 5e-5.
  const double big_r = 5.0, s = 0.1;
  const SurfaceHeights got = cusp_profile_heights(make(CutterShape::Ball, 2.0 * big_r), s);
  const double h = got.sz_um;
  const double rel = 1e-4;  // a few h/R: the circle's departure from the parabola
  REQUIRE_NEAR(h, s * s / (8.0 * big_r) * 1000.0, rel * h);
  REQUIRE_NEAR(got.sv_um, h / 3.0, rel * h);
  REQUIRE_NEAR(got.sp_um, 2.0 * h / 3.0, rel * h);
  REQUIRE_NEAR(got.ra_um, 4.0 * h / (9.0 * std::sqrt(3.0)), rel * h);
  // The exact circle lies above the parabola y^2/(2R) (z = y^2/(2R) + y^4/(8R^3) + ...), so its
  // mean is slightly more than h_parabola/3: the closed form must show that sign.
  REQUIRE(got.sv_um > s * s / (24.0 * big_r) * 1000.0);
}

TEST_CASE("cusp_profile_heights: bull-nose is level within its flat, then arcs of the corner",
          "[finish]") {
  const double big_r = 5.0, rc = 1.0;
  Cutter cutter = make(CutterShape::BullNose, 2.0 * big_r, rc);
  // s <= 2(R - rc): no cusp (DESIGN.md "Closed forms", bull-nose).
  const SurfaceHeights none = cusp_profile_heights(cutter, 2.0 * (big_r - rc));
  REQUIRE(none.sz_um == 0.0);
  REQUIRE(none.ra_um == 0.0);
  for (const double s : {8.4, 9.0, 10.0}) {
    CAPTURE(s);
    const double w = big_r - rc;
    const auto z = [&](double y) {
      const double u = std::max(0.0, y - w);
      return rc - std::sqrt(rc * rc - u * u);
    };
    const SurfaceHeights got = cusp_profile_heights(cutter, s);
    require_same(got, reference(z, 0.5 * s));
    // DESIGN.md: h = rc - sqrt(rc^2 - (s/2 - (R - rc))^2).
    const double u = 0.5 * s - w;
    REQUIRE_NEAR(got.sz_um, (rc - std::sqrt(rc * rc - u * u)) * 1000.0, 1e-9);
    // A dish does not move the level band: the rim of the flat part, R - rc, is lowest.
    cutter.dish_deg = 2.0;
    const SurfaceHeights dished = cusp_profile_heights(cutter, s);
    REQUIRE(dished.sz_um == got.sz_um);
    REQUIRE(dished.sv_um == got.sv_um);
    cutter.dish_deg = 0.0;
  }
}

TEST_CASE("cusp_profile_heights: tilted flat end is the circle of R scaled by tan(tilt)",
          "[finish]") {
  // Tilt model (derived geometry, docs/finishing.md): the leading rim at lateral offset y sits
  // tan(tau) sqrt(R^2 - y^2) below the axis, so the cusp is tan(tau) (R - sqrt(R^2 - (s/2)^2)).
  const double big_r = 6.35, s = 0.508, tilt_deg = 0.05;
  Cutter flat = make(CutterShape::Flat, 2.0 * big_r);
  flat.dish_deg = 1.0;
  flat.tilt_deg = tilt_deg;
  const double t = std::tan(tilt_deg * std::numbers::pi / 180.0);
  const SurfaceHeights got = cusp_profile_heights(flat, s);
  REQUIRE_NEAR(got.sz_um, t * (big_r - std::sqrt(big_r * big_r - 0.25 * s * s)) * 1000.0, 1e-12);
  const auto z = [&](double y) { return t * (big_r - std::sqrt(big_r * big_r - y * y)); };
  require_same(got, reference(z, 0.5 * s));
  // The sign of the tilt does not matter (one lowest rim point either way).
  flat.tilt_deg = -tilt_deg;
  REQUIRE_NEAR(cusp_profile_heights(flat, s).sz_um, got.sz_um, 1e-15);
}

TEST_CASE("cusp_profile_heights: flat end without tilt leaves no cross-feed cusp", "[finish]") {
  // DESIGN.md "Closed forms": flat end, vertical axis, s < D: no cross-feed cusp (a dish makes
  // the rim the lowest point, and the rim sweeps a level floor).
  Cutter flat = make(CutterShape::Flat, 10.0);
  flat.dish_deg = 1.5;
  const SurfaceHeights got = cusp_profile_heights(flat, 4.0);
  REQUIRE(got.sz_um == 0.0);
  REQUIRE(got.sv_um == 0.0);
  REQUIRE(got.ra_um == 0.0);
  REQUIRE(cusp_profile(flat).kind == CuspProfileKind::Level);
}

TEST_CASE("cusp_profile_heights: agrees with cusp/ (scallop and ideal-profile Ra)", "[finish]") {
  // cusp/ computes the same profile another way (graded Gauss-Legendre over the arcs):
  // arc_cusp_stats(rho, half chord, flat width) and the bull-nose scallop formula.
  const double big_r = 5.0, rc = 1.5;
  Cutter bull = make(CutterShape::BullNose, 2.0 * big_r, rc);
  for (const double s : {7.5, 8.5, 9.5}) {
    CAPTURE(s);
    const SurfaceHeights got = cusp_profile_heights(bull, s);
    const double w = big_r - rc;
    const ProfileStats ref = arc_cusp_stats(rc, 0.5 * s - w, 2.0 * w);
    REQUIRE_NEAR(got.sz_um, scallop_bullnose_mm(big_r, rc, s) * 1000.0, 1e-9);
    REQUIRE_NEAR(got.sz_um, ref.rz_um, 1e-9);
    REQUIRE_NEAR(got.ra_um, ref.ra_um, 1e-9 * ref.rz_um + 1e-12);
  }
  const SurfaceHeights ball = cusp_profile_heights(make(CutterShape::Ball, 6.0), 0.8);
  const ProfileStats ref = arc_cusp_stats(3.0, 0.4, 0.0);
  REQUIRE_NEAR(ball.ra_um, ref.ra_um, 1e-9 * ref.rz_um);
}

}  // namespace cuspmap

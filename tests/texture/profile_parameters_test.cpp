// Profile parameters against analytic profiles with known values.
// Sources: Todhunter, Leach, Lawes & Blateyron (2020), Surf. Topogr.: Metrol. Prop. 8 015010,
// mathematical reference values for software (sine: Ra = 2A/pi, Rq = A/sqrt 2, Rku = 1.5;
// triangle: Ra = A/2, Rq = A/sqrt 3, Rku = 1.8); ideal cusp (parabolic arcs, DESIGN.md closed
// forms): Ra = 4h/(9 sqrt 3), Rq = 2h/(3 sqrt 5), Rz = h.
#include "texture/profile_parameters.h"

#include <cmath>
#include <numbers>
#include <vector>

#include "test_support.h"
#include "texture/mean_element_width.h"
#include "texture/remove_least_squares_line.h"

using namespace cuspmap;

namespace {

constexpr double kPi = std::numbers::pi;
// Samples per period: the midpoint rule's error on |sin| is ~(2 pi / N)^2 / 24 = 4e-7 of the
// value, inside the 5 significant figures the reference values are checked to.
constexpr int kPerPeriod = 2000;
// Five significant figures (Todhunter et al. 2020 ask software to agree to this).
constexpr double kFiveFigures = 5e-6;

std::vector<double> periodic(int periods, double (*shape)(double)) {
  std::vector<double> z(static_cast<size_t>(periods * kPerPeriod));
  for (size_t i = 0; i < z.size(); ++i) z[i] = shape((static_cast<double>(i) + 0.5) / kPerPeriod);
  return z;
}

double sine(double u) { return 2.0 * std::sin(2.0 * kPi * u); }  // A = 2 um
double triangle(double u) {                                      // A = 2 um, zero mean
  const double f = u - std::floor(u);
  return 2.0 * (f < 0.5 ? 4.0 * f - 1.0 : 3.0 - 4.0 * f);
}
double cusp(double u) {  // h = 10 um parabolic arcs, before mean removal
  const double f = u - std::floor(u) - 0.5;
  return 10.0 * 4.0 * f * f;
}

}  // namespace

TEST_CASE("profile_parameters: sine reference values (Todhunter et al. 2020)", "[texture]") {
  const double spacing = 0.1 / kPerPeriod;  // wavelength 0.1 mm
  const auto z = periodic(10, sine);
  const ProfileParameters p = profile_parameters(z, spacing, 5, 0.2);
  const double a = 2.0;
  REQUIRE_NEAR(p.a_um, 2.0 * a / kPi, kFiveFigures * p.a_um);
  REQUIRE_NEAR(p.q_um, a / std::sqrt(2.0), kFiveFigures * p.q_um);
  REQUIRE_NEAR(p.ku, 1.5, kFiveFigures * 1.5);
  REQUIRE_NEAR(p.sk, 0.0, 1e-9);
  REQUIRE_NEAR(p.z_um, 2.0 * a, kFiveFigures * 2.0 * a);
  REQUIRE_NEAR(p.t_um, 2.0 * a, kFiveFigures * 2.0 * a);
  REQUIRE(p.sm_defined);
  REQUIRE_NEAR(p.sm_mm, 0.1, kFiveFigures * 0.1);  // RSm = wavelength
}

TEST_CASE("profile_parameters: triangle wave reference values (Todhunter et al. 2020)",
          "[texture]") {
  const auto z = periodic(10, triangle);
  const ProfileParameters p = profile_parameters(z, 0.1 / kPerPeriod, 5, 0.2);
  REQUIRE_NEAR(p.a_um, 1.0, kFiveFigures);                   // A/2
  REQUIRE_NEAR(p.q_um, 2.0 / std::sqrt(3.0), kFiveFigures);  // A/sqrt 3
  REQUIRE_NEAR(p.ku, 1.8, kFiveFigures * 1.8);               // 9/5 for a uniform distribution
  REQUIRE_NEAR(p.sm_mm, 0.1, kFiveFigures * 0.1);
}

TEST_CASE("profile_parameters: ideal cusp profile Ra = 4h/(9 sqrt 3)", "[texture]") {
  // Parabolic arcs of height h = 10 um: Ra = 4h/(9 sqrt 3), Rq = 2h/(3 sqrt 5), Rz = h
  // (DESIGN.md ideal periodic cusp profile; integral of |u^2 - 1/3| over [0, 1] = 4/(9 sqrt 3)).
  auto z = periodic(10, cusp);
  remove_least_squares_line(z);  // the mean line of a periodic profile over whole periods
  const ProfileParameters p = profile_parameters(z, 0.1 / kPerPeriod, 5, 0.2);
  const double h = 10.0;
  REQUIRE_NEAR(p.a_um, 4.0 * h / (9.0 * std::sqrt(3.0)), kFiveFigures * p.a_um);
  REQUIRE_NEAR(p.q_um, 2.0 * h / (3.0 * std::sqrt(5.0)), kFiveFigures * p.q_um);
  // Samples sit half a sample off the cusp tips: Rz falls short by about 2h / kPerPeriod.
  REQUIRE_NEAR(p.z_um, h, 2.0 * h / kPerPeriod);
  REQUIRE_NEAR(p.sm_mm, 0.1, kFiveFigures * 0.1);  // RSm = stepover
}

TEST_CASE("profile_parameters: Rp, Rv, Rz are means over sampling lengths (ISO 4288 §5)",
          "[texture]") {
  // Sampling length k holds one spike of k + 1 um up and one of k + 1 um down.
  //   k:   0      1      2
  //       +1/-1  +2/-2  +3/-3   -> Rp = Rv = 2, Rz = 4, Rt = 6
  std::vector<double> z(30, 0.0);
  for (int k = 0; k < 3; ++k) {
    z[static_cast<size_t>(10 * k + 3)] = k + 1.0;
    z[static_cast<size_t>(10 * k + 6)] = -(k + 1.0);
  }
  const ProfileParameters p = profile_parameters(z, 0.01, 3, 0.1);
  REQUIRE_NEAR(p.p_um, 2.0, 1e-12);
  REQUIRE_NEAR(p.v_um, 2.0, 1e-12);
  REQUIRE_NEAR(p.z_um, 4.0, 1e-12);
  REQUIRE_NEAR(p.t_um, 6.0, 1e-12);
}

TEST_CASE("profile_parameters: a flat profile has no shape and no elements", "[texture]") {
  const std::vector<double> z(100, 0.0);
  const ProfileParameters p = profile_parameters(z, 0.01, 1, 1.0);
  REQUIRE_FALSE(p.shape_defined);
  REQUIRE_FALSE(p.sm_defined);
  REQUIRE(p.sk == 0.0);
  REQUIRE(p.ku == 0.0);
  REQUIRE(p.sm_mm == 0.0);
}

TEST_CASE("mean_element_width: small ripples under 10 % of Rz join their neighbours", "[texture]") {
  // ISO 4287:1997 §3.1.9 height discrimination: a 0.1 mm, 2 um sine carrying a 0.01 mm ripple
  // of 0.3 um (steeper than the sine at its zeros, so it adds crossings there; under 10 % of
  // Rz = 4.6 um) still gives RSm = 0.1 mm.
  std::vector<double> z(10000);
  for (size_t i = 0; i < z.size(); ++i) {
    const double x = (static_cast<double>(i) + 0.5) * 1e-4;
    z[i] = 2.0 * std::sin(2 * kPi * x / 0.1) + 0.3 * std::sin(2 * kPi * x / 0.01);
  }
  const auto with = mean_element_width(z, 1e-4, 0.46, 0.002);
  REQUIRE(with.has_value());
  REQUIRE_NEAR(*with, 0.1, 1e-3);
  // Without discrimination the ripple's extra crossings near the zeros shorten the mean width.
  const auto without = mean_element_width(z, 1e-4, 0.0, 0.0);
  REQUIRE(without.has_value());
  REQUIRE(*without < 0.09);
}

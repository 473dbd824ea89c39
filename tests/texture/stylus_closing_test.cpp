// Tests of the stylus-tip closing against closed forms (derived geometry) and its defining
// properties (ISO 16610-41: a closing is extensive and idempotent).
#include "texture/stylus_closing.h"

#include <catch2/catch.hpp>
#include <cmath>
#include <vector>

#include "test_support.h"

namespace cuspmap {
namespace {

constexpr double kPi = 3.14159265358979323846;

// Samples f(x_um) at n points spaced dx_um, x from -x0_um.
template <class F>
std::vector<double> sample(F f, int n, double dx_um, double x0_um) {
  std::vector<double> z(n);
  for (int i = 0; i < n; ++i) z[i] = f(i * dx_um - x0_um);
  return z;
}

}  // namespace

TEST_CASE("stylus_closing: V-groove filled to r (sec(theta) - 1)", "[texture]") {
  // Derived: a disk of radius r in a V of flank slope m = tan(theta) rests with its centre
  // r sqrt(1 + m^2) above the vertex; the closing's bottom is r (sqrt(1 + m^2) - 1) above it and
  // the closing leaves the flanks beyond the contact |x| = r sin(theta).
  const double r_um = 5.0, m = 1.0, dx_um = 0.05;
  const int n = 801;  // x in [-20, 20] um, vertex at sample 400
  const auto z = sample([&](double x) { return m * std::abs(x); }, n, dx_um, 20.0);
  const std::vector<double> c = stylus_closing(z, dx_um * 1e-3, r_um);
  REQUIRE_NEAR(c[400], r_um * (std::sqrt(1.0 + m * m) - 1.0), 2e-3);
  // Inside the contact the closing is the tip's lower circle (derived).
  const double centre = r_um * std::sqrt(1.0 + m * m);
  for (int i = 400; i < 400 + 60; ++i) {  // |x| <= 3 um < r sin 45 deg = 3.54 um
    CAPTURE(i);
    const double x = (i - 400) * dx_um;
    REQUIRE_NEAR(c[i], centre - std::sqrt(r_um * r_um - x * x), 2e-3);
  }
  // Derived: tips sit only over samples, so off the exact tangency the envelope is above the
  // flank by at most (dx/2)^2 / (2 r) (1 + m^2) ~ 1e-4 um.
  for (int i = 400 + 80; i < 760; ++i) {  // |x| >= 4 um: on the flank
    CAPTURE(i);
    REQUIRE_NEAR(c[i], z[i], 1e-3);
  }
}

TEST_CASE("stylus_closing: circular crests bridged where the tip touches both", "[texture]") {
  // Derived: crests are circles of radius R centred at (k lambda, -R); a tip of radius r resting
  // in the sharp valley at lambda/2 touches both circles, its centre at distance R + r from each:
  // bottom = -R + sqrt((R + r)^2 - (lambda/2)^2) - r; the valley itself is at
  // -R + sqrt(R^2 - (lambda/2)^2).
  const double R = 50.0, lambda = 40.0, dx_um = 0.05;
  auto crest = [&](double x) {
    const double d = x - lambda * std::round(x / lambda);
    return std::sqrt(R * R - d * d) - R;
  };
  const int n = 4001;  // x in [-100, 100] um; valleys at +-20, +-60 um; sample 2400 is x = 20
  const auto z = sample(crest, n, dx_um, 100.0);
  for (double r : kNominalTipRadiiUm) {
    CAPTURE(r);
    const std::vector<double> c = stylus_closing(z, dx_um * 1e-3, r);
    const double bottom = -R + std::sqrt((R + r) * (R + r) - lambda * lambda / 4.0) - r;
    REQUIRE_NEAR(c[2400], bottom, 2e-3);
    REQUIRE(c[2400] > z[2400] + 0.1);      // the tip does not reach the valley
    REQUIRE_NEAR(c[2000], z[2000], 1e-9);  // the crest top is untouched
  }
}

TEST_CASE("stylus_closing: a sine whose valleys are wider than the tip passes", "[texture]") {
  // Derived: z = A sin(2 pi x / lambda) has its tightest valley radius lambda^2 / (4 pi^2 A);
  // a tip smaller than that touches the profile everywhere, so the closing is the profile.
  // A tip larger than that radius bridges the valley: the closing rises there.
  const double A = 1.0, lambda = 100.0, dx_um = 0.1;  // valley radius 253 um
  const int n = 3001;
  const auto z =
      sample([&](double x) { return A * std::sin(2 * kPi * x / lambda); }, n, dx_um, 0.0);
  const std::vector<double> c = stylus_closing(z, dx_um * 1e-3, 10.0);
  // Away from the ends (one tip radius = 100 samples), where the element is one-sided; within
  // the sampling error of the tip positions (above).
  for (int i = 100; i < n - 100; ++i) {
    CAPTURE(i);
    REQUIRE_NEAR(c[i], z[i], 1e-3);
  }
  const double tight = 20.0;
  const auto z2 = sample([&](double x) { return 4.0 * std::sin(2 * kPi * x / tight); }, n, dx_um,
                         0.0);  // A = 4 um: valley radius 2.53 um < 10 um tip
  const std::vector<double> c2 = stylus_closing(z2, dx_um * 1e-3, 10.0);
  const int valley = 150;  // x = 15 um = 3/4 lambda, sin = -1
  REQUIRE(c2[valley] > z2[valley] + 0.5);
}

TEST_CASE("stylus_closing: extensive and idempotent", "[texture]") {
  // ISO 16610-41 (morphological filters, from memory: properties of a closing): a closing never
  // lowers the profile and closing twice changes nothing.
  std::vector<double> z(500);
  unsigned s = 12345u;
  for (double& v : z) {
    s = s * 1103515245u + 12345u;
    v = static_cast<double>((s >> 8) % 1000) * 1e-3;  // 0 .. 1 um, spacing 0.2 um
  }
  const std::vector<double> c = stylus_closing(z, 2e-4, 2.0);
  const std::vector<double> cc = stylus_closing(c, 2e-4, 2.0);
  bool raised = false;
  for (size_t i = 0; i < z.size(); ++i) {
    CAPTURE(i);
    REQUIRE(c[i] >= z[i]);
    REQUIRE_NEAR(cc[i], c[i], 1e-12);
    raised = raised || c[i] > z[i] + 1e-6;
  }
  REQUIRE(raised);
  // A tip smaller than one sample step has no neighbour to bridge with: the profile passes.
  REQUIRE(stylus_closing(z, 0.01, 5.0) == z);
}

}  // namespace cuspmap

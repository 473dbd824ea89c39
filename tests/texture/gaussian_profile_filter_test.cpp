// ISO 16610-21 Gaussian profile filter: 50 % transmission at the cut-off, the transmission curve,
// unit area of the weighting function, end handling.
// Source: ISO 16610-21:2011 §4.2 (s(x) = exp(-pi (x/(alpha lc))^2)/(alpha lc), alpha =
// sqrt(ln 2/pi), amplitude transmission of the mean line exp(-pi (alpha lc/lambda)^2)).
#include "texture/gaussian_profile_filter.h"

#include <cmath>
#include <numbers>
#include <vector>

#include "test_support.h"

using namespace cuspmap;

namespace {

constexpr double kPi = std::numbers::pi;

// Amplitude of the mean line of a unit sine in the middle third of the profile (away from ends).
double mean_line_amplitude(double wavelength_mm, double cutoff_mm, double spacing_mm) {
  const size_t n = static_cast<size_t>(std::lround(20.0 * cutoff_mm / spacing_mm));
  std::vector<double> z(n);
  for (size_t i = 0; i < n; ++i)
    z[i] = std::sin(2 * kPi * static_cast<double>(i) * spacing_mm / wavelength_mm);
  const std::vector<double> w = gaussian_profile_filter(z, spacing_mm, cutoff_mm);
  double amp = 0.0;
  for (size_t i = n / 3; i < 2 * n / 3; ++i) amp = std::max(amp, std::abs(w[i]));
  return amp;
}

}  // namespace

TEST_CASE("gaussian_profile_filter: 50 % transmission at the cut-off (ISO 16610-21)", "[texture]") {
  // 200 samples per cut-off: the sampled kernel's sum matches the integral to ~1e-12, the
  // peak-picking error of the amplitude is (pi/200)^2/2 ~ 1.2e-4.
  REQUIRE_NEAR(mean_line_amplitude(0.8, 0.8, 0.004), 0.5, 2e-4);
  REQUIRE_NEAR(gaussian_transmission(0.8, 0.8), 0.5, 1e-15);
}

TEST_CASE("gaussian_profile_filter: transmission curve exp(-pi (alpha lc/lambda)^2)", "[texture]") {
  for (double ratio : {0.5, 2.0, 4.0}) {
    CAPTURE(ratio);
    const double lambda = 0.8 * ratio;
    REQUIRE_NEAR(mean_line_amplitude(lambda, 0.8, 0.004), gaussian_transmission(lambda, 0.8), 3e-4);
  }
}

TEST_CASE("gaussian_weight: unit area and ISO alpha", "[texture]") {
  REQUIRE_NEAR(kGaussianAlpha, std::sqrt(std::log(2.0) / kPi), 1e-15);
  double area = 0.0;
  const double dx = 1e-4, lc = 0.8;
  for (int k = -20000; k <= 20000; ++k) area += gaussian_weight(k * dx, lc) * dx;
  REQUIRE_NEAR(area, 1.0, 1e-9);
  // s(0) = 1 / (alpha lc)
  REQUIRE_NEAR(gaussian_weight(0.0, lc), 1.0 / (kGaussianAlpha * lc), 1e-12);
}

TEST_CASE("gaussian_profile_filter: ends renormalised, straight lines kept", "[texture]") {
  // A constant is its own mean line everywhere, ends included (weights renormalised); a straight
  // line is kept exactly where the kernel fits (symmetric weights).
  std::vector<double> c(500, 3.0), line(500);
  for (size_t i = 0; i < line.size(); ++i) line[i] = 0.01 * static_cast<double>(i);
  const auto wc = gaussian_profile_filter(c, 0.01, 0.8);
  const auto wl = gaussian_profile_filter(line, 0.01, 0.8);
  for (size_t i = 0; i < c.size(); ++i) REQUIRE_NEAR(wc[i], 3.0, 1e-12);
  for (size_t i = 80; i < 420; ++i) REQUIRE_NEAR(wl[i], line[i], 1e-12);
}

TEST_CASE("gaussian_profile_filter: a cut-off below half a spacing leaves the profile",
          "[texture]") {
  const std::vector<double> z = {1.0, -2.0, 3.0};
  REQUIRE(gaussian_profile_filter(z, 0.01, 0.0025) == z);
}

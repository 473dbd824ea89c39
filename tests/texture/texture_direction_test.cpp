// Lay direction and Str of gratings and random surfaces.
// Sources: a sine grating z = A sin(2 pi (x cos phi + y sin phi) / lambda) has grooves (lay) at
// phi + 90 deg (geometry); ISO 25178-2:2012 §4.2.2 Str: near 0 for a strongly directional
// surface, near 1 for an isotropic one.
#include "texture/texture_direction.h"

#include <cmath>
#include <numbers>
#include <random>

#include "test_support.h"
#include "texture/fit_plane.h"

using namespace cuspmap;

namespace {

constexpr double kPi = std::numbers::pi;

Heightfield grating(double phi_deg, double wavelength_mm) {
  Heightfield hf;
  hf.nx = 300;
  hf.ny = 200;
  hf.cell_mm = 0.01;
  hf.z_um.resize(hf.ny, hf.nx);
  const double c = std::cos(phi_deg * kPi / 180), s = std::sin(phi_deg * kPi / 180);
  for (int j = 0; j < hf.ny; ++j) {
    for (int i = 0; i < hf.nx; ++i) {
      hf.z_um(j, i) = static_cast<float>(
          2.0 * std::sin(2 * kPi * (hf.x_mm(i) * c + hf.y_mm(j) * s) / wavelength_mm));
    }
  }
  return remove_plane(hf, fit_plane(hf));
}

double axial_difference_deg(double a, double b) {
  double d = std::fmod(std::abs(a - b), 180.0);
  return std::min(d, 180.0 - d);
}

}  // namespace

TEST_CASE("texture_direction: lay of sine gratings at known angles", "[texture]") {
  for (double phi : {0.0, 30.0, 75.0, 120.0}) {
    CAPTURE(phi);
    const TextureDirection d = texture_direction(grating(phi, 0.12));
    // Tolerance: 1 deg (spectral leakage of a non-whole number of periods, Hann-windowed).
    REQUIRE(axial_difference_deg(d.lay_deg, phi + 90.0) < 1.0);
    REQUIRE(d.lay_strength > 0.9);
    REQUIRE(d.str < 0.1);
  }
}

TEST_CASE("texture_direction: white noise is isotropic", "[texture]") {
  Heightfield hf;
  hf.nx = 256;
  hf.ny = 256;
  hf.cell_mm = 0.01;
  hf.z_um.resize(hf.ny, hf.nx);
  std::mt19937 rng(7);
  std::normal_distribution<float> n(0.0f, 1.0f);
  for (int k = 0; k < hf.nx * hf.ny; ++k) hf.z_um.data()[k] = n(rng);
  const TextureDirection d = texture_direction(hf);
  REQUIRE(d.sal_found);
  REQUIRE(d.str > 0.5);
  REQUIRE(d.lay_strength < 0.1);
  // Uncorrelated cells: the ACF falls to 0.2 within one cell.
  REQUIRE(d.sal_mm < 0.01);
}

TEST_CASE("texture_direction: NaN cells do not bias the lay", "[texture]") {
  Heightfield hf = grating(30.0, 0.12);
  for (int j = 50; j < 120; ++j) {
    for (int i = 100; i < 180; ++i) hf.z_um(j, i) = kUnreached;
  }
  const TextureDirection d = texture_direction(hf);
  REQUIRE(axial_difference_deg(d.lay_deg, 120.0) < 2.0);
  REQUIRE(d.str < 0.1);
}

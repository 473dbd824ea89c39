// ISO 16610-61 areal Gaussian filter: 50 % transmission at the nesting index for a sine running
// along X (the separable filter reduces to the profile filter along the wave), constants kept
// through holes of NaN cells.
// Source: ISO 16610-61:2015 (areal Gaussian weighting function, the product of two ISO 16610-21
// profile weights; 50 % amplitude transmission at the nesting index).
#include "texture/gaussian_areal_filter.h"

#include <cmath>
#include <numbers>

#include "test_support.h"

using namespace cuspmap;

TEST_CASE("gaussian_areal_filter: 50 % transmission at the nesting index", "[texture]") {
  Heightfield hf;
  hf.nx = 1000;
  hf.ny = 60;
  hf.cell_mm = 0.004;  // 100 cells per 0.4 mm wavelength
  hf.z_um.resize(hf.ny, hf.nx);
  for (int j = 0; j < hf.ny; ++j) {
    for (int i = 0; i < hf.nx; ++i) {
      hf.z_um(j, i) = static_cast<float>(std::sin(2 * std::numbers::pi * hf.x_mm(i) / 0.4));
    }
  }
  const Heightfield mean = gaussian_areal_filter(hf, 0.4);
  double amp = 0.0;
  for (int i = 300; i < 700; ++i)
    amp = std::max(amp, std::abs(static_cast<double>(mean.z_um(30, i))));
  // Peak picking on 100 samples per wavelength: (pi/100)^2/2 = 5e-4 low at most.
  REQUIRE_NEAR(amp, 0.5, 1e-3);
}

TEST_CASE("gaussian_areal_filter: NaN cells stay NaN and do not pull the mean", "[texture]") {
  Heightfield hf;
  hf.nx = 80;
  hf.ny = 50;
  hf.cell_mm = 0.01;
  hf.z_um = HeightGrid::Constant(hf.ny, hf.nx, 2.5f);
  for (int j = 10; j < 30; ++j) {
    for (int i = 20; i < 40; ++i) hf.z_um(j, i) = kUnreached;
  }
  const Heightfield mean = gaussian_areal_filter(hf, 0.25);
  for (int j = 0; j < hf.ny; ++j) {
    for (int i = 0; i < hf.nx; ++i) {
      CAPTURE(i, j);
      if (std::isnan(hf.z_um(j, i))) {
        REQUIRE(std::isnan(mean.z_um(j, i)));
      } else {
        REQUIRE_NEAR(mean.z_um(j, i), 2.5, 1e-5);
      }
    }
  }
}

// Cusp of a periodic pattern with crests refined below the sample spacing: a ball raster profile
// sampled at any phase and spacing gives the handbook cusp.
// Method: profile z(y) = min_k (R - sqrt(R^2 - (y - k s)^2)) sampled directly (derived).
#include <algorithm>
#include <cmath>

#include "test_support.h"
#include "texture/periodic_cusp.h"

namespace cuspmap {
namespace {

// Across-pass profile of a ball raster (R mm, stepover s mm) sampled every `spacing_mm` from
// y0, um.
ProfileTrace ball_profile(double r_mm, double s_mm, double spacing_mm, double y0_mm, double length_mm) {
  ProfileTrace t;
  t.spacing_mm = spacing_mm;
  for (double y = y0_mm; y <= y0_mm + length_mm; y += spacing_mm) {
    const double k = std::round(y / s_mm);
    const double d = y - k * s_mm;
    t.z_um.push_back((r_mm - std::sqrt(r_mm * r_mm - d * d)) * 1000.0);
  }
  return t;
}

}  // namespace

TEST_CASE("periodic_cusp: a ball raster's cusp at any sample spacing and phase", "[texture]") {
  // Machinery's Handbook cusp height h = R - sqrt(R^2 - (s/2)^2): 6 mm ball, 0.3 mm -> 3.7523 um.
  const double h_um = (3.0 - std::sqrt(9.0 - 0.15 * 0.15)) * 1000.0;
  for (const double spacing : {0.005, 0.01, 0.02, 0.007, 0.013}) {
    for (const double phase : {0.0, 0.25, 0.5, 0.8}) {
      CAPTURE(spacing, phase);
      const PeriodicCusp c = periodic_cusp({ball_profile(3.0, 0.3, spacing, phase * spacing, 3.0)});
      CHECK(c.crests >= 8);
      // Issue 13 item 7: within 0.5 % of the closed form at any cell size.
      REQUIRE_NEAR(c.cusp_um, h_um, 0.005 * h_um);
    }
  }
}

TEST_CASE("periodic_cusp: rounding ripple on a level band is not a crest", "[texture]") {
  // Bull-nose-like period: level band |d| <= 0.3 mm with +-1e-4 um ripple (float rounding), arcs
  // of rc = 1 mm beyond; s = 1 mm. Derived cusp: rc - sqrt(rc^2 - (s/2 - w)^2) = 20.204 um.
  ProfileTrace t;
  t.spacing_mm = 0.005;
  for (int i = 0; i < 1200; ++i) {
    const double y = i * t.spacing_mm;
    const double d = std::abs(y - std::round(y));
    const double u = std::max(0.0, d - 0.3);
    t.z_um.push_back(u > 0.0 ? (1.0 - std::sqrt(1.0 - u * u)) * 1000.0 : (i % 2 ? 1e-4 : -1e-4));
  }
  const double h_um = (1.0 - std::sqrt(1.0 - 0.2 * 0.2)) * 1000.0;
  const PeriodicCusp c = periodic_cusp({t});
  CHECK(c.crests == 5);
  REQUIRE_NEAR(c.cusp_um, h_um, 0.005 * h_um);
}

TEST_CASE("periodic_cusp: a level or monotone profile has no cusp", "[texture]") {
  ProfileTrace level;
  level.spacing_mm = 0.01;
  level.z_um.assign(100, 1.5);
  ProfileTrace ramp = level;
  for (std::size_t i = 0; i < ramp.z_um.size(); ++i) ramp.z_um[i] = 0.1 * static_cast<double>(i);
  const PeriodicCusp c = periodic_cusp({level, ramp});
  CHECK(c.crests == 0);
  CHECK(c.cusp_um == 0.0);
}

TEST_CASE("refined_extremum_um: a sharp crest between samples is found from its flanks",
          "[texture]") {
  // Two straight flanks z = 10 - |x - 4.3| (derived: the lines meet at x = 4.3, z = 10).
  std::vector<double> z;
  for (int i = 0; i < 9; ++i) z.push_back(10.0 - std::abs(i - 4.3));
  REQUIRE_NEAR(refined_extremum_um(z, 4, 1.0), 10.0, 1e-12);
  // And a valley, mirrored.
  for (double& v : z) v = -v;
  REQUIRE_NEAR(refined_extremum_um(z, 4, -1.0), -10.0, 1e-12);
}

}  // namespace cuspmap

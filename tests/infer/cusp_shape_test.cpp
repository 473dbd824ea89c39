// The valley fit of cusp_shape on a ball's noise-free trace whose period is no whole number of
// samples: each phase bin then holds samples spread across its width.
#include "infer/cusp_shape.h"

#include <catch2/catch.hpp>
#include <cmath>

namespace cuspmap {

TEST_CASE("issue_17: cusp_shape reads a ball's radius from samples spread across each bin",
          "[infer]") {
  // Random round trip (tools/diagnose_campaign.py seed 2028 rs17): 4.7 mm ball, 0.3857 mm
  // stepover, 0.01 mm samples, 12 periods. The trace is the lower envelope of the passes'
  // circles, z = min_k R - sqrt(R^2 - (x - k s)^2) (machining handbook cusp geometry).
  const double R = 4.7, s = 0.3857, dx = 0.01;
  ProfileTrace t;
  t.spacing_mm = dx;
  t.start_mm = -2.3;
  for (int i = 0; i < 463; ++i) {
    const double x = t.start_mm + i * dx;
    const double u = x - s * std::round(x / s);  // from the nearest pass centre
    t.z_um.push_back(1000.0 * (R - std::sqrt(R * R - u * u)));
  }
  const CuspShape c = cusp_shape({t}, s, true);
  REQUIRE(c.curved);
  CAPTURE(c.radius_mm, c.radius_sigma_mm);
  // Derived: the parabola over +-0.3 period reads a circle short by 0.214 (w / R)^2 = 0.01 %;
  // the bin centres instead of the samples' phases read (|u| - bin / 2)^2 for u^2, up to 8 %
  // long here (1.875 x 0.005 / 0.116); within 0.5 % and 3 of its sigmas.
  CHECK(std::abs(c.radius_mm - R) <= 0.005 * R);
  CHECK(std::abs(c.radius_mm - R) <= 3.0 * c.radius_sigma_mm);
}

}  // namespace cuspmap

// Closed-form height parameters of the ideal cusp profile: circle arcs, optionally beyond a level
// band (bull-nose) or scaled by tan(tilt) (tilted flat end). Heights um, lengths mm. O(1).
// Method: circle-arc integral int_0^a (c - sqrt(c^2-u^2)) du = c a - (a sqrt(c^2-a^2) + c^2
// asin(a/c))/2 (standard antiderivative); Ra = (2/L) int_{z>m} (z - m), since z - m integrates to
// zero.
#include "finish/cusp_profile_heights.h"

#include <algorithm>
#include <cassert>
#include <cmath>
#include <numbers>

#include "core/units.h"
#include "cusp/scallop_ball.h"

namespace cuspmap {
namespace {

// Below this ratio a/c the antiderivative loses digits to cancellation (c a minus nearly c a);
// the Taylor series x^3/6 + x^5/40 + x^7/112 + 5x^9/1152 is then exact to ~1e-22 relative.
constexpr double kSeriesRatio = 1e-2;

// Height of the arc of radius c at distance u from its lowest point: the handbook cusp of two
// circles 2u apart (cusp/scallop_ball, cancellation-free).
double arc_height(double c, double u) { return scallop_ball_mm(c, 2.0 * u); }

// int_0^a arc_height(c, u) du, a in [0, c].
double arc_integral(double c, double a) {
  const double x = a / c;
  if (x < kSeriesRatio) {
    const double x2 = x * x;
    return c * c * x * x2 *
           (1.0 / 6.0 + x2 * (1.0 / 40.0 + x2 * (1.0 / 112.0 + x2 * 5.0 / 1152.0)));
  }
  const double root = std::sqrt(std::max(0.0, c * c - a * a));
  return c * a - 0.5 * (a * root + c * c * std::asin(std::min(1.0, x)));
}

}  // namespace

CuspProfile cusp_profile(const Cutter& cutter) {
  const double big_r = cutter.radius_mm();
  CuspProfile profile;
  switch (cutter.shape) {
    case CutterShape::Ball:
      profile = {CuspProfileKind::Circle, 0.0, big_r, 1.0};
      break;
    case CutterShape::BullNose:
      // The dished flat is lowest at its rim R - rc, which sweeps a level band of half-width R -
      // rc.
      profile = {CuspProfileKind::FlatAndArc, big_r - cutter.corner_radius_mm,
                 cutter.corner_radius_mm, 1.0};
      break;
    case CutterShape::Flat: {
      // Tilt tau along the feed: the leading rim point at lateral offset y sits
      // tan(tau) sqrt(R^2 - y^2) below the axis, so the profile is the circle of R times tan(tau).
      const double scale = std::abs(std::tan(cutter.tilt_deg * std::numbers::pi / 180.0));
      profile = scale > 0.0 ? CuspProfile{CuspProfileKind::TiltedRim, 0.0, big_r, scale}
                            : CuspProfile{CuspProfileKind::Level, 0.0, big_r, 0.0};
      break;
    }
  }
  return profile;
}

SurfaceHeights cusp_profile_heights(const Cutter& cutter, double stepover_mm) {
  assert(stepover_mm > 0.0 && stepover_mm <= cutter.diameter_mm * (1.0 + 1e-12) &&
         "stepover must lie in (0, D]: callers validate it");
  const CuspProfile profile = cusp_profile(cutter);
  const double half_period = 0.5 * stepover_mm;
  const double c = profile.arc_radius_mm;
  const double reach = std::min(c, half_period - profile.flat_half_width_mm);
  SurfaceHeights heights;
  if (profile.kind == CuspProfileKind::Level || reach <= 0.0) return heights;

  const double h_mm = profile.scale * arc_height(c, reach);
  const double area = arc_integral(c, reach);       // int over one half period, unscaled
  const double mean_unscaled = area / half_period;  // mean of the unscaled arc profile
  // Where the unscaled profile crosses its mean: c - sqrt(c^2 - u0^2) = mean.
  const double u0 = std::sqrt(std::max(0.0, mean_unscaled * (2.0 * c - mean_unscaled)));
  const double above = area - arc_integral(c, std::min(u0, reach)) - mean_unscaled * (reach - u0);
  const double ra_mm = profile.scale * 2.0 * std::max(0.0, above) / half_period;

  heights.sz_um = h_mm * kUmPerMm;
  heights.sv_um = profile.scale * mean_unscaled * kUmPerMm;
  heights.sp_um = heights.sz_um - heights.sv_um;
  heights.ra_um = ra_mm * kUmPerMm;
  heights.sa_um = heights.ra_um;
  return heights;
}

}  // namespace cuspmap

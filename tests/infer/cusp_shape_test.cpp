// The valley fit of cusp_shape on a ball's noise-free trace whose period is no whole number of
// samples: each phase bin then holds samples spread across its width.
#include "infer/cusp_shape.h"

#include "infer/periodic_trend.h"
#include "infer/trace_estimates.h"
#include "infer/valley_period.h"

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
  // Derived: the bin centres instead of the samples' phases read (|u| - bin / 2)^2 for u^2, up
  // to 8 % long here (1.875 x 0.005 / 0.116); within 0.5 % and 3 of its sigmas.
  CHECK(std::abs(c.radius_mm - R) <= 0.005 * R);
  CHECK(std::abs(c.radius_mm - R) <= 3.0 * c.radius_sigma_mm);
}

namespace {

// A ball's trace across its passes: the lower envelope of the passes' circles, z = min_k R -
// sqrt(R^2 - (x - k s)^2) (machining handbook cusp geometry), plus a slope, x from start_mm.
ProfileTrace ball_trace(double R, double s, double dx, int n, double start_mm,
                        double slope_um_per_mm) {
  ProfileTrace t;
  t.spacing_mm = dx;
  t.start_mm = start_mm;
  for (int i = 0; i < n; ++i) {
    const double x = t.start_mm + i * dx;
    const double u = x - s * std::round(x / s);
    t.z_um.push_back(1000.0 * (R - std::sqrt(R * R - u * u)) + slope_um_per_mm * i * dx);
  }
  return t;
}

}  // namespace

TEST_CASE("issue_17: cusp_shape reads a circle's radius without the parabola's bias",
          "[infer]") {
  // A 1 mm ball at 0.9 mm stepover, 2 um samples: w = 0.27 mm, where 1 / 2 c2 alone reads the
  // circle short by 0.214 (w / R)^2 R = 1.6 % (derived: regression of u^4 on u^2 over |u| <= w).
  const ProfileTrace t = ball_trace(1.0, 0.9, 0.002, 4000, -4.0, 0.0);
  const CuspShape c = cusp_shape({t}, 0.9, true);
  REQUIRE(c.curved);
  CAPTURE(c.radius_mm, c.radius_sigma_mm);
  // Derived: the radius whose circle the parabola, fitted at the same phases, reads at the
  // measured curvature is the circle's own (exact for a circle); 0.05 % leaves the sampling.
  CHECK(std::abs(c.radius_mm - 1.0) <= 0.0005);
}

TEST_CASE("issue_17: a periodic trace's slope is read within the phase bins", "[infer]") {
  // Random round trip (tools/diagnose_campaign.py seed 2029 rs17): 8.5 mm ball, 1.139 mm
  // stepover, 10 um samples, 5.0 periods (567 samples), 0.45 um/mm slope.
  const ProfileTrace t = ball_trace(4.25, 1.139, 0.01, 567, -2.83, -0.45);
  const int bins = static_cast<int>(std::lround(1.139 / 0.01));
  double slope = 0.0;
  REQUIRE(periodic_trend_slope(t, 1.139, bins, slope));
  // numpy oracle (the same pooled within-bin regression): -0.450005 um/mm; the trace's
  // least-squares line (texture/remove_least_squares_line) is tilted by the cusps instead.
  CHECK(slope == Approx(-0.45).margin(0.001));
  // At a period 0.08 % short (the autocorrelation's, 1.13809 mm) the bins still hold the trend.
  REQUIRE(periodic_trend_slope(t, 1.13809, bins, slope));
  CHECK(slope == Approx(-0.45).margin(0.001));
}

TEST_CASE("issue_17: valley_period reads the repeat from the valleys' vertices", "[infer]") {
  ProfileTrace t = ball_trace(4.25, 1.139, 0.01, 567, -2.83, -0.45);
  const CuspShape first = cusp_shape({t}, 1.13809, true);
  remove_periodic_trend(t, 1.13809, static_cast<int>(first.mean_um.size()));
  const ValleyPeriod v = valley_period({t}, 1.13809, first.valley_phase_mm, kValleyWindow);
  REQUIRE(v.found);
  CAPTURE(v.period_mm, v.sigma_mm, v.valleys);
  // numpy oracle (local parabolas, least-squares slope of the vertices): 1.1389998 mm.
  CHECK(v.valleys >= 4);
  CHECK(v.period_mm == Approx(1.139).margin(1e-4));
}

TEST_CASE("issue_17: a trace's ball radius is read within 0.1 % and its sigma", "[infer]") {
  // The round trip's trace (above) read 4.2221 +- 0.0075 mm for 4.25: its least-squares line,
  // tilted by the cusps, stacked the periods apart in the fold, and the fold's period, 0.08 %
  // short, spread the valleys (numpy replica: 4.2220 as cuspmap; 4.2443 at the true period
  // with the slope taken within the bins, 4.2501 with the circle's correction).
  const ProfileTrace t = ball_trace(4.25, 1.139, 0.01, 567, -2.83, -0.45);
  const TraceEstimates e = trace_estimates({t});
  REQUIRE(e.cusp.curved);
  CAPTURE(e.period.period_mm, e.cusp.period_mm, e.cusp.radius_mm, e.cusp.radius_sigma_mm);
  // Derived (the trace is the ball's circles): within 0.1 % and 3 of its sigmas.
  CHECK(std::abs(e.cusp.radius_mm - 4.25) <= 0.001 * 4.25);
  CHECK(std::abs(e.cusp.radius_mm - 4.25) <= 3.0 * e.cusp.radius_sigma_mm);
}

}  // namespace cuspmap

// Cusp of a tilted (trammed-off) end mill across the feed: the derived ellipse and saw-tooth
// geometry of the tilted rim, the inverse through cross_feed_cusp, and agreement with the
// simulated floor (simulated_cusp_heights: the sweep `simulate` runs) within 2 % or 0.05 um
// (issue 13: a bull-nose tilted 0.02 deg reported no cusp while simulation gave ~20 uin).
#include "cusp/scallop_tilted.h"

#include <algorithm>
#include <cmath>
#include <numbers>

#include "cusp/cross_feed_cusp.h"
#include "cusp/inverse_stepover.h"
#include "finish/simulated_cusp_heights.h"
#include "path/raster.h"
#include "sweep/simulate_floor.h"
#include "test_support.h"

namespace cuspmap {
namespace {

Cutter tilted(CutterShape shape, double diameter_mm, double corner_mm, double tilt_deg,
              double toward_deg) {
  Cutter c;
  c.shape = shape;
  c.diameter_mm = diameter_mm;
  c.corner_radius_mm = corner_mm;
  c.tilt_deg = tilt_deg;
  c.tilt_toward_deg = toward_deg;
  return c;
}

double tan_deg(double deg) { return std::tan(deg * std::numbers::pi / 180.0); }

// Issue 13's agreement with simulate: within 2 % or 0.05 um, whichever is larger.
double sim_tolerance_um(double value_um) { return std::max(0.02 * value_um, 0.05); }

// Peak-to-valley of the raw simulated floor (no plane removed: a saw-tooth's least-squares
// plane over a few periods would add ~h/N) over whole periods between guard bands wider than
// the cutter's reach, from the sweep `simulate` runs (simulate_floor, revolving envelope).
double simulated_peak_to_valley_um(const Cutter& cutter, double s, RasterDirection direction) {
  constexpr int kCellsPerPeriod = 201, kPeriods = 4;
  const int guard = static_cast<int>(std::ceil(cutter.radius_mm() / s)) + 1;
  Patch patch;
  patch.cell_mm = s / kCellsPerPeriod;
  patch.size_y_mm = ((kPeriods + 2 * guard) * kCellsPerPeriod - 0.5) * patch.cell_mm;
  patch.size_x_mm = 3.5 * patch.cell_mm;
  PathSpec spec;
  spec.stepover_mm = s;
  spec.direction = direction;
  const CutSpec cut;
  SimSpec sim;
  sim.threads = 1;
  const Heightfield f =
      simulate_floor(cutter, raster_path(spec, cut, patch, cutter), cut, patch, sim);
  const auto window = f.z_um.block(guard * kCellsPerPeriod, 0, kPeriods * kCellsPerPeriod, f.nx);
  return static_cast<double>(window.maxCoeff() - window.minCoeff());
}

}  // namespace

TEST_CASE("scallop_tilted: a flat end tilted along the feed leaves the rim's ellipse", "[cusp]") {
  // Derived: tilted toward the feed, the leading rim point at lateral offset y lies
  // tan(tau) sqrt(R^2 - y^2) below the tip, the lower half of an ellipse with semi-axes R and
  // R tan(tau). Two ellipses s apart meet at y = s/2: h = tan(tau) (R - sqrt(R^2 - s^2/4)),
  // and the profile is the circle profile of radius R scaled by tan(tau).
  for (const double toward : {0.0, 180.0}) {
    const Cutter flat = tilted(CutterShape::Flat, 10.0, 0.0, 0.3, toward);
    const double t = tan_deg(0.3), big_r = 5.0;
    for (const double s : {0.5, 3.0, 8.0}) {
      CAPTURE(toward, s);
      const CuspResult r = scallop_tilted(flat, s);
      const double h_um = t * (big_r - std::sqrt(big_r * big_r - 0.25 * s * s)) * 1000.0;
      REQUIRE_NEAR(r.scallop_um, h_um, 1e-9 * h_um);
      const ProfileStats circle = arc_cusp_stats(big_r, 0.5 * s, 0.0);
      REQUIRE_NEAR(r.stats.ra_um, t * circle.ra_um, 1e-6 * t * circle.ra_um);
      // Parabola of the ellipse's curvature at its lowest point: effective radius R / tan(tau).
      REQUIRE_NEAR(*r.effective_radius_mm, big_r / t, 1e-4 * big_r / t);
    }
  }
}

TEST_CASE("scallop_tilted: a tilt across the feed leaves a saw-tooth of height s tan(tau)",
          "[cusp]") {
  // Derived: tilted across the feed the face is a plane falling tan(tau) per mm to the side, so
  // each pass leaves a ramp of width s ending in a step: h = s tan(tau); a saw-tooth's Ra is
  // h/4 (triangle-wave mean deviation, ISO 4287 Ra over whole periods).
  const Cutter flat = tilted(CutterShape::Flat, 8.0, 0.0, 0.1, 90.0);
  const double t = tan_deg(0.1);
  for (const double s : {0.4, 2.0, 6.0}) {
    CAPTURE(s);
    const CuspResult r = scallop_tilted(flat, s);
    REQUIRE_NEAR(r.scallop_um, s * t * 1000.0, 1e-9 * s * t * 1000.0);
    REQUIRE_NEAR(r.stats.ra_um, 0.25 * s * t * 1000.0, 1e-6 * s * t * 1000.0);
    REQUIRE_FALSE(r.effective_radius_mm.has_value());  // lowest point on the rim: no parabola
  }
}

TEST_CASE("scallop_tilted: issue_13 bull-nose tilted 0.02 deg leaves its flat rim's ellipse",
          "[cusp]") {
  // Derived: the bull-nose's lowest ring is the edge of its flat, radius a = R - rc; inside the
  // flat width the cusp is tan(tau)(a - sqrt(a^2 - s^2/4)). The corner torus lowers it by at
  // most tan(tau)^2 rc / 2 (the ring moving out onto the torus): ~6e-5 um here.
  const Cutter bull = tilted(CutterShape::BullNose, 10.0, 1.0, 0.02, 0.0);
  const double t = tan_deg(0.02), a = 4.0, s = 6.0;
  const double h_um = t * (a - std::sqrt(a * a - 0.25 * s * s)) * 1000.0;
  CuspSetup setup;
  setup.cutter = bull;
  const CuspResult r = cross_feed_cusp(setup, s);
  REQUIRE_NEAR(r.scallop_um, h_um, t * t * 1.0 * 1000.0);
  REQUIRE(r.scallop_um * 39.37 > 15.0);  // the issue's ~20 uin, not 0
  // The inverse finds the stepover back (bisection on the forward model).
  const StepoverSolution sol = inverse_stepover(setup, FinishTarget::Scallop, r.scallop_um);
  REQUIRE(sol.reachable);
  REQUIRE_NEAR(sol.stepover_mm, s, 1e-6 * s);
}

TEST_CASE("scallop_tilted: issue_13 agrees with the simulated floor within 2 % or 0.05 um",
          "[cusp]") {
  struct Case {
    Cutter cutter;
    double stepover_mm;
  };
  Cutter dished = tilted(CutterShape::BullNose, 12.0, 2.0, 0.05, 180.0);
  dished.dish_deg = 1.0;
  Cutter dished_flat = tilted(CutterShape::Flat, 6.0, 0.0, 0.1, 0.0);
  dished_flat.dish_deg = 2.0;
  const Case cases[] = {
      {tilted(CutterShape::BullNose, 10.0, 1.0, 0.02, 0.0), 6.0},  // the case
      {tilted(CutterShape::BullNose, 10.0, 1.0, 0.02, 0.0), 9.0},  // crest on the corner
      {dished, 9.0},
      {dished_flat, 1.0},
      {tilted(CutterShape::Flat, 10.0, 0.0, 0.05, 90.0), 2.0},  // saw-tooth across the feed
      {tilted(CutterShape::Ball, 6.0, 0.0, 1.0, 30.0), 0.5},
  };
  for (const Case& c : cases) {
    CAPTURE(static_cast<int>(c.cutter.shape), c.cutter.tilt_toward_deg, c.stepover_mm);
    const CuspResult r = scallop_tilted(c.cutter, c.stepover_mm);
    REQUIRE(r.scallop_um > 0.0);
    for (const RasterDirection d : {RasterDirection::OneWay, RasterDirection::Zigzag}) {
      CAPTURE(d == RasterDirection::OneWay);
      const double pv = simulated_peak_to_valley_um(c.cutter, c.stepover_mm, d);
      REQUIRE_NEAR(pv, r.scallop_um, sim_tolerance_um(r.scallop_um));
      // Sa of plan's simulated window (plane removed, ISO 25178-2) against the profile's Ra.
      const SurfaceHeights sim = simulated_cusp_heights(c.cutter, c.stepover_mm, d);
      REQUIRE_NEAR(sim.sa_um, r.stats.ra_um, sim_tolerance_um(r.stats.ra_um));
    }
  }
}

}  // namespace cuspmap

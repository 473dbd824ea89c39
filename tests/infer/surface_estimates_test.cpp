// Round trips for the surface-only estimates: floors simulated with known stepover, feed, tool
// and path, damaged like a measurement, read back by surface_estimates.
#include "infer/surface_estimates.h"

#include <catch2/catch.hpp>
#include <cmath>

#include "core/input_error.h"
#include "infer/diagnose_floors.h"
#include "test_support.h"

namespace cuspmap {
namespace {

double lay_error_deg(double got, double want) {
  const double d = std::fmod(std::abs(got - want), 180.0);
  return std::min(d, 180.0 - d);
}

}  // namespace

TEST_CASE("surface_estimates: ball floor, one-way and zigzag, noise, plane, missing points",
          "[infer]") {
  for (RasterDirection dir : {RasterDirection::OneWay, RasterDirection::Zigzag}) {
    CAPTURE(dir == RasterDirection::Zigzag);
    // 6 mm ball, stepover 0.3 mm, fz 0.08 mm on 2 teeth, 3 x 3 mm at 0.01 mm cells.
    Job job = test::raster_job(CutterShape::Ball, 6.0, 0.3, 3.0, 0.01, 0.08, 2);
    job.path.direction = dir;
    Heightfield hf = test::simulate(job);
    test::damage(hf, 0.02, 2.0, -1.0, 0.01, 17u);
    const SurfaceEstimates e = surface_estimates(hf, {});
    CHECK(lay_error_deg(e.lay_deg, 0.0) < 1.0);  // raster at angle 0: passes along X (DESIGN.md)
    // Issue 17's tolerance: stepover within 1 %, and within 3 standard errors.
    REQUIRE_NEAR(e.stepover.period_mm, 0.3, 0.003);
    REQUIRE(std::abs(e.stepover.period_mm - 0.3) <= 3.0 * e.stepover.sigma_mm + 0.1 * 0.01);
    // Machining handbook cusp geometry: the valley is the ball's circle, R = 3 mm (derived
    // through the parabola's curvature; 5 %: the feed marks and noise sit in the valley).
    REQUIRE(e.cusp.curved);
    REQUIRE_NEAR(e.cusp.radius_mm, 3.0, 0.15);
    // Machinery's Handbook cusp height h = R - sqrt(R^2 - (s/2)^2) = 3.75 um; the folded mean
    // profile averages the feed marks over the valley and crest (15 %).
    REQUIRE_NEAR(e.cusp.cusp_um, (3.0 - std::sqrt(9.0 - 0.0225)) * 1000.0, 0.15 * 3.75);
    // Along the lay the teeth repeat every fz = 0.08 mm (derived: feed / (teeth * rpm)).
    REQUIRE(e.feed.found);
    REQUIRE_NEAR(e.feed.period_mm, 0.08, 0.0016);
    // Setup plane: the added 2 um/mm and -1 um/mm (the floor itself is level).
    REQUIRE_NEAR(e.setup_plane.gx_um_per_mm, 2.0, 0.05);
    REQUIRE_NEAR(e.setup_plane.gy_um_per_mm, -1.0, 0.05);
    // Zigzag passes alternate their tooth-mark pattern; one-way passes repeat it (derived).
    CHECK(e.direction == (dir == RasterDirection::Zigzag ? "zigzag" : "alike"));
  }
}

TEST_CASE("surface_estimates: runout shows a once-per-revolution repeat", "[infer]") {
  // 2 teeth with 4 um radial runout: one tooth cuts deeper, the marks repeat every revolution
  // (2 fz = 0.16 mm) as well as every tooth (derived, Kline & DeVor's runout model).
  Job job = test::raster_job(CutterShape::Ball, 6.0, 0.3, 3.0, 0.01, 0.08, 2);
  job.cutter.runout_mm = 0.004;
  Heightfield hf = test::simulate(job);
  test::damage(hf, 0.01, 0.0, 0.0, 0.0, 5u);
  SurfaceOptions o;
  o.teeth = 2;
  const SurfaceEstimates e = surface_estimates(hf, o);
  REQUIRE(e.feed.found);
  CHECK(e.feed.marks_per_revolution == 2);
  REQUIRE_NEAR(e.feed.revolution_mm, 0.16, 0.0032);
  REQUIRE_NEAR(e.feed.feed_per_tooth_mm, 0.08, 0.0016);
}

TEST_CASE("surface_estimates: refuses what it cannot tell", "[infer]") {
  Heightfield tiny;
  tiny.nx = tiny.ny = 20;
  tiny.cell_mm = 0.01;
  tiny.z_um = HeightGrid::Zero(20, 20);
  REQUIRE_THROWS_WITH(surface_estimates(tiny, {}),
                      "too few cells to diagnose: 400 with a height, at least 4096 (64 x 64) are "
                      "needed");
  // Isotropic noise: no lay.
  Heightfield noise;
  noise.nx = noise.ny = 100;
  noise.cell_mm = 0.01;
  noise.z_um = HeightGrid::Zero(100, 100);
  test::damage(noise, 1.0, 0.0, 0.0, 0.0, 3u);
  REQUIRE_THROWS_WITH(surface_estimates(noise, {}), Catch::Matchers::StartsWith("no dominant lay"));
  // Stepover 0.3 mm on a 0.8 mm field: fewer than 4 periods.
  const Job job = test::raster_job(CutterShape::Ball, 6.0, 0.3, 0.8, 0.01, 0.08, 2);
  const Heightfield small = test::simulate(job);
  SurfaceOptions lay;
  lay.lay_deg = 0.0;
  REQUIRE_THROWS_AS(surface_estimates(small, lay), InputError);
}

}  // namespace cuspmap

namespace cuspmap {

TEST_CASE("surface_estimates: heel lifted by tilt toward the feed", "[infer]") {
  // 6 mm flat end mill, 1 deg dish, tilted 0.05 deg toward +X, one-way passes toward +X: the
  // leading rim sits 6 tan(0.05 deg) = 5.2 um below the trailing rim (derived), so only the
  // leading rim marks the floor: one family of arcs, which its mirror image does not match.
  Job job = test::raster_job(CutterShape::Flat, 6.0, 1.0, 5.0, 0.02, 0.1, 2);
  job.cutter.dish_deg = 1.0;
  job.cutter.tilt_deg = 0.05;
  job.cutter.tilt_toward_deg = 0.0;
  Heightfield hf = test::simulate(job);
  test::damage(hf, 0.005, 0.0, 0.0, 0.0, 11u);
  SurfaceOptions o;
  o.lay_deg = 0.0;  // the tooth arcs, not the passes, dominate a flat end mill's spectrum
  const SurfaceEstimates e = surface_estimates(hf, o);
  CHECK(e.heel == "lifted");
  // Derived: feed 2000 mm/min over 2 teeth at 10000 rpm.
  REQUIRE_NEAR(e.feed.period_mm, 0.1, 0.002);
}

}  // namespace cuspmap

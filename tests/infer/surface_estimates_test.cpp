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
  // A revolution of the given teeth's marks settles the feed per tooth: no note that the
  // repeat may be a revolution (the next case has one).
  for (const std::string& n : e.notes) CHECK(n.find("whole revolution") == n.npos);
}

TEST_CASE("surface_estimates: a revolution's repeat is not passed off as the feed per tooth",
          "[infer]") {
  // Seed 2030 tc0 of tools/tooth_campaign.py: 6.4 mm flat, 3 teeth, 1.71 deg dish, 8.69 um
  // runout at 134.5 deg, fz 0.0375, s 0.904, tilted 0.0621 deg toward 115.9. The deepest
  // tooth's marks cover the other two: the along-lay repeat is the revolution, 3 fz = 0.1125
  // mm (Kline & DeVor 1983: tooth k's edge at R + e cos(psi - 2 pi k / Z); measured 0.1125).
  const Job job = test::tooth_cut_job({.diameter_mm = 6.4, .stepover_mm = 0.904, .size_mm = 6.1,
                                        .cell_mm = 0.005, .fz_mm = 0.0375, .teeth = 3,
                                        .dish_deg = 1.71, .runout_mm = 0.00869,
                                        .runout_phase_deg = 134.5, .tilt_deg = 0.0621,
                                        .tilt_toward_deg = 115.9});
  Heightfield hf = test::crop(test::simulate(job), 200);  // 1 mm margin, as the campaign
  test::damage(hf, 0.017, 0.99, -0.88, 0.007, 2030u);
  SurfaceOptions o;
  o.lay_deg = 0.0;
  o.teeth = 3;
  const SurfaceEstimates e = surface_estimates(hf, o);
  CAPTURE(e.feed.period_mm, e.feed.revolution_mm, e.notes);
  REQUIRE(e.feed.found);
  // Derived: the floor repeats once per revolution, Z fz (within 2 %, as the feed marks above).
  REQUIRE_NEAR(e.feed.period_mm, 3 * 0.0375, 0.02 * 3 * 0.0375);
  // No revolution of 3 marks stands out (a later ACF peak may pass for one: 0.675 mm, 6
  // marks, here), so the report must say the repeat may be a revolution (not claim fz).
  REQUIRE(e.feed.marks_per_revolution != 3);
  bool said = false;
  for (const std::string& n : e.notes) said = said || n.find("whole revolution") != n.npos;
  REQUIRE(said);
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
  CAPTURE(e.stepover.period_mm, e.valley_mm, e.passes.next_pass, e.passes.second_pass,
          e.passes.mirror);
  CHECK(e.heel == "lifted");
  // Derived: feed 2000 mm/min over 2 teeth at 10000 rpm.
  REQUIRE_NEAR(e.feed.period_mm, 0.1, 0.002);
}

}  // namespace cuspmap

namespace cuspmap {

TEST_CASE("surface_estimates: tooth-resolved flat and bull-nose floors, lay from the passes",
          "[infer]") {
  // Dished flat end mills leave tooth arcs that dominate the spectrum (its mean direction is
  // the arcs', not the passes'); the band means along the passes still carry their profile.
  struct Case {
    CutterShape shape;
    double dish_deg, stepover_mm, fz_mm;
    int teeth;
    RasterDirection dir;
    double angle_deg, field_mm, cell_mm, tilt_deg, toward_deg;
  };
  const Case cases[] = {
      // Stepover below D/2, oblique passes, one-way.
      {CutterShape::Flat, 1.0, 1.0, 0.1, 2, RasterDirection::OneWay, 30.0, 5.0, 0.01, 0.0, 0.0},
      // Shallow dish, zigzag (alternate passes' arcs differ: the traces repeat every 2 passes).
      {CutterShape::Flat, 0.5, 1.0, 0.08, 3, RasterDirection::Zigzag, 0.0, 5.0, 0.01, 0.0, 0.0},
      // Stepover above D/2, passes along Y.
      {CutterShape::Flat, 1.0, 4.0, 0.1, 3, RasterDirection::OneWay, 90.0, 17.0, 0.03, 0.0, 0.0},
      // Bull-nose (r 1 mm) tilted 0.02 deg, zigzag at 150 deg.
      {CutterShape::BullNose, 0.0, 0.8, 0.08, 2, RasterDirection::Zigzag, 150.0, 5.0, 0.02, 0.02,
       40.0},
  };
  for (const Case& c : cases) {
    CAPTURE(c.stepover_mm, c.angle_deg, c.dish_deg, c.dir == RasterDirection::Zigzag);
    Job job = test::raster_job(c.shape, 6.0, c.stepover_mm, c.field_mm + 6.0, c.cell_mm, c.fz_mm,
                               c.teeth);
    if (c.shape == CutterShape::BullNose) job.cutter.corner_radius_mm = 1.0;
    job.cutter.dish_deg = c.dish_deg;
    job.cutter.tilt_deg = c.tilt_deg;
    job.cutter.tilt_toward_deg = c.toward_deg;
    job.path.direction = c.dir;
    job.path.angle_deg = c.angle_deg;
    // The interior: a measured field lies inside its part (the patch edge lacks the passes
    // within R of it).
    Heightfield hf = test::crop(test::simulate(job), static_cast<int>(std::lround(3.0 / c.cell_mm)));
    test::damage(hf, 0.01, 0.8, -0.4, 0.01, 23u);
    const SurfaceEstimates e = surface_estimates(hf, {});
    CAPTURE(e.lay_deg, e.lay_pass_share, e.stepover.period_mm, e.stepover.sigma_mm,
            e.feed.period_mm, e.direction);
    // Derived: the raster's passes run at path.angle_deg.
    REQUIRE(lay_error_deg(e.lay_deg, c.angle_deg) < 0.5);
    // Issue 17: stepover within 1 %, and within 3 standard errors.
    REQUIRE(std::abs(e.stepover.period_mm - c.stepover_mm) <= 0.01 * c.stepover_mm);
    REQUIRE(std::abs(e.stepover.period_mm - c.stepover_mm) <= 3.0 * e.stepover.sigma_mm + 1e-3);
    // Derived: feed per tooth = feed / (teeth rpm); a tilted bull-nose's marks may be too
    // shallow to repeat, and then the estimate says so instead of guessing.
    if (c.shape == CutterShape::Flat || e.feed.found) {
      REQUIRE(e.feed.found);
      REQUIRE_NEAR(e.feed.period_mm, c.fz_mm, 0.02 * c.fz_mm);
    }
    // A one-way floor is never called zigzag (for a zigzag, "alike" is honest too: the
    // envelope is the same both ways; "undetermined" says it cannot tell).
    if (c.dir == RasterDirection::OneWay) CHECK(e.direction != "zigzag");
  }
}

TEST_CASE("surface_estimates: a level floor is refused in one line", "[infer]") {
  // A bull-nose floor at a stepover inside its flat bottom (untilted) is exactly level
  // (derived: the flat part sweeps every point): nothing to read.
  Heightfield hf;
  hf.nx = hf.ny = 80;
  hf.cell_mm = 0.01;
  hf.z_um = HeightGrid::Constant(80, 80, 2.5f);
  REQUIRE_THROWS_WITH(surface_estimates(hf, {}),
                      "the floor shows no texture: every height lies on one plane (within "
                      "0.0001 um), nothing to read");
}

}  // namespace cuspmap

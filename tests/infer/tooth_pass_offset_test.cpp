// The marks' own pass axis (infer/tooth_pass_offset) on tooth-resolved raster floors simulated by
// the job pipeline and damaged like a measurement: where the raster put its passes, without the
// envelope fit.
#include "infer/tooth_pass_offset.h"

#include <catch2/catch.hpp>
#include <cmath>
#include <numbers>

#include "infer/diagnose_floors.h"

namespace cuspmap {
namespace {

constexpr double kDegToRad = std::numbers::pi / 180.0;

struct Floor {
  CutterShape shape = CutterShape::Flat;
  double corner_mm = 0.0, toward_deg = 60.0, runout_um = 5.0;
  int teeth = 3;
};

// A 6 mm cutter, 1 deg dish, fz 0.05 mm, 0.8 mm one-way passes along +X, 0.05 deg tilt, on a
// 4 x 4 mm patch of 5 um cells (the issue-17 floor), 0.01 um noise, a setup plane and 1 %
// missing cells, its 0.5 mm rim cut off.
Heightfield floor_of(const Floor& f) {
  Job job = test::raster_job(f.shape, 6.0, 0.8, 4.0, 0.005, 0.05, f.teeth);
  job.cutter.corner_radius_mm = f.corner_mm;
  job.cutter.dish_deg = 1.0;
  job.cutter.runout_mm = f.runout_um * 1e-3;
  job.cutter.runout_phase_deg = 40.0;
  job.cutter.tilt_deg = 0.05;
  job.cutter.tilt_toward_deg = f.toward_deg;
  Heightfield hf = test::crop(test::simulate(job), 100);
  test::damage(hf, 0.01, 0.8, -0.4, 0.01, 7);
  return hf;
}

// The raster puts its passes at y = k x stepover from the patch's lower edge (path/raster.h,
// DESIGN.md raster contract), so a pass axis lies at a whole number of stepovers (derived).
double off_passes(const MarksPassOffset& m) { return std::remainder(m.axis_mm, 0.8); }

}  // namespace

TEST_CASE("marks_pass_offset: the pass axes of a tilted, dished 3-flute floor", "[infer][tooth]") {
  Floor f;
  const Heightfield hf = floor_of(f);
  const MarksPassOffset m = marks_pass_offset(hf, 0.0, 0.8, 3.0, 0.05, 3);
  CAPTURE(m.axis_mm, m.lowest_mm, m.contrast, m.period_mm);
  REQUIRE(m.found);
  // Clear of the trial scores' mean (the campaign floors measured 6.5-9.1; derived threshold in
  // the header).
  REQUIRE(m.contrast >= kMarksOffsetMinContrast);
  // Within 1/16 of a stepover (the tooth stage's agreement band, infer/tooth_fit.cpp) of a true
  // pass axis: 0.05 mm; the campaign floors measured 14-24 um off (docs/diagnose.md).
  REQUIRE(std::abs(off_passes(m)) <= 0.8 / 16.0);
  // The rim's lowest point lies toward the tilt: lateral a sin(toward - lay) from the axis
  // (derived: a tilted rim of radius a is lowest at the bearing of the tilt), 3 sin 60 deg =
  // 2.60 mm; within 10 % of the rim radius.
  REQUIRE(std::abs(m.lowest_mm - 3.0 * std::sin(f.toward_deg * kDegToRad)) <= 0.3);
}

TEST_CASE("marks_pass_offset: a bull-nose tilted the other way, 4 teeth", "[infer][tooth]") {
  Floor f;
  f.shape = CutterShape::BullNose;
  f.corner_mm = 0.8;
  f.toward_deg = 300.0;
  f.teeth = 4;
  f.runout_um = 3.0;
  const Heightfield hf = floor_of(f);
  // The flat part's rim (R - rc = 2.2 mm) leaves the marks.
  const MarksPassOffset m = marks_pass_offset(hf, 0.0, 0.8, 2.2, 0.05, 4);
  CAPTURE(m.axis_mm, m.lowest_mm, m.contrast, m.period_mm);
  REQUIRE(m.contrast >= kMarksOffsetMinContrast);
  // As above (derived: passes at whole stepovers; the lowest point at 2.2 sin 300 deg = -1.91).
  REQUIRE(std::abs(off_passes(m)) <= 0.8 / 16.0);
  REQUIRE(std::abs(m.lowest_mm - 2.2 * std::sin(f.toward_deg * kDegToRad)) <= 0.22);
}

TEST_CASE("marks_pass_offset: no marks, no estimate", "[infer][tooth]") {
  // A level floor of pure noise: every trial axis scores alike (derived: random phasors), so the
  // contrast stays under the threshold.
  Heightfield hf;
  hf.nx = hf.ny = 300;
  hf.cell_mm = 0.01;
  hf.z_um.setZero(300, 300);
  test::damage(hf, 0.01, 0.0, 0.0, 0.0, 3);
  const MarksPassOffset m = marks_pass_offset(hf, 0.0, 0.8, 3.0, 0.05, 3);
  CAPTURE(m.contrast);
  REQUIRE(m.contrast < kMarksOffsetMinContrast);
}

}  // namespace cuspmap

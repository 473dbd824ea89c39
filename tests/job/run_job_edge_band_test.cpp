// Raster floors near the patch's side edges: a cutter whose lowest point is off its axis (tilt,
// dish, runout) cuts a cell lowest from passes up to R + runout away, so the passes beyond the
// patch are simulated (margin passes) and the edge rows are finished like the interior rows.
// Method: run_job on a floor periodic across the lay (period = stepover, whole cells per
// period); row means at the edges against the same phase in the interior (derived).
#include <algorithm>
#include <cmath>

#include "job/run_job.h"
#include "path/build_toolpath.h"
#include "path/move.h"
#include "path/raster.h"
#include "test_support.h"

namespace cuspmap {
namespace {

// A 6 mm flat with a 1 deg dish, trammed 0.01 deg toward +Y, one-way passes 0.5 mm apart on a
// 4 x 8 mm patch at 10 um (50 rows per period): the demo's tram floor, smaller.
Job tram_job() {
  Job job;
  job.name = "tram";
  job.patch.size_x_mm = 4.0;
  job.patch.size_y_mm = 8.0;
  job.patch.cell_mm = 0.01;
  job.cutter.shape = CutterShape::Flat;
  job.cutter.diameter_mm = 6.0;
  job.cutter.dish_deg = 1.0;
  job.cutter.tilt_deg = 0.01;
  job.cutter.tilt_toward_deg = 90.0;
  job.path.kind = PathKind::Raster;
  job.path.stepover_mm = 0.5;
  job.path.direction = RasterDirection::OneWay;
  return job;
}

// Mean height of row j over the middle half of the columns (clear of the pass ends).
double row_mean_um(const Heightfield& f, std::int64_t j) {
  double sum = 0.0;
  const std::int64_t i0 = f.nx / 4, i1 = 3 * f.nx / 4;
  for (std::int64_t i = i0; i < i1; ++i) sum += f.z_um(j, i);
  return sum / static_cast<double>(i1 - i0);
}

// Largest difference, over all rows, between a row's mean and the mean of the row of the same
// phase (row index modulo the period) in the middle of the patch.
double edge_mismatch_um(const Heightfield& f, int rows_per_period) {
  const std::int64_t mid = (f.ny / 2 / rows_per_period) * rows_per_period;
  double worst = 0.0;
  for (std::int64_t j = 0; j < f.ny; ++j) {
    const std::int64_t phase = j % rows_per_period;
    worst = std::max(worst, std::abs(row_mean_um(f, j) - row_mean_um(f, mid + phase)));
  }
  return worst;
}

}  // namespace

TEST_CASE("issue_13: a trammed dished flat finishes the raster's edge rows like its interior",
          "[job][edge]") {
  const Job job = tram_job();
  const JobRun run = run_job(job, RunOptions{});
  // ceil(R / s) = ceil(3 / 0.5) = 6 passes beyond each side (derived).
  CHECK(run.built.margin_passes == 6);
  const Heightfield& f = run.floor;
  REQUIRE(f.ny == 800);
  // Derived: the floor is periodic across the lay with the stepover (50 rows). Without margin
  // passes the rows within the reach of the edges were cut by fewer passes and came out up to
  // 0.44 um higher (measured) than the interior rows of the same phase. Float rounding of the
  // sweep: < 1e-3 um.
  const double mismatch = edge_mismatch_um(f, 50);
  CHECK(mismatch < 1e-3);
  // The program is the patch's own passes: path length and cycle time leave the margin out
  // (17 passes of 4 + 6 mm, one-way links: the path without margins, exactly).
  const Toolpath program = raster_path(job.path, job.cut, job.patch, job.cutter);
  CHECK(run.path_length_mm == Approx(path_length_mm(program, true)).epsilon(1e-12));
  CHECK(run.cycle_time_s == Approx(cycle_time_s(program)).epsilon(1e-12));
  CHECK_FALSE(margin_passes_note(run.built).empty());
}

TEST_CASE("raster_margin_passes: only cutters whose lowest point is off their axis",
          "[path][edge]") {
  const double stepover_mm = 0.4;
  Cutter c;
  c.diameter_mm = 6.0;
  CHECK(raster_margin_passes(stepover_mm, c) == 0);  // ball: nearest pass cuts lowest (derived)
  c.shape = CutterShape::Flat;
  CHECK(raster_margin_passes(stepover_mm, c) == 0);  // level undished face
  c.dish_deg = 0.5;
  CHECK(raster_margin_passes(stepover_mm, c) == 8);  // rim lowest: ceil(3 / 0.4) = 8
  c.dish_deg = 0.0;
  c.runout_mm = 0.005;
  CHECK(raster_margin_passes(stepover_mm, c) == 8);  // ceil(3.005 / 0.4) = 8
  c.runout_mm = 0.0;
  c.shape = CutterShape::BullNose;
  c.corner_radius_mm = 1.0;
  c.tilt_deg = 0.02;
  CHECK(raster_margin_passes(stepover_mm, c) == 8);
}

TEST_CASE("raster_path: margin passes continue the pattern; the program's passes keep direction",
          "[path][edge]") {
  Patch patch;
  patch.size_x_mm = 5.0;
  patch.size_y_mm = 3.0;
  Cutter flat;
  flat.shape = CutterShape::Flat;
  flat.diameter_mm = 2.0;
  PathSpec spec;
  spec.kind = PathKind::Raster;
  spec.stepover_mm = 0.5;
  spec.direction = RasterDirection::Zigzag;
  for (int margin : {1, 2, 3}) {
    CAPTURE(margin);
    const Toolpath plain = raster_path(spec, CutSpec{}, patch, flat);
    const Toolpath wide = raster_path(spec, CutSpec{}, patch, flat, margin);
    // Zigzag: passes are every other move (links between); 7 program passes + 2 margin sets.
    REQUIRE(plain.moves.size() == 13);
    REQUIRE(wide.moves.size() == 13 + 4 * static_cast<std::size_t>(margin));
    for (std::size_t k = 0; k < 7; ++k) {
      const Move& p = plain.moves[2 * k];
      const Move& w = wide.moves[2 * (k + static_cast<std::size_t>(margin))];
      CAPTURE(k);
      CHECK(w.start_mm.y() == Approx(p.start_mm.y()).margin(1e-12));
      // Same direction of travel along X as the program's own pass.
      CHECK((w.end_mm.x() > w.start_mm.x()) == (p.end_mm.x() > p.start_mm.x()));
    }
    CHECK(wide.moves.front().start_mm.y() == Approx(-0.5 * margin).margin(1e-12));
    CHECK(wide.moves.back().start_mm.y() == Approx(3.0 + 0.5 * margin).margin(1e-12));
  }
}

}  // namespace cuspmap

// The cusp simulate reports: peak-to-valley of the mark pattern, refined below the cell, so it is
// the handbook cusp at any cell size; and never the highest point (negative under tilt).
// Method: run_job on small raster floors; closed forms from finish/cusp_profile_heights.
#include <cmath>

#include "finish/cusp_profile_heights.h"
#include "job/run_job.h"
#include "test_support.h"

namespace cuspmap {
namespace {

Job raster_job(CutterShape shape, double cell_mm) {
  Job job;
  job.name = "cusp";
  job.patch.size_x_mm = 1.0;
  job.patch.size_y_mm = 3.0;
  job.patch.cell_mm = cell_mm;
  job.cutter.shape = shape;
  job.cutter.diameter_mm = 6.0;
  job.path.kind = PathKind::Raster;
  job.path.stepover_mm = 0.3;
  return job;
}

}  // namespace

TEST_CASE("issue_13: run_job reports the handbook cusp at 5, 10 and 20 um cells", "[job]") {
  // Machinery's Handbook cusp height h = R - sqrt(R^2 - (s/2)^2): 6 mm ball, 0.3 mm -> 3.7523 um.
  // Before the fix the floor's highest cell read 3.628, 3.506 and 3.752 um.
  const double h_um = (3.0 - std::sqrt(9.0 - 0.15 * 0.15)) * 1000.0;
  for (const double cell : {0.005, 0.01, 0.02}) {
    CAPTURE(cell);
    const JobRun run = run_job(raster_job(CutterShape::Ball, cell), RunOptions{});
    CHECK(run.cusp_crests > 10);
    REQUIRE_NEAR(run.cusp_um, h_um, 0.005 * h_um);  // issue 13: within 0.5 %
  }
}

TEST_CASE("issue_13: a tilted flat end's cusp is positive while its highest point is below nominal",
          "[job]") {
  Job job = raster_job(CutterShape::Flat, 0.005);
  job.cutter.tilt_deg = 0.5;  // tram error, lowest rim point ahead (toward +X, the feed)
  const JobRun run = run_job(job, RunOptions{});
  CHECK(run.highest_point_um < 0.0);
  // Closed form of the tilted rim (finish/cusp_profile_heights: arcs of R scaled by tan tau;
  // derived): tan(0.5 deg) x 3.7523 um = 0.0327 um.
  const double closed_um = cusp_profile_heights(job.cutter, 0.3).sz_um;
  REQUIRE_NEAR(run.cusp_um, closed_um, 0.02 * closed_um);
}

}  // namespace cuspmap

// Tests of the streamed simulate pipeline: the same ISO 25178-2 height parameters as the
// in-memory run (to float rounding), the same block-mean overview as io/reduce_blocks, the
// ideal cusp profile's Sa, and the grid memory bound.
// Method: agreement with the in-memory texture_report; ideal cusp statistics of circular arcs
// (src/cusp/cusp_profile_stats.h, ISO 4287:1997 §4.2.1 over whole periods).
#include <cmath>
#include <cstring>

#include "cusp/cusp_profile_stats.h"
#include "report/reduce_blocks.h"
#include "job/run_job.h"
#include "sweep/simulate_bands.h"
#include "texture/block_mean_overview.h"
#include "test_support.h"

namespace cuspmap {
namespace {

// Relative agreement of sums taken in a different order (per row, then merged): double
// rounding over ~1e6 terms stays far below 1e-9 of the value.
constexpr double kSumOrderRel = 1e-9;
// Sp and Sv are single residuals rounded to float; a plane solved from sums in another order
// may move one by an ulp of float (~1.2e-7 relative).
constexpr double kFloatUlpRel = 2.4e-7;

Job ball_raster_job(double size_mm, double cell_mm, double diameter_mm, double stepover_mm) {
  Job job;
  job.name = "mould insert ball raster";
  job.patch.size_x_mm = job.patch.size_y_mm = size_mm;
  job.patch.cell_mm = cell_mm;
  job.cutter.shape = CutterShape::Ball;
  job.cutter.diameter_mm = diameter_mm;
  job.cut.rpm = 12000.0;
  job.cut.feed_mm_per_min = 2000.0;
  job.path.kind = PathKind::Raster;
  job.path.stepover_mm = stepover_mm;
  job.path.direction = RasterDirection::Zigzag;
  return job;
}

void check_rel(double a, double b, double rel) { REQUIRE_NEAR(a, b, rel * std::abs(b)); }

// The streamed run's height parameters equal the in-memory run's: sums to summation-order
// rounding, extremes to a float ulp, the highest and lowest heights exactly.
void require_same_heights(const JobRun& in_memory, const JobRun& streamed) {
  const ArealParameters& p = in_memory.texture.areal.parameters;
  const ArealParameters& q = streamed.texture.areal.parameters;
  CHECK(q.cells == p.cells);
  check_rel(q.sa_um, p.sa_um, kSumOrderRel);
  check_rel(q.sq_um, p.sq_um, kSumOrderRel);
  check_rel(q.ssk, p.ssk, kSumOrderRel);
  check_rel(q.sku, p.sku, kSumOrderRel);
  check_rel(q.sp_um, p.sp_um, kFloatUlpRel);
  check_rel(q.sv_um, p.sv_um, kFloatUlpRel);
  CHECK(streamed.highest_point_um == in_memory.highest_point_um);
  CHECK(streamed.lowest_point_um == in_memory.lowest_point_um);
}

}  // namespace

TEST_CASE("run_job: streamed = in-memory when the rows are not a whole number of tiles", "[job]") {
  // 5 mm at 5 um: 1000 rows, 31.25 tile rows of 32. One band of all rows used to skip the last,
  // partial tile row (its cells kept whatever the band buffer held); several bands end with a
  // partial one.
  const Job job = ball_raster_job(5.0, 0.005, 10.0, 0.4);
  RunOptions mem;
  mem.threads = 2;
  const JobRun a = run_job(job, mem);
  for (const std::int64_t limit : {std::int64_t{1} << 30, std::int64_t{4} << 20}) {
    RunOptions streamed = mem;
    streamed.stream = StreamMode::Always;
    streamed.max_memory_bytes = limit;
    const JobRun b = run_job(job, streamed);
    CAPTURE(limit, b.bands);
    REQUIRE(b.streamed);
    require_same_heights(a, b);
  }
}

TEST_CASE("run_job: streamed and in-memory runs give the same height parameters", "[job]") {
  const Job job = ball_raster_job(8.0, 0.005, 10.0, 0.4);
  RunOptions mem;
  mem.threads = 2;
  RunOptions streamed = mem;
  streamed.stream = StreamMode::Always;
  streamed.max_memory_bytes = 4 << 20;  // 1 MiB bands: several of them
  const JobRun a = run_job(job, mem);
  const JobRun b = run_job(job, streamed);
  REQUIRE_FALSE(a.streamed);
  REQUIRE(b.streamed);
  REQUIRE(b.bands > 2);
  CHECK(b.peak_grid_bytes <= streamed.max_memory_bytes / 4);
  CHECK(b.grid_nx == a.floor.nx);
  CHECK(b.grid_ny == a.floor.ny);
  require_same_heights(a, b);
  // Profiles: columns across the lay (fewer of them, so Ra and, with RSm on a table boundary,
  // the cut-off may differ).
  CHECK(b.texture.profile.direction_deg == 90.0);
  // The overview is io/reduce_blocks' block mean of the in-memory floor, bit for bit.
  const HeightGrid reduced =
      reduce_blocks(a.floor.z_um, b.overview_cells_per_pixel, BlockReduce::Mean);
  REQUIRE(reduced.rows() == b.floor.z_um.rows());
  REQUIRE(reduced.cols() == b.floor.z_um.cols());
  CHECK(std::memcmp(reduced.data(), b.floor.z_um.data(), reduced.size() * sizeof(float)) == 0);
}

TEST_CASE("BlockMeanOverview: bands of any height give reduce_blocks' block means", "[texture]") {
  const Job job = ball_raster_job(3.0, 0.01, 4.0, 0.25);
  RunOptions mem;
  const JobRun a = run_job(job, mem);
  Heightfield hf = a.floor;
  hf.z_um(5, 7) = kUnreached;  // unreached cells are left out of their block's mean
  hf.z_um.block(40, 0, 13, 13).setConstant(kUnreached);
  BlockMeanOverview overview(hf.nx, hf.ny, hf.cell_mm, 0.0, 0.0, 37);
  REQUIRE(overview.cells_per_block() == 9);  // ceil(300 / 37)
  for (int j0 = 0; j0 < hf.ny; j0 += 17) {  // bands that do not align with the blocks
    Heightfield band = hf;
    band.ny = std::min(17, hf.ny - j0);
    band.z_um = hf.z_um.middleRows(j0, band.ny);
    overview.add_band(band, j0, 2);
  }
  const HeightGrid expected = reduce_blocks(hf.z_um, 9, BlockReduce::Mean);
  const Heightfield got = overview.result();
  REQUIRE(got.z_um.rows() == expected.rows());
  CHECK(std::memcmp(expected.data(), got.z_um.data(), expected.size() * sizeof(float)) == 0);
  CHECK(got.cell_mm == 9 * hf.cell_mm);
}

TEST_CASE("run_job: streamed ball raster Sa matches the ideal cusp profile", "[job]") {
  // 10 mm ball at 0.4 mm stepover: the cross-feed profile is circular arcs of radius 5 mm with
  // half-chord 0.2 mm; the floor's Sa is that profile's Ra (the height does not vary along the
  // feed). Source: arc_cusp_stats, exact-circle Ra of ISO 4287 §4.2.1 (cusp_profile_stats.h).
  const Job job = ball_raster_job(12.0, 0.004, 10.0, 0.4);
  RunOptions streamed;
  streamed.stream = StreamMode::Always;
  streamed.max_memory_bytes = 16 << 20;
  const JobRun run = run_job(job, streamed);
  REQUIRE(run.streamed);
  const ProfileStats ideal = arc_cusp_stats(5.0, 0.2, 0.0);
  // The 1 % agreement: the patch holds 30 whole periods and its passes start at the
  // patch edge, so edge cells shift the mean by well under 1 %.
  check_rel(run.texture.areal.parameters.sa_um, ideal.ra_um, 0.01);
}

}  // namespace cuspmap

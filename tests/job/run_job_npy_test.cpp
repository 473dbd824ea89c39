// A streamed run's full-resolution outputs: height.npy written band by band (first pass) is the
// in-memory run's encode_npy byte for byte, and the centre traces copied from the bands for
// profile.png are the in-memory floor's extract_profiles traces sample for sample.
// Method: simulate_bands rows are bit-identical to simulate_floor's (sweep/simulate_bands.h);
// numpy.lib.format C order (NEP 1).
#include <cmath>
#include <optional>

#include "core/input_error.h"
#include "io/npy.h"
#include "io/npy_band_writer.h"
#include "report/simulation_pictures.h"
#include "job/run_job.h"
#include "test_support.h"

namespace cuspmap {
namespace {

// Pump-cover floor: 6 x 4 mm at 5 um, 6 mm ball, 0.3 mm zigzag (RSm 0.3 mm: lc 0.8 mm by
// ISO 4288 Table 3, away from a table boundary so both runs pick the same cut-off), origin off 0
// and a non-square patch so a row/column mix-up changes the bytes.
Job pump_cover_job() {
  Job job;
  job.name = "pump cover ball raster";
  job.patch.size_x_mm = 6.0;
  job.patch.size_y_mm = 4.0;
  job.patch.origin_x_mm = -3.0;
  job.patch.origin_y_mm = 10.0;
  job.patch.cell_mm = 0.005;
  job.cutter.shape = CutterShape::Ball;
  job.cutter.diameter_mm = 6.0;
  job.cut.rpm = 12000.0;
  job.cut.feed_mm_per_min = 1500.0;
  job.path.kind = PathKind::Raster;
  job.path.stepover_mm = 0.3;
  job.path.direction = RasterDirection::Zigzag;
  return job;
}

// Trace positions are sums of cell sizes taken in a different order by extract_profiles (line
// clipping) and TraceCollector (index arithmetic): equal to ~1e-15 mm; 1e-9 cell is far above
// that and far below any sample shift (a whole cell).
constexpr double kPositionTolCells = 1e-9;

void require_same_runs(const std::vector<ProfileTrace>& a, const std::vector<ProfileTrace>& b) {
  REQUIRE(a.size() == b.size());
  for (size_t t = 0; t < a.size(); ++t) {
    CAPTURE(t);
    CHECK(a[t].spacing_mm == b[t].spacing_mm);
    REQUIRE_NEAR(a[t].start_mm, b[t].start_mm, kPositionTolCells * a[t].spacing_mm);
    REQUIRE_NEAR(a[t].offset_mm, b[t].offset_mm, kPositionTolCells * a[t].spacing_mm);
    CHECK(a[t].z_um == b[t].z_um);
  }
}

}  // namespace

TEST_CASE("run_job: a streamed run's band-by-band height.npy is the in-memory file byte for byte",
          "[job]") {
  const Job job = pump_cover_job();
  RunOptions mem;
  mem.threads = 2;
  const JobRun in_memory = run_job(job, mem);
  REQUIRE_FALSE(in_memory.streamed);
  const std::string expected = encode_npy(in_memory.floor);

  test::TempDir dir;
  const std::string path = dir.file("height.npy");
  RunOptions streamed = mem;
  streamed.stream = StreamMode::Always;
  streamed.max_memory_bytes = 2 << 20;  // 0.5 MiB bands: several, the last one short
  std::optional<NpyBandWriter> npy;
  int begun = 0;
  streamed.stream_begin = [&](int nx, int ny) {
    ++begun;
    CHECK(nx == in_memory.floor.nx);
    CHECK(ny == in_memory.floor.ny);
    npy.emplace(path, nx, ny);
  };
  streamed.stream_band = [&](const Heightfield& band, int j0) {
    CHECK(band.z_um.size() * sizeof(float) <=
          static_cast<size_t>(streamed.max_memory_bytes / 4));
    npy->append(band, j0);
  };
  const JobRun run = run_job(job, streamed);
  REQUIRE(run.streamed);
  REQUIRE(run.bands > 2);
  CHECK(begun == 1);
  REQUIRE(npy);
  CHECK(npy->rows_written() == in_memory.floor.ny);  // pass 1 only, never the second pass
  npy->commit();
  const std::string got = test::read_text(path);
  REQUIRE(got.size() == expected.size());
  CHECK(got == expected);
}

TEST_CASE("run_job: streamed centre traces are the in-memory floor's, so profile.png matches",
          "[job]") {
  const Job job = pump_cover_job();
  RunOptions mem;
  mem.threads = 2;
  RunOptions streamed = mem;
  streamed.stream = StreamMode::Always;
  streamed.max_memory_bytes = 2 << 20;
  const JobRun a = run_job(job, mem);
  const JobRun b = run_job(job, streamed);
  REQUIRE(b.streamed);
  // The raster lay is 0 deg: across is 90 deg (columns), along 0 deg (rows) in both runs.
  REQUIRE(a.texture.profile.direction_deg == 90.0);
  REQUIRE(b.texture.profile.direction_deg == 90.0);
  require_same_runs(b.centre_traces[0], extract_profiles(a.floor, 90.0, 1, 0.0));
  require_same_runs(b.centre_traces[1], extract_profiles(a.floor, 0.0, 1, 0.0));
  CHECK(a.centre_traces[0].empty());  // in memory they are read from the floor when drawn

  const std::vector<ProfilePlotData> pa = simulation_profiles(a), pb = simulation_profiles(b);
  REQUIRE(pa.size() == 2);
  REQUIRE(pb.size() == 2);
  REQUIRE(b.texture.profile.cutoff_mm == a.texture.profile.cutoff_mm);
  for (int k = 0; k < 2; ++k) {
    CAPTURE(k);
    CHECK(pb[k].title == pa[k].title);
    CHECK(pb[k].z_um == pa[k].z_um);
    CHECK(pb[k].mean_line_um == pa[k].mean_line_um);
    CHECK(pb[k].ra_um == pa[k].ra_um);
    CHECK(pb[k].rz_um == pa[k].rz_um);
  }
  const SimulationPictures qa = render_simulation_pictures(a, LengthUnit::Millimetre, std::nullopt);
  const SimulationPictures qb = render_simulation_pictures(b, LengthUnit::Millimetre, std::nullopt);
  REQUIRE_FALSE(qb.profile_png.empty());
  CHECK(qb.profile_png == qa.profile_png);
  CHECK(qb.profile_caption == qa.profile_caption);
}

}  // namespace cuspmap

namespace cuspmap {

TEST_CASE("run_job: stream_begin can refuse a streamed run before any band is swept", "[job]") {
  RunOptions streamed;
  streamed.threads = 1;
  streamed.stream = StreamMode::Always;
  int bands = 0;
  streamed.stream_begin = [](int nx, int ny) {
    throw InputError("refused " + std::to_string(nx) + " x " + std::to_string(ny));
  };
  streamed.stream_band = [&](const Heightfield&, int) { ++bands; };
  // 6 x 4 mm at 5 um: 1200 columns, 800 rows.
  REQUIRE_THROWS_WITH(run_job(pump_cover_job(), streamed), "refused 1200 x 800");
  CHECK(bands == 0);
  // In memory the hooks are never called.
  RunOptions mem = streamed;
  mem.stream = StreamMode::Never;
  CHECK_NOTHROW(run_job(pump_cover_job(), mem));
  CHECK(bands == 0);
}

}  // namespace cuspmap

// Large floors through the whole streamed pipeline (sweep in bands, two passes, streaming areal
// statistics, traces, overview): grid cells finalised per second against floor area, path length
// and threads, and a stream-like min-update kernel over the same cell count in band-sized
// buffers (the memory bound of the streamed run). Figures go to docs/performance.md.
// Method: Google Benchmark; job of the issue (10 mm ball, 0.4 mm zigzag raster, square floors).
#include <benchmark/benchmark.h>

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <limits>
#include <vector>

#include "job/run_job.h"
#include "texture/streamed_texture.h"

namespace cuspmap {
namespace {

// size x size mm at `cell_mm`, 10 mm ball, zigzag raster at `stepover_mm` along X.
Job floor_job(double size_mm, double cell_mm, double stepover_mm) {
  Job job;
  job.name = "mould insert floor";
  job.patch.size_x_mm = job.patch.size_y_mm = size_mm;
  job.patch.cell_mm = cell_mm;
  job.cutter.shape = CutterShape::Ball;
  job.cutter.diameter_mm = 10.0;
  job.cutter.teeth = 2;
  job.cut.rpm = 12000.0;
  job.cut.feed_mm_per_min = 2400.0;
  job.path.kind = PathKind::Raster;
  job.path.stepover_mm = stepover_mm;
  job.path.direction = RasterDirection::Zigzag;
  return job;
}

void run_streamed(benchmark::State& state, double size_mm, double cell_mm, double stepover_mm,
                  int threads) {
  const Job job = floor_job(size_mm, cell_mm, stepover_mm);
  RunOptions options;
  options.stream = StreamMode::Always;
  options.threads = threads;
  std::int64_t cells = 0, moves = 0;
  double sa_um = 0.0;
  for (auto _ : state) {
    const JobRun run = run_job(job, options);
    cells = static_cast<std::int64_t>(run.grid_nx) * run.grid_ny;
    moves = static_cast<std::int64_t>(run.built.path.moves.size());
    sa_um = run.texture.areal.parameters.sa_um;
  }
  state.counters["cells"] = static_cast<double>(cells);
  state.counters["moves"] = static_cast<double>(moves);
  state.counters["Sa_um"] = sa_um;
  state.counters["cells_per_s"] = benchmark::Counter(
      static_cast<double>(cells) * static_cast<double>(state.iterations()),
      benchmark::Counter::kIsRate);
}

// Area: 10, 20, 40 mm square at 5 um (4e6 .. 6.4e7 cells), 0.4 mm stepover, all cores.
void BM_StreamedArea(benchmark::State& state) {
  run_streamed(state, static_cast<double>(state.range(0)), 0.005, 0.4, 0);
}
BENCHMARK(BM_StreamedArea)->Arg(10)->Arg(20)->Arg(40)->Unit(benchmark::kMillisecond)
    ->MeasureProcessCPUTime()->UseRealTime();

// Path length: 20 mm at 5 um, stepover 0.8, 0.4, 0.2, 0.1 mm (range in um): 2x the passes each.
void BM_StreamedPathLength(benchmark::State& state) {
  run_streamed(state, 20.0, 0.005, static_cast<double>(state.range(0)) / 1000.0, 0);
}
BENCHMARK(BM_StreamedPathLength)->Arg(800)->Arg(400)->Arg(200)->Arg(100)
    ->Unit(benchmark::kMillisecond)->MeasureProcessCPUTime()->UseRealTime();

// Threads: 40 mm at 5 um on 1 and 2 sweep threads (statistics run on the calling thread).
void BM_StreamedThreads(benchmark::State& state) {
  run_streamed(state, 40.0, 0.005, 0.4, static_cast<int>(state.range(0)));
}
BENCHMARK(BM_StreamedThreads)->Arg(1)->Arg(2)->Unit(benchmark::kMillisecond)
    ->MeasureProcessCPUTime()->UseRealTime();

// The streamed statistics alone (no sweep): pass 1 (plane sums, extremes, block-mean overview,
// traces) and pass 2 (residual moments) of StreamedTexture over a 16384-column floor fed as
// four 64 MiB bands of a cusp pattern (6.7e7 cells, the 40 mm floor's size), on 1 and 2 threads.
// Rate: cells finalised (both passes) per second.
void BM_StreamedStatistics(benchmark::State& state) {
  constexpr int kNx = 16384, kBandRows = 1024, kBands = 4;
  constexpr double kCellMm = 0.0025;
  Heightfield band;
  band.nx = kNx;
  band.ny = kBandRows;
  band.cell_mm = kCellMm;
  band.z_um.resize(kBandRows, kNx);
  for (int j = 0; j < kBandRows; ++j) {
    // 10 mm ball at 0.4 mm stepover across Y, a slight tilt along X (derived geometry).
    const double v = std::fmod(j * kCellMm, 0.4) - 0.2;
    const double cusp_um = 1000.0 * (5.0 - std::sqrt(25.0 - v * v));
    for (int i = 0; i < kNx; ++i) band.z_um(j, i) = static_cast<float>(cusp_um + 1e-4 * i);
  }
  TextureOptions options;
  const int threads = static_cast<int>(state.range(0));
  double sa_um = 0.0;
  for (auto _ : state) {
    StreamedTexture texture(kNx, kBandRows * kBands, kCellMm, 0.0, 0.0, options, threads);
    for (int b = 0; b < kBands; ++b) {
      band.origin_y_mm = b * kBandRows * kCellMm;
      texture.add_first_pass(band, b * kBandRows);
    }
    texture.finish_first_pass();
    for (int b = 0; b < kBands; ++b) {
      band.origin_y_mm = b * kBandRows * kCellMm;
      texture.add_second_pass(band);
    }
    state.PauseTiming();  // the profile filtering of report() is per run, not per cell
    sa_um = texture.report().areal.parameters.sa_um;
    state.ResumeTiming();
  }
  state.counters["Sa_um"] = sa_um;
  state.counters["cells_per_s"] = benchmark::Counter(
      static_cast<double>(kNx) * kBandRows * kBands * static_cast<double>(state.iterations()),
      benchmark::Counter::kIsRate);
}
BENCHMARK(BM_StreamedStatistics)->Arg(1)->Arg(2)->Unit(benchmark::kMillisecond)
    ->MeasureProcessCPUTime()->UseRealTime();

// The memory bound: one z = min(z, h) per cell of a 40 mm floor at 5 um (6.4e7 cells), done in
// 64 MiB bands like the streamed sweep's (each band refilled with +inf first, as the sweep does).
void BM_StreamKernelBands(benchmark::State& state) {
  constexpr std::int64_t kCells = 8000LL * 8000LL;
  constexpr std::int64_t kBandCells = (std::int64_t{64} << 20) / sizeof(float);
  std::vector<float> band(static_cast<std::size_t>(kBandCells));
  const float h = 1.5f;
  for (auto _ : state) {
    for (std::int64_t done = 0; done < kCells; done += kBandCells) {
      const std::int64_t n = std::min(kBandCells, kCells - done);
      std::fill(band.begin(), band.begin() + n, std::numeric_limits<float>::infinity());
      for (std::int64_t i = 0; i < n; ++i) band[static_cast<std::size_t>(i)] =
          std::min(band[static_cast<std::size_t>(i)], h);
      benchmark::ClobberMemory();
    }
  }
  state.counters["cells_per_s"] = benchmark::Counter(
      static_cast<double>(kCells) * static_cast<double>(state.iterations()),
      benchmark::Counter::kIsRate);
}
BENCHMARK(BM_StreamKernelBands)->Unit(benchmark::kMillisecond)->MeasureProcessCPUTime()
    ->UseRealTime();

}  // namespace
}  // namespace cuspmap

BENCHMARK_MAIN();

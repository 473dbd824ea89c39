// Speed of the sweep: cells per second of the envelope and tooth-resolved sweeps, the same job
// through the brute-force stamping oracle (speed ratio and disagreement), and a stream-like
// minimum-update kernel over as many cell updates as the envelope sweep does (the memory
// bandwidth bound of any Z-map minimum update). Figures go to docs/performance.md.
// Method: Google Benchmark; job sizes from the issue (12 x 12 mm at 10 um, 6 mm ball, 0.3 mm
// stepover; 10 x 10 mm at 2 um, 3-flute flat end mill, fz 0.05 mm, 1 deg dish).
#include <benchmark/benchmark.h>

#include <algorithm>
#include <cmath>
#include <vector>

#include "path/raster.h"
#include "sweep/brute_force_stamp.h"
#include "sweep/simulate_floor.h"

namespace cuspmap {
namespace {

struct Job {
  Cutter cutter;
  Patch patch;
  CutSpec cut;
  Toolpath path;
};

// 12 x 12 mm at 10 um, 6 mm ball, 0.3 mm stepover, zigzag, raster at `angle_deg`.
Job ball_job(double angle_deg) {
  Job j;
  j.cutter.shape = CutterShape::Ball;
  j.cutter.diameter_mm = 6.0;
  j.cutter.teeth = 2;
  j.patch.size_x_mm = j.patch.size_y_mm = 12.0;
  j.patch.cell_mm = 0.01;
  PathSpec spec;
  spec.stepover_mm = 0.3;
  spec.angle_deg = angle_deg;
  spec.direction = RasterDirection::Zigzag;
  j.path = raster_path(spec, j.cut, j.patch, j.cutter);
  return j;
}

// size x size mm at `cell`, 6 mm 3-flute flat end mill, 1 deg dish, fz 0.05 mm at 10000 rpm,
// 0.5 mm stepover zigzag, 0.01 deg tram error across the feed (the pump-cover demo's tool).
Job flat_job(double size_mm, double cell_mm) {
  Job j;
  j.cutter.shape = CutterShape::Flat;
  j.cutter.diameter_mm = 6.0;
  j.cutter.dish_deg = 1.0;
  j.cutter.teeth = 3;
  j.cutter.tilt_deg = 0.01;
  j.cutter.tilt_toward_deg = 90.0;
  j.patch.size_x_mm = j.patch.size_y_mm = size_mm;
  j.patch.cell_mm = cell_mm;
  j.cut.rpm = 10000.0;
  j.cut.feed_mm_per_min = 0.05 * 3 * j.cut.rpm;
  PathSpec spec;
  spec.stepover_mm = 0.5;
  spec.direction = RasterDirection::Zigzag;
  j.path = raster_path(spec, j.cut, j.patch, j.cutter);
  return j;
}

void sweep(benchmark::State& state, const Job& job, bool teeth, int threads) {
  SimSpec sim;
  sim.tooth_marks = teeth;
  sim.threads = threads;
  SweepStats stats;
  std::int64_t cells = 0;
  for (auto _ : state) {
    const Heightfield hf = simulate_floor(job.cutter, job.path, job.cut, job.patch, sim, &stats);
    cells = hf.cells();
    benchmark::DoNotOptimize(hf.z_um.data());
  }
  state.counters["grid_cells_per_s"] =
      benchmark::Counter(static_cast<double>(cells), benchmark::Counter::kIsIterationInvariantRate);
  state.counters["cell_updates_per_s"] = benchmark::Counter(
      static_cast<double>(stats.cell_updates), benchmark::Counter::kIsIterationInvariantRate);
  state.counters["cell_updates"] = static_cast<double>(stats.cell_updates);
}

void BM_EnvelopeBall(benchmark::State& state) {
  sweep(state, ball_job(static_cast<double>(state.range(0))), false,
        static_cast<int>(state.range(1)));
}
BENCHMARK(BM_EnvelopeBall)
    ->ArgsProduct({{0, 30}, {1, 2}})
    ->ArgNames({"angle_deg", "threads"})
    ->Unit(benchmark::kMillisecond)
    ->MeasureProcessCPUTime()
    ->UseRealTime();

// The same job through the brute-force oracle, sampled every 0.049 mm: its own sagitta
// (ds/2)^2 / 2R is then 0.1 um, the disagreement the issue allows. Reports the measured
// largest disagreement with the envelope sweep.
void BM_BruteForceBall(benchmark::State& state) {
  const Job job = ball_job(0.0);
  const double step_mm = 2.0 * std::sqrt(2.0 * 3.0 * 1e-4);
  double worst_um = 0.0;
  for (auto _ : state) {
    const Heightfield hf = test::brute_force_stamp(job.cutter, job.path, job.patch, step_mm);
    benchmark::DoNotOptimize(hf.z_um.data());
    state.PauseTiming();
    SimSpec sim;
    const Heightfield fast = simulate_floor(job.cutter, job.path, job.cut, job.patch, sim);
    for (std::int64_t k = 0; k < hf.cells(); ++k) {
      const float a = hf.z_um.data()[k], b = fast.z_um.data()[k];
      if (std::isfinite(a) && std::isfinite(b))
        worst_um = std::max(worst_um, double(std::abs(a - b)));
    }
    state.ResumeTiming();
  }
  state.counters["grid_cells_per_s"] =
      benchmark::Counter(static_cast<double>(job.patch.size_x_mm / job.patch.cell_mm *
                                             job.patch.size_y_mm / job.patch.cell_mm),
                         benchmark::Counter::kIsIterationInvariantRate);
  state.counters["max_disagreement_um"] = worst_um;
}
BENCHMARK(BM_BruteForceBall)
    ->Unit(benchmark::kMillisecond)
    ->Iterations(1)
    ->MeasureProcessCPUTime()
    ->UseRealTime();

// Stream-like bound: z = min(z, h_row) over a grid of `cells` floats, repeated until it has done
// as many cell updates as the envelope sweep of ball_job(0) (read + write 4 bytes per update).
// With the job's own grid (1.44 M cells, 5.8 MB) it runs from the last-level cache like the
// sweep does; with 64 M cells (256 MB) from main memory.
void BM_StreamMinUpdate(benchmark::State& state) {
  const Job job = ball_job(0.0);
  SweepStats stats;
  simulate_floor(job.cutter, job.path, job.cut, job.patch, SimSpec{}, &stats);
  const std::int64_t cells = state.range(0);
  const int nx = 1200;
  const std::int64_t ny = cells / nx;
  std::vector<float> z(static_cast<std::size_t>(nx * ny), 1e30f);
  const std::int64_t rows_total = std::max<std::int64_t>(ny, stats.cell_updates / nx);
  for (auto _ : state) {
    for (std::int64_t k = 0; k < rows_total; ++k) {
      float* row = z.data() + static_cast<std::size_t>((k % ny) * nx);
      const float h = static_cast<float>(k % 97);
      for (int i = 0; i < nx; ++i) row[i] = std::min(row[i], h);
    }
    benchmark::DoNotOptimize(z.data());
    benchmark::ClobberMemory();
  }
  state.counters["cell_updates_per_s"] = benchmark::Counter(
      static_cast<double>(rows_total * nx), benchmark::Counter::kIsIterationInvariantRate);
}
BENCHMARK(BM_StreamMinUpdate)
    ->Arg(1440000)
    ->Arg(64 * 1024 * 1024)
    ->ArgNames({"cells"})
    ->Unit(benchmark::kMillisecond)
    ->MeasureProcessCPUTime()
    ->UseRealTime();

void BM_TeethFlat(benchmark::State& state) {
  const double size = static_cast<double>(state.range(0));
  const double cell = static_cast<double>(state.range(1)) * 1e-3;
  sweep(state, flat_job(size, cell), true, 2);
}
BENCHMARK(BM_TeethFlat)
    ->Args({2, 2})
    ->Args({10, 2})
    ->ArgNames({"size_mm", "cell_um"})
    ->Unit(benchmark::kMillisecond)
    ->Iterations(1)
    ->MeasureProcessCPUTime()
    ->UseRealTime();

}  // namespace
}  // namespace cuspmap

BENCHMARK_MAIN();

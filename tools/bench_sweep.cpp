// Speed of the sweep: cells per second of the envelope and tooth-resolved sweeps, the same job
// through the brute-force stamping oracle (speed ratio and disagreement), and a stream-like
// kernel doing one minimum update per cell over the same grid (the memory-bandwidth bound of
// any Z-map pass over the floor). Figures go to docs/performance.md.
// Method: Google Benchmark; job sizes from the issue (12 x 12 mm at 10 um, 6 mm ball, 0.3 mm
// stepover; 10 x 10 mm at 2 um, 3-flute flat end mill, fz 0.05 mm, 1 deg dish).
#include <benchmark/benchmark.h>

#include <algorithm>
#include <cmath>
#include <thread>
#include <vector>

#include "job/job.h"
#include "job/run_estimate.h"
#include "path/build_toolpath.h"
#include "path/raster.h"
#include "sweep/brute_force_stamp.h"
#include "sweep/bin_moves.h"
#include "sweep/prepare_moves.h"
#include "sweep/simulate_floor.h"
#include "sweep/sweep_setup.h"
#include "sweep/sweep_tiles.h"

namespace cuspmap {
namespace {

struct Job {
  Cutter cutter;
  Patch patch;
  CutSpec cut;
  Toolpath path;
};

// size x size mm at `cell_mm`, 6 mm ball, 0.3 mm stepover, zigzag, raster at `angle_deg`
// (12 x 12 mm at 10 um: the job; 40 x 40 mm at 5 um: a 64 M-cell floor in main memory).
Job ball_job(double angle_deg, double size_mm = 12.0, double cell_mm = 0.01,
             RasterDirection direction = RasterDirection::Zigzag) {
  Job j;
  j.cutter.shape = CutterShape::Ball;
  j.cutter.diameter_mm = 6.0;
  j.cutter.teeth = 2;
  j.patch.size_x_mm = j.patch.size_y_mm = size_mm;
  j.patch.cell_mm = cell_mm;
  PathSpec spec;
  spec.stepover_mm = 0.3;
  spec.angle_deg = angle_deg;
  spec.direction = direction;
  j.path = raster_path(spec, j.cut, j.patch, j.cutter);
  return j;
}

// Benchmark argument `size` 12 is the 12 x 12 mm job at 10 um, 40 the 40 x 40 mm one at 5 um.
Job sized_ball_job(double angle_deg, std::int64_t size,
                   RasterDirection direction = RasterDirection::Zigzag) {
  return size == 40 ? ball_job(angle_deg, 40.0, 0.005, direction)
                    : ball_job(angle_deg, 12.0, 0.01, direction);
}

// size x size mm at `cell`, 6 mm 3-flute flat end mill, 1 deg dish, fz 0.05 mm at 10000 rpm,
// 0.5 mm stepover zigzag, `tram_deg` tram error across the feed (0.01 deg: the pump-cover demo's
// tool; 0: a trammed spindle, where every overlapping pass ties at the rim's height).
Job flat_job(double size_mm, double cell_mm, double tram_deg = 0.01) {
  Job j;
  j.cutter.shape = CutterShape::Flat;
  j.cutter.diameter_mm = 6.0;
  j.cutter.dish_deg = 1.0;
  j.cutter.teeth = 3;
  j.cutter.tilt_deg = tram_deg;
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

// simulate_floor end to end (grid allocation and its NaN fill included).
void BM_EnvelopeBall(benchmark::State& state) {
  sweep(state, sized_ball_job(static_cast<double>(state.range(1)), state.range(0)), false,
        static_cast<int>(state.range(2)));
}
BENCHMARK(BM_EnvelopeBall)
    ->ArgsProduct({{12, 40}, {0, 30}, {1, 2}})
    ->ArgNames({"size_mm", "angle_deg", "threads"})
    ->Unit(benchmark::kMillisecond)
    ->MeasureProcessCPUTime()
    ->UseRealTime();

// The sweep alone into a grid allocated once (what the stream kernel below is compared with):
// setup, move preparation, binning and the tile sweep, every cell written.
void sweep_stage(benchmark::State& state, RasterDirection direction) {
  const Job job = sized_ball_job(static_cast<double>(state.range(1)), state.range(0), direction);
  const int threads = static_cast<int>(state.range(2));
  Heightfield hf = make_heightfield(job.patch, 0);
  // `general` switches the level-distance path off (the reference for the disagreement).
  auto run = [&](Heightfield& out, bool general) {
    SweepSetup setup = sweep_setup(job.cutter, job.cut, job.patch);
    if (general) setup.level_distance = false;
    PreparedCounts counts;
    const std::vector<PreparedMove> moves =
        prepare_moves(job.path, job.cut, job.patch, setup.envelope.reach_mm,
                      setup.top_mm + kReachMarginMm, counts);
    const TileGrid tiles = tile_grid(out.nx, out.ny);
    const std::vector<std::vector<int>> bins =
        bin_moves(moves, tiles, setup.cell_mm, setup.envelope.reach_mm);
    std::vector<TileRect> rects(tiles.count());
    for (int t = 0; t < tiles.count(); ++t) rects[t] = tiles.rect(t);
    sweep_tiles(setup, moves, bins, rects, SweepMode::Envelope, out.z_um.data(), 0, threads, {});
  };
  for (auto _ : state) {
    run(hf, false);
    benchmark::DoNotOptimize(hf.z_um.data());
    benchmark::ClobberMemory();
  }
  state.counters["grid_cells_per_s"] = benchmark::Counter(
      static_cast<double>(hf.cells()), benchmark::Counter::kIsIterationInvariantRate);
  // Largest disagreement with the general envelope kernels, cells with a profile slope <= 1
  // (heights up to R (1 - 1/sqrt 2), every cusp of this job); NaN cells must match.
  Heightfield general = make_heightfield(job.patch, 0);
  run(general, true);
  const double r_um = 1000.0 * job.cutter.radius_mm();
  double worst_um = 0.0;
  std::int64_t nan_mismatch = 0;
  for (std::int64_t k = 0; k < hf.cells(); ++k) {
    const float a = hf.z_um.data()[k], b = general.z_um.data()[k];
    nan_mismatch += std::isnan(a) != std::isnan(b);
    if (std::isfinite(a) && std::isfinite(b) && b <= r_um * (1.0 - std::sqrt(0.5))) {
      worst_um = std::max(worst_um, static_cast<double>(std::abs(a - b)));
    }
  }
  state.counters["max_diff_vs_general_um"] = worst_um;
  state.counters["nan_mismatch"] = static_cast<double>(nan_mismatch);
}
void BM_SweepStageBall(benchmark::State& state) { sweep_stage(state, RasterDirection::Zigzag); }
BENCHMARK(BM_SweepStageBall)
    ->ArgsProduct({{12, 40}, {0, 30}, {1, 2}})
    ->ArgNames({"size_mm", "angle_deg", "threads"})
    ->Unit(benchmark::kMillisecond)
    ->MeasureProcessCPUTime()
    ->UseRealTime();

// The same sweep stage with one-way passes (each pass in the same direction, rapid returns).
void BM_SweepStageBallOneWay(benchmark::State& state) {
  sweep_stage(state, RasterDirection::OneWay);
}
BENCHMARK(BM_SweepStageBallOneWay)
    ->ArgsProduct({{12, 40}, {0, 30}, {1, 2}})
    ->ArgNames({"size_mm", "angle_deg", "threads"})
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

// Stream-like bound: exactly one z[i] = min(z[i], h_row) per cell over a grid of the job's own
// size (12 x 12 mm at 10 um: 1200 x 1200 cells, 5.8 MB, cache-resident like the sweep; 40 x 40 mm
// at 5 um: 8000 x 8000 cells, 256 MB, main memory), rows split between `threads` workers the way
// the sweep splits tiles. Read + write 4 bytes per cell.
void BM_StreamMinUpdate(benchmark::State& state) {
  const int n = state.range(0) == 40 ? 8000 : 1200;
  const int threads = static_cast<int>(state.range(1));
  std::vector<float> z(static_cast<std::size_t>(n) * n, 1e30f);
  auto rows = [&](int j0, int j1) {
    for (int j = j0; j < j1; ++j) {
      float* row = z.data() + static_cast<std::size_t>(j) * n;
      const float h = static_cast<float>(j % 97);
      for (int i = 0; i < n; ++i) row[i] = std::min(row[i], h);
    }
  };
  for (auto _ : state) {
    if (threads == 1) {
      rows(0, n);
    } else {
      std::vector<std::thread> pool;
      for (int t = 0; t < threads; ++t) {
        pool.emplace_back(rows, n * t / threads, n * (t + 1) / threads);
      }
      for (std::thread& th : pool) th.join();
    }
    benchmark::DoNotOptimize(z.data());
    benchmark::ClobberMemory();
  }
  state.counters["grid_cells_per_s"] = benchmark::Counter(
      static_cast<double>(n) * n, benchmark::Counter::kIsIterationInvariantRate);
}
BENCHMARK(BM_StreamMinUpdate)
    ->ArgsProduct({{12, 40}, {1, 2}})
    ->ArgNames({"size_mm", "threads"})
    ->Unit(benchmark::kMillisecond)
    ->MeasureProcessCPUTime()
    ->UseRealTime();

void BM_TeethFlat(benchmark::State& state) {
  const double size = static_cast<double>(state.range(0));
  const double cell = static_cast<double>(state.range(1)) * 1e-3;
  const double tram_deg = static_cast<double>(state.range(2)) * 1e-3;
  sweep(state, flat_job(size, cell, tram_deg), true, 2);
}
// The 10 x 10 mm job with the demo's tram error, and a 4 x 4 mm floor with and without
// it (without: no pass's chord minimum lies above a cell's height, the hardest case to prune).
BENCHMARK(BM_TeethFlat)
    ->Args({2, 2, 10})
    ->Args({10, 2, 10})
    ->Args({4, 2, 10})
    ->Args({4, 2, 0})
    ->ArgNames({"size_mm", "cell_um", "tram_mdeg"})
    ->Unit(benchmark::kMillisecond)
    ->Iterations(1)
    ->MeasureProcessCPUTime()
    ->UseRealTime();

// Tooth-resolved sweeps of example jobs, the run forecast's calibration (job/run_estimate.cpp,
// docs/performance.md "Run forecast"): counters give the sweep's visits per move kind
// (teeth_work) and the forecast wall time; compare it with the measured wall time (unloaded
// machine) or half the process CPU time (2 threads, loaded machine).
void BM_TeethExample(benchmark::State& state, const char* example) {
  cuspmap::Job job = load_job(std::string(CUSPMAP_SOURCE_DIR) + "/" + example);
  job.sim.tooth_marks = true;
  job.sim.threads = 2;
  const BuiltPath built = build_toolpath(job.path, job.cut, job.patch, job.cutter);
  CutSpec cut = job.cut;
  cut.spindle = built.spindle;
  for (auto _ : state) {
    const Heightfield hf = simulate_floor(job.cutter, built.path, cut, job.patch, job.sim);
    benchmark::DoNotOptimize(hf.z_um.data());
  }
  const TeethWork work = teeth_work(job.cutter, built.path, cut, job.patch);
  state.counters["line_visits"] = work.line_visits;
  state.counters["arc_visits"] = work.arc_visits;
  state.counters["families"] = work.families;
  state.counters["forecast_s"] = teeth_sweep_seconds(work);
}
BENCHMARK_CAPTURE(BM_TeethExample, flat_zigzag_tram, "examples/pump_cover_flat_zigzag_tram.toml")
    ->Unit(benchmark::kMillisecond)->Iterations(1)->MeasureProcessCPUTime()->UseRealTime();
BENCHMARK_CAPTURE(BM_TeethExample, flat_one_way, "examples/pump_cover_flat_oneway.toml")
    ->Unit(benchmark::kMillisecond)->Iterations(1)->MeasureProcessCPUTime()->UseRealTime();
BENCHMARK_CAPTURE(BM_TeethExample, trochoidal, "examples/bracket_trochoidal.toml")
    ->Unit(benchmark::kMillisecond)->Iterations(1)->MeasureProcessCPUTime()->UseRealTime();
BENCHMARK_CAPTURE(BM_TeethExample, pocket_gcode, "examples/bracket_pocket_gcode.toml")
    ->Unit(benchmark::kMillisecond)->Iterations(1)->MeasureProcessCPUTime()->UseRealTime();

}  // namespace
}  // namespace cuspmap

BENCHMARK_MAIN();

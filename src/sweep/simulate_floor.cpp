// The floor a path leaves: grid allocation, move preparation and binning, then tiles swept in
// parallel by std::thread workers while the calling thread reports progress. Each tile is
// written by one worker only and the minimum does not depend on order, so the heights are
// bit-identical for any thread count. Cost O(cells x moves reaching them) / threads.
// Method: DESIGN.md "Geometry" and "Tooth-resolved"; tiled Z-map (Choi & Jerard 1998).
#include "sweep/simulate_floor.h"

#include <algorithm>
#include <atomic>
#include <chrono>
#include <condition_variable>
#include <exception>
#include <mutex>
#include <thread>
#include <vector>

#include "sweep/bin_moves.h"
#include "sweep/prepare_moves.h"
#include "sweep/sweep_setup.h"
#include "sweep/sweep_tile.h"

namespace cuspmap {
namespace {

// A move whose lowest tip is this far above the highest any cutter point reaches still counts as
// unable to reach the floor: 1 um covers rounding of program coordinates in mm.
constexpr double kReachMarginMm = 1e-3;
// How often the coordinating thread reports progress while workers run.
constexpr std::chrono::milliseconds kProgressPeriod(100);

}  // namespace

Heightfield simulate_floor(const Cutter& cutter, const Toolpath& path, const CutSpec& cut,
                           const Patch& patch, const SimSpec& sim, SweepStats* stats) {
  Heightfield hf = make_heightfield(patch, sim.max_memory_bytes);
  const SweepSetup setup = sweep_setup(cutter, cut, patch);
  PreparedCounts counts;
  const std::vector<PreparedMove> moves = prepare_moves(path, cut, patch, setup.envelope.reach_mm,
                                                        setup.top_mm + kReachMarginMm, counts);
  const TileGrid tiles = tile_grid(hf.nx, hf.ny);
  const std::vector<std::vector<int>> bins =
      bin_moves(moves, tiles, setup.cell_mm, setup.envelope.reach_mm);
  const SweepMode mode = sim.tooth_marks ? SweepMode::Teeth : SweepMode::Envelope;

  int threads =
      sim.threads > 0 ? sim.threads : static_cast<int>(std::thread::hardware_concurrency());
  threads = std::clamp(threads, 1, std::max(1, tiles.count()));
  const int tile_count = tiles.count();
  std::atomic<int> next{0};
  std::atomic<int> done{0};
  std::atomic<bool> failed{false};
  std::vector<std::int64_t> visits(threads, 0);
  std::vector<std::exception_ptr> errors(threads);
  std::mutex mutex;
  std::condition_variable wake;
  float* grid = hf.z_um.data();
  auto last_report = std::chrono::steady_clock::now();
  auto report = [&] {
    if (sim.progress) sim.progress(static_cast<double>(done.load()) / tile_count);
    last_report = std::chrono::steady_clock::now();
  };

  // A worker takes tiles until none is left; `inline_caller` marks the calling thread sweeping
  // by itself (one thread), which then also reports progress between tiles.
  auto worker = [&](int id, bool inline_caller) {
    try {
      for (int t = next++; t < tile_count && !failed; t = next++) {
        visits[id] += sweep_tile(setup, moves, bins[t], tiles.rect(t), mode, grid);
        ++done;
        if (inline_caller && std::chrono::steady_clock::now() - last_report > kProgressPeriod) {
          report();
        }
      }
    } catch (...) {
      errors[id] = std::current_exception();
      failed = true;
    }
    std::lock_guard<std::mutex> lock(mutex);
    wake.notify_all();
  };
  if (threads == 1) {
    worker(0, true);
  } else {
    std::vector<std::thread> pool;
    for (int id = 0; id < threads; ++id) pool.emplace_back(worker, id, false);
    {
      std::unique_lock<std::mutex> lock(mutex);
      while (done.load() < tile_count && !failed) {
        wake.wait_for(lock, kProgressPeriod);
        lock.unlock();
        report();
        lock.lock();
      }
    }
    for (std::thread& th : pool) th.join();
  }
  for (const std::exception_ptr& e : errors) {
    if (e) std::rethrow_exception(e);
  }
  if (sim.progress) sim.progress(1.0);

  if (stats) {
    stats->cell_updates = 0;
    for (std::int64_t v : visits) stats->cell_updates += v;
    stats->moves_swept = counts.swept;
    stats->moves_skipped = counts.skipped;
  }
  return hf;
}

}  // namespace cuspmap

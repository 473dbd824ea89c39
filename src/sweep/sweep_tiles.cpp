// Tile workers: an atomic tile counter shared by std::thread workers, errors carried back to the
// caller, progress reported by the calling thread. Inputs: setup, moves, bins, tiles; output:
// the tiles' cells of the grid (um). Method: see sweep_tiles.h.
#include "sweep/sweep_tiles.h"

#include <algorithm>
#include <atomic>
#include <chrono>
#include <exception>
#include <thread>

namespace cuspmap {
namespace {

// How often the coordinating thread reports progress while workers run.
constexpr std::chrono::milliseconds kProgressPeriod(100);

}  // namespace

int sweep_threads(int requested) {
  return requested > 0 ? requested
                       : std::max(1, static_cast<int>(std::thread::hardware_concurrency()));
}

std::int64_t sweep_tiles(const SweepSetup& setup, const std::vector<PreparedMove>& moves,
                         const std::vector<std::vector<int>>& bins,
                         const std::vector<TileRect>& tiles, SweepMode mode, float* grid,
                         int grid_row0, int threads,
                         const std::function<void(double)>& progress) {
  const int tile_count = static_cast<int>(tiles.size());
  if (tile_count == 0) return 0;
  threads = std::clamp(threads, 1, tile_count);
  std::atomic<int> next{0};
  std::atomic<int> done{0};
  std::atomic<bool> failed{false};
  std::vector<std::int64_t> visits(threads, 0);
  std::vector<std::exception_ptr> errors(threads);
  auto last_report = std::chrono::steady_clock::now();
  auto report = [&] {
    if (progress) progress(static_cast<double>(done.load()) / tile_count);
    last_report = std::chrono::steady_clock::now();
  };

  // A worker takes tiles until none is left; `inline_caller` marks the calling thread, which
  // also reports progress between its tiles.
  auto worker = [&](int id, bool inline_caller) {
    try {
      for (int t = next++; t < tile_count && !failed; t = next++) {
        visits[id] += sweep_tile(setup, moves, bins[t], tiles[t], mode, grid, grid_row0);
        ++done;
        if (inline_caller && std::chrono::steady_clock::now() - last_report > kProgressPeriod) {
          report();
        }
      }
    } catch (...) {
      errors[id] = std::current_exception();
      failed = true;
    }
  };
  // The calling thread is one of the workers (and reports progress between its tiles): one
  // thread fewer to start and no coordinator to wake, which matters on small grids.
  std::vector<std::thread> pool;
  pool.reserve(threads - 1);
  for (int id = 1; id < threads; ++id) pool.emplace_back(worker, id, false);
  worker(0, true);
  for (std::thread& th : pool) th.join();
  for (const std::exception_ptr& e : errors) {
    if (e) std::rethrow_exception(e);
  }
  std::int64_t total = 0;
  for (std::int64_t v : visits) total += v;
  return total;
}

}  // namespace cuspmap

// Band-by-band sweep: moves prepared once, bucketed by the bands their reach crosses, binned to
// the band's tiles, swept into one reused band grid, handed to the consumer.
// Inputs: cutter, path, cut, patch, plan; output: bands of heights (um) through the sink.
// Method: see simulate_bands.h.
#include "sweep/simulate_bands.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <string>
#include <vector>

#include "core/input_error.h"
#include "core/large_buffer.h"
#include "core/units.h"
#include "sweep/bin_moves.h"
#include "sweep/prepare_moves.h"
#include "sweep/sweep_setup.h"
#include "sweep/sweep_tiles.h"

namespace cuspmap {
namespace {

// Share of the memory limit one band may take: the rest is left to the consumer (statistics,
// traces, the overview grid), the path and the spatial index.
constexpr std::int64_t kBandShareOfLimit = 4;

}  // namespace

BandPlan plan_bands(const Patch& patch, std::int64_t max_memory_bytes) {
  std::int64_t nx = 0, ny = 0;
  grid_dimensions(patch, nx, ny);
  if (nx > std::numeric_limits<int>::max() || ny > std::numeric_limits<int>::max()) {
    throw InputError("grid of " + std::to_string(nx) + " x " + std::to_string(ny) +
                     " cells: a side exceeds 2147483647 cells; use a larger cell");
  }
  BandPlan plan;
  plan.nx = static_cast<int>(nx);
  plan.ny = static_cast<int>(ny);
  plan.limit_bytes = max_memory_bytes > 0 ? max_memory_bytes : physical_memory_bytes() / 2;
  const TileGrid tiles = tile_grid(plan.nx, plan.ny);
  const std::int64_t row_bytes = nx * static_cast<std::int64_t>(sizeof(float));
  const std::int64_t tile_row_bytes = row_bytes * tiles.tile_rows;
  const std::int64_t budget = std::min(kMaxBandBytes, plan.limit_bytes / kBandShareOfLimit);
  if (tile_row_bytes > plan.limit_bytes / kBandShareOfLimit) {
    throw InputError("one band of " + std::to_string(tiles.tile_rows) + " rows x " +
                     std::to_string(nx) + " cells needs " + std::to_string(tile_row_bytes) +
                     " bytes, over a quarter of the memory limit of " +
                     std::to_string(plan.limit_bytes) +
                     " bytes; use a larger cell, a narrower patch or --max-memory");
  }
  const std::int64_t tile_rows_per_band = std::max<std::int64_t>(1, budget / tile_row_bytes);
  plan.band_rows = static_cast<int>(
      std::min<std::int64_t>(ny, tile_rows_per_band * tiles.tile_rows));
  plan.bands = (plan.ny + plan.band_rows - 1) / plan.band_rows;
  plan.band_bytes = row_bytes * plan.band_rows;
  return plan;
}

void simulate_bands(const Cutter& cutter, const Toolpath& path, const CutSpec& cut,
                    const Patch& patch, const SimSpec& sim, const BandPlan& plan,
                    const BandSink& sink, SweepStats* stats) {
  const SweepSetup setup = sweep_setup(cutter, cut, patch);
  PreparedCounts counts;
  const std::vector<PreparedMove> moves = prepare_moves(path, cut, patch, setup.envelope.reach_mm,
                                                        setup.top_mm + kReachMarginMm, counts);
  const TileGrid tiles = tile_grid(plan.nx, plan.ny);
  const SweepMode mode = sim.tooth_marks ? SweepMode::Teeth : SweepMode::Envelope;
  const double cell = setup.cell_mm, reach = setup.envelope.reach_mm;
  const double band_h = plan.band_rows * cell;
  // Rounded up: a single band of all ny rows need not be a whole number of tile rows, and its
  // last, partial tile row must be swept too.
  const int tile_rows_per_band = (plan.band_rows + tiles.tile_rows - 1) / tiles.tile_rows;

  // First level of the index: each move in the bands its reach box crosses (path order kept).
  std::vector<std::vector<int>> band_moves(plan.bands);
  for (std::size_t k = 0; k < moves.size(); ++k) {
    const PreparedMove& m = moves[k];
    const double lo = std::floor((m.y_min_mm - reach) / band_h);
    const double hi = std::floor((m.y_max_mm + reach) / band_h);
    if (hi < 0.0 || lo >= plan.bands) continue;
    const int b0 = static_cast<int>(std::max(0.0, lo));
    const int b1 = static_cast<int>(std::min<double>(plan.bands - 1, hi));
    for (int b = b0; b <= b1; ++b) band_moves[b].push_back(static_cast<int>(k));
  }

  Heightfield band;
  band.nx = plan.nx;
  band.cell_mm = cell;
  band.origin_x_mm = patch.origin_x_mm;
  const int threads = sweep_threads(sim.threads);
  std::int64_t visits = 0;
  for (int b = 0; b < plan.bands; ++b) {
    const int j0 = b * plan.band_rows;
    const int rows = std::min(plan.band_rows, plan.ny - j0);
    if (band.z_um.rows() != rows) {
      band.z_um.resize(rows, plan.nx);
      // Fresh pages, first touched by the sweep: 2 MiB pages take 1/512 of the faults (a
      // 64 MiB band cost ~16k faults of several us each on virtual machines).
      advise_huge_pages(band.z_um.data(),
                        static_cast<std::size_t>(band.z_um.size()) * sizeof(float));
    }
    band.ny = rows;
    band.origin_y_mm = patch.origin_y_mm + j0 * cell;
    const int ty0 = b * tile_rows_per_band;
    const int ty1 = std::min(tiles.tiles_y, ty0 + tile_rows_per_band);
    {
      // Second level: the band's tiles; freed before the consumer runs.
      const std::vector<std::vector<int>> bins =
          bin_moves_rows(moves, band_moves[b], tiles, ty0, ty1, cell, reach);
      std::vector<TileRect> rects;
      rects.reserve(bins.size());
      for (int ty = ty0; ty < ty1; ++ty) {
        for (int tx = 0; tx < tiles.tiles_x; ++tx) rects.push_back(tiles.rect(ty * tiles.tiles_x + tx));
      }
      std::function<void(double)> progress;
      if (sim.progress) {
        progress = [&](double f) { sim.progress((b + f) / plan.bands); };
      }
      visits += sweep_tiles(setup, moves, bins, rects, mode, band.z_um.data(), j0, threads,
                            progress);
    }
    std::vector<int>().swap(band_moves[b]);
    sink(band, j0);
  }
  if (sim.progress) sim.progress(1.0);
  if (stats) {
    stats->cell_updates = visits;
    stats->moves_swept = counts.swept;
    stats->moves_skipped = counts.skipped;
  }
}

}  // namespace cuspmap

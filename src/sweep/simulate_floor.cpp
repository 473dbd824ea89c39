// The floor a path leaves: grid allocation, move preparation and binning, then tiles swept in
// parallel (sweep_tiles), bit-identical for any thread count.
// Cost O(cells x moves reaching them) / threads.
// Method: DESIGN.md "Geometry" and "Tooth-resolved"; tiled Z-map (Choi & Jerard 1998).
#include "sweep/simulate_floor.h"

#include <vector>

#include "sweep/bin_moves.h"
#include "sweep/prepare_moves.h"
#include "sweep/sweep_setup.h"
#include "sweep/sweep_tiles.h"

namespace cuspmap {
Heightfield simulate_floor(const Cutter& cutter, const Toolpath& path, const CutSpec& cut,
                           const Patch& patch, const SimSpec& sim, SweepStats* stats) {
  // Every tile writes each of its cells (a height, or NaN where unreached) and the tiles cover
  // the grid, so the grid is not filled first: one pass over memory fewer, and the sweep
  // threads first-touch their own pages.
  Heightfield hf = make_heightfield(patch, sim.max_memory_bytes, GridFill::None);
  const SweepSetup setup = sweep_setup(cutter, cut, patch);
  PreparedCounts counts;
  const std::vector<PreparedMove> moves = prepare_moves(path, cut, patch, setup.envelope.reach_mm,
                                                        setup.top_mm + kReachMarginMm, counts);
  const TileGrid tiles = tile_grid(hf.nx, hf.ny);
  const std::vector<std::vector<int>> bins =
      bin_moves(moves, tiles, setup.cell_mm, setup.envelope.reach_mm);
  const SweepMode mode = sim.tooth_marks ? SweepMode::Teeth : SweepMode::Envelope;

  std::vector<TileRect> rects(tiles.count());
  for (int t = 0; t < tiles.count(); ++t) rects[t] = tiles.rect(t);
  const std::int64_t visits = sweep_tiles(setup, moves, bins, rects, mode, hf.z_um.data(), 0,
                                          sweep_threads(sim.threads), sim.progress);
  if (sim.progress) sim.progress(1.0);

  if (stats) {
    stats->cell_updates = visits;
    stats->moves_swept = counts.swept;
    stats->moves_skipped = counts.skipped;
  }
  return hf;
}

}  // namespace cuspmap

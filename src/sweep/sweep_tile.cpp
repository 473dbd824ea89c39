// One tile of the sweep: order moves by their lower bound on the tile, run the row kernels,
// stop when no remaining move can lower the tile. Inputs: SweepSetup, moves, tile; output: grid
// cells of the tile (um, NaN = unreached). Method: see sweep_tile.h.
#include "sweep/sweep_tile.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <optional>

#include "core/units.h"
#include "sweep/distance_tile.h"
#include "sweep/envelope_arc.h"
#include "sweep/envelope_line.h"
#include "sweep/row_span.h"
#include "sweep/teeth_generic.h"
#include "sweep/teeth_line.h"

namespace cuspmap {
namespace {

constexpr float kUnset = std::numeric_limits<float>::infinity();

// Highest cell of the tile (+inf while any is unreached). Eigen's maxCoeff runs in SIMD lanes;
// the grid holds no NaN during the sweep, so lane order cannot change the result.
float tile_max(const float* grid, int nx, int row0, const TileRect& t) {
  float top = -kUnset;
  for (int j = t.j0; j < t.j1; ++j) {
    const Eigen::Map<const Eigen::ArrayXf> row(grid + static_cast<std::int64_t>(j - row0) * nx + t.i0,
                                               t.i1 - t.i0);
    top = std::max(top, row.maxCoeff());
  }
  return top;
}

// One row run of one move. `line_teeth` is set for straight moves in tooth mode.
void sweep_row(const SweepSetup& s, const PreparedMove& m, SweepMode mode, LineTeeth* line_teeth,
               double y, int i_lo, int i_hi, float* row) {
  if (mode == SweepMode::Envelope && m.kind == MoveKind::Line) {
    envelope_line_row(s, m, y, i_lo, i_hi, row);
    return;
  }
  if (line_teeth) {
    line_teeth->sweep_run(y, i_lo, i_hi, row);
    return;
  }
  for (int i = i_lo; i <= i_hi; ++i) {
    const Eigen::Vector2d p((i + 0.5) * s.cell_mm, y);
    double h = 0.0;
    if (mode == SweepMode::Envelope) {
      h = envelope_arc_mm(s, m, p) + s.axial_min_mm;
    } else {
      h = teeth_generic_mm(s, m, p, row[i] / kUmPerMm);  // +inf stays +inf
    }
    const float h_um = static_cast<float>(h * kUmPerMm);
    if (h_um < row[i]) row[i] = h_um;
  }
}

}  // namespace

std::int64_t sweep_tile(const SweepSetup& setup, const std::vector<PreparedMove>& moves,
                        const std::vector<int>& tile_moves, const TileRect& tile, SweepMode mode,
                        float* grid, int grid_row0) {
  if (mode == SweepMode::Envelope && setup.level_distance) {
    // Level moves at one height and a profile rising from the axis: nearest-move distance.
    std::int64_t visits = 0;
    if (distance_tile(setup, moves, tile_moves, tile, grid, grid_row0, visits)) return visits;
  }
  const int nx = setup.nx;
  // Row j of the grid lives at grid + (j - grid_row0) nx.
  auto row_of = [&](int j) { return grid + static_cast<std::int64_t>(j - grid_row0) * nx; };
  const double cell = setup.cell_mm;
  for (int j = tile.j0; j < tile.j1; ++j) {
    float* row = row_of(j);
    std::fill(row + tile.i0, row + tile.i1, kUnset);
  }

  // Lowest height each move could leave anywhere on the tile: tip height plus the profile at
  // the nearest distance, less what tilt can lower, plus the lowest tooth.
  struct Ranked {
    double bound_um;
    int move;
  };
  std::vector<Ranked> order;
  order.reserve(tile_moves.size());
  const double x_lo = (tile.i0 + 0.5) * cell, x_hi = (tile.i1 - 0.5) * cell;
  const double y_lo = (tile.j0 + 0.5) * cell, y_hi = (tile.j1 - 0.5) * cell;
  for (int k : tile_moves) {
    const PreparedMove& m = moves[k];
    const double d = m.distance_to_box(x_lo, x_hi, y_lo, y_hi);
    const double low = m.z_min_mm + setup.envelope.min_over_mm(d, setup.envelope.reach_mm) -
                       setup.tilt_drop_mm + setup.axial_min_mm;
    order.push_back({low * kUmPerMm, k});
  }
  std::sort(order.begin(), order.end(), [](const Ranked& a, const Ranked& b) {
    return a.bound_um < b.bound_um || (a.bound_um == b.bound_um && a.move < b.move);
  });

  std::int64_t visits = 0;
  // top_um never falls below the tile's highest cell (+inf while a cell is unreached); it is
  // re-read when a move's bound reaches it, or when it is +inf and the bound has risen.
  double top_um = std::numeric_limits<double>::infinity();
  double checked_um = -top_um;
  for (const Ranked& r : order) {
    if (r.bound_um >= top_um || (std::isinf(top_um) && r.bound_um > checked_um)) {
      top_um = tile_max(grid, nx, grid_row0, tile);
      checked_um = r.bound_um;
      if (r.bound_um >= top_um) break;  // sorted: no later move can lower any cell either
    }
    const PreparedMove& m = moves[r.move];
    std::optional<LineTeeth> line_teeth;
    if (mode == SweepMode::Teeth && m.kind == MoveKind::Line && !m.vertical()) {
      line_teeth.emplace(setup, m);
    }
    for (int j = tile.j0; j < tile.j1; ++j) {
      int i_lo = 0, i_hi = -1;
      const double y = (j + 0.5) * cell;
      if (!row_span(m, y, setup.envelope.reach_mm, cell, tile.i0, tile.i1 - 1, i_lo, i_hi)) {
        continue;
      }
      visits += i_hi - i_lo + 1;
      if (line_teeth && m.perp.x() == 0.0) {
        // A row parallel to the move: one bound for the whole run; skip it when every cell is
        // already at or below it (the tooth sweep's per-cell test, once per row).
        const double low_um = line_teeth->row_low_mm((y - m.a_mm.y()) * m.perp.y()) * kUmPerMm;
        const Eigen::Map<const Eigen::ArrayXf> run(row_of(j) + i_lo, i_hi - i_lo + 1);
        if (run.maxCoeff() <= low_um) continue;
      }
      sweep_row(setup, m, mode, line_teeth ? &*line_teeth : nullptr, y, i_lo, i_hi, row_of(j));
    }
  }

  // Cells still at +inf were never reached: NaN, as Heightfield wants. Once the tile's highest
  // cell was finite, every cell is, and there is nothing to do.
  if (!std::isfinite(top_um)) {
    for (int j = tile.j0; j < tile.j1; ++j) {
      float* row = row_of(j);
      for (int i = tile.i0; i < tile.i1; ++i) {
        if (row[i] == kUnset) row[i] = kUnreached;
      }
    }
  }
  return visits;
}

}  // namespace cuspmap

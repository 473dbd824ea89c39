// Helpers shared by the level-distance sweep tests: the envelope sweep with the level-distance
// path allowed or switched off, the slope-scaled disagreement of two floors, and test patches and
// cutters (invented test tools).
#pragma once

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <vector>

#include "core/heightfield.h"
#include "path/move.h"
#include "sweep/bin_moves.h"
#include "sweep/prepare_moves.h"
#include "sweep/sweep_setup.h"
#include "sweep/sweep_tiles.h"
#include "test_support.h"
#include "tool/cutter.h"

namespace cuspmap::test {

// Largest disagreement allowed between the float distance kernels and the general envelope
// where the profile's slope is at most 1: the 1e-3 um (both are float kernels; an ulp of
// a 1 mm distance is 1.2e-7 mm).
constexpr double kAgreeUm = 1e-3;

struct Sweep {
  Heightfield hf;
  bool level_distance = false;  // what the setup decided for this cutter
};

// The envelope sweep of simulate_floor, with the level-distance path allowed or switched off.
inline Sweep envelope(const Cutter& cutter, const Toolpath& path, const Patch& patch,
                      bool allow_fast, int threads = 2) {
  Sweep out;
  out.hf = make_heightfield(patch, 0);
  CutSpec cut;
  SweepSetup setup = sweep_setup(cutter, cut, patch);
  out.level_distance = setup.level_distance;
  if (!allow_fast) setup.level_distance = false;
  PreparedCounts counts;
  const std::vector<PreparedMove> moves = prepare_moves(path, cut, patch, setup.envelope.reach_mm,
                                                        setup.top_mm + kReachMarginMm, counts);
  const TileGrid tiles = tile_grid(out.hf.nx, out.hf.ny);
  const auto bins = bin_moves(moves, tiles, setup.cell_mm, setup.envelope.reach_mm);
  std::vector<TileRect> rects(tiles.count());
  for (int t = 0; t < tiles.count(); ++t) rects[t] = tiles.rect(t);
  sweep_tiles(setup, moves, bins, rects, SweepMode::Envelope, out.hf.z_um.data(), 0, threads, {});
  return out;
}

// Largest |a - b| / max(1, slope) over cells both reach, slope = dp/dr of the profile at the
// height b (torus part of corner radius rc: h = rc - sqrt(rc^2 - u^2), slope u / (rc - h)); NaN
// cells must match. Near the rim a float distance error of ~1e-7 mm is magnified by the
// profile's slope (infinite at r = R) in any float kernel, so the steep band gets the same
// relative allowance; wherever the slope is at most 1 (every cusp of a stepover below 0.6 R)
// the bound is the plain kAgreeUm.
inline double max_scaled_diff_um(const Heightfield& a, const Heightfield& b, double rc_mm) {
  double worst = 0.0;
  std::int64_t nan_mismatch = -1;  // first cell reached by one sweep only
  for (std::int64_t k = 0; k < a.cells(); ++k) {
    const float x = a.z_um.data()[k], y = b.z_um.data()[k];
    if (std::isnan(x) != std::isnan(y) && nan_mismatch < 0) nan_mismatch = k;
    if (std::isnan(x) || std::isnan(y)) continue;
    double slope = 0.0;
    const double h_mm = std::min(static_cast<double>(y) / 1000.0, rc_mm);
    if (rc_mm > 0.0 && h_mm > 0.0) {
      slope = std::sqrt(std::max(0.0, 2.0 * rc_mm * h_mm - h_mm * h_mm)) / (rc_mm - h_mm);
    }
    worst = std::max(worst, std::abs(x - y) / std::max(1.0, slope));
  }
  CAPTURE(nan_mismatch);
  REQUIRE(nan_mismatch < 0);
  return worst;
}

inline Patch square_patch(double size_mm, double cell_mm) {
  Patch p;
  p.size_x_mm = p.size_y_mm = size_mm;
  p.cell_mm = cell_mm;
  return p;
}

inline Cutter make_cutter(CutterShape shape) {
  Cutter c;
  c.shape = shape;
  c.diameter_mm = 6.0;
  c.corner_radius_mm = 1.0;
  return c;
}

}  // namespace cuspmap::test

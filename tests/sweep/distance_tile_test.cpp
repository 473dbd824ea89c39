// Tests of the level-distance sweep: it agrees with the general envelope kernels on rasters,
// offset rings and spirals (lines and arcs) for ball, bull-nose and flat cutters, leaves the
// handbook ball cusp, is bit-identical for any thread count, and leaves tilt, dish and ramps to
// the general envelope. Method: handbook scallop height (Machinery's Handbook, ball end mill
// scallop h = R - sqrt(R^2 - (s/2)^2)); the general envelope (tests/sweep/sweep_envelope_test.cpp
// checks it against per-cell minima) as the reference for the rest.
#include "sweep/distance_tile.h"

#include <algorithm>
#include <cmath>
#include <cstring>
#include <vector>

#include "path/offset_path.h"
#include "path/raster.h"
#include "path/spiral_path.h"
#include "sweep/bin_moves.h"
#include "sweep/distance_fixtures.h"
#include "sweep/prepare_moves.h"
#include "sweep/sweep_setup.h"
#include "sweep/sweep_tiles.h"
#include "test_support.h"

namespace cuspmap {

using test::envelope;
using test::kAgreeUm;
using test::make_cutter;
using test::max_scaled_diff_um;
using test::square_patch;
using test::Sweep;

TEST_CASE("distance_tile: agrees with the general envelope on rasters, rings and spirals",
          "[sweep]") {
  const Patch patch = square_patch(3.0, 0.01);
  CutSpec cut;
  for (CutterShape shape : {CutterShape::Ball, CutterShape::BullNose, CutterShape::Flat}) {
    Cutter cutter = make_cutter(shape);
    cutter.diameter_mm = 2.0;  // the offset rings need a patch wider than the cutter
    cutter.corner_radius_mm = 0.4;
    std::vector<Toolpath> paths;
    for (double angle : {0.0, 30.0}) {
      for (RasterDirection dir : {RasterDirection::Zigzag, RasterDirection::OneWay}) {
        PathSpec spec;
        spec.stepover_mm = 0.4;
        spec.angle_deg = angle;
        spec.direction = dir;
        paths.push_back(raster_path(spec, cut, patch, cutter));
      }
    }
    PathSpec ring;
    ring.kind = PathKind::Offset;
    ring.stepover_mm = 0.4;
    paths.push_back(offset_path(ring, cut, patch, cutter));
    PathSpec spiral;
    spiral.kind = PathKind::Spiral;
    spiral.stepover_mm = 0.4;
    paths.push_back(spiral_path(spiral, cut, patch, cutter));
    for (std::size_t p = 0; p < paths.size(); ++p) {
      CAPTURE(static_cast<int>(shape), p);
      const Sweep fast = envelope(cutter, paths[p], patch, true);
      REQUIRE(fast.level_distance);
      const Sweep general = envelope(cutter, paths[p], patch, false);
      REQUIRE(max_scaled_diff_um(fast.hf, general.hf, cutter.effective_corner_mm()) <= kAgreeUm);
    }
  }
}

TEST_CASE("distance_tile: a grid past 64 MiB (streaming stores) agrees with the general envelope",
          "[sweep]") {
  // 41 x 41 mm at 10 um: 4100^2 floats = 67.2 MB, past the 64 MiB streaming threshold.
  const Cutter ball = make_cutter(CutterShape::Ball);
  const Patch patch = square_patch(41.0, 0.01);
  PathSpec spec;
  spec.stepover_mm = 0.3;
  spec.direction = RasterDirection::Zigzag;
  const Toolpath path = raster_path(spec, CutSpec{}, patch, ball);
  const Sweep fast = envelope(ball, path, patch, true);
  const Sweep general = envelope(ball, path, patch, false);
  REQUIRE(max_scaled_diff_um(fast.hf, general.hf, 3.0) <= kAgreeUm);
}

TEST_CASE("distance_tile: ball heights equal z + p(exact nearest distance) to float precision",
          "[sweep]") {
  // Oracle: the distance from each cell centre to every segment in double (point-segment
  // distance, Eberly 2003), then p(d) = d^2 / (R + sqrt(R^2 - d^2)) (the ball of DESIGN.md
  // "Geometry" without cancellation). A raster at 30 deg, so no row is a constant fill.
  const Cutter ball = make_cutter(CutterShape::Ball);
  const double r = 3.0;
  const Patch patch = square_patch(3.0, 0.01);
  PathSpec spec;
  spec.stepover_mm = 0.3;
  spec.angle_deg = 30.0;
  spec.direction = RasterDirection::Zigzag;
  const Toolpath path = raster_path(spec, CutSpec{}, patch, ball);
  const Sweep fast = envelope(ball, path, patch, true);
  // Float heights carry 24 bits: 1e-6 relative (16 ulps) plus 1e-6 um for the um-scale cells
  // nearest a pass, where the float distance rounding (an ulp of a few mm) dominates.
  constexpr double kRelative = 1e-6, kAbsoluteUm = 1e-6;
  double worst = 0.0;
  for (int j = 0; j < fast.hf.ny; ++j) {
    for (int i = 0; i < fast.hf.nx; ++i) {
      const Eigen::Vector2d p((i + 0.5) * patch.cell_mm, (j + 0.5) * patch.cell_mm);
      double d2 = 1e300;
      for (const Move& m : path.moves) {
        const Eigen::Vector2d a = m.start_mm.head<2>(), b = m.end_mm.head<2>();
        const Eigen::Vector2d ab = b - a;
        const double len2 = ab.squaredNorm();
        const double t = len2 > 0.0 ? std::clamp((p - a).dot(ab) / len2, 0.0, 1.0) : 0.0;
        d2 = std::min(d2, (p - (a + t * ab)).squaredNorm());
      }
      const double h_um = 1000.0 * d2 / (r + std::sqrt(r * r - d2));
      const double err = std::abs(fast.hf.z_um(j, i) - h_um) / (kRelative * h_um + kAbsoluteUm);
      worst = std::max(worst, err);
    }
  }
  REQUIRE(worst <= 1.0);
}

TEST_CASE("distance_tile: a ball raster leaves the handbook scallop height", "[sweep]") {
  const Cutter ball = make_cutter(CutterShape::Ball);
  const double r = 3.0, step = 0.3;
  const Patch patch = square_patch(2.4, 0.005);
  PathSpec spec;
  spec.stepover_mm = step;
  spec.direction = RasterDirection::Zigzag;
  const Sweep fast = envelope(ball, raster_path(spec, CutSpec{}, patch, ball), patch, true);
  // Machinery's Handbook, scallop height of a ball end mill: h = R - sqrt(R^2 - (s/2)^2).
  const double h_um = (r - std::sqrt(r * r - 0.25 * step * step)) * 1000.0;
  // Cell centres miss the crest by at most half a cell: the slope there, (s/2)/sqrt(R^2 -
  // (s/2)^2), times half a cell; passes at angle 0 lie on y = k s, crests on y = (k + 1/2) s.
  const double quantum_um = 0.5 * step / std::sqrt(r * r - 0.25 * step * step) * 0.0025 * 1000.0;
  const auto& z = fast.hf.z_um;
  // The cells nearest a pass are a quarter cell from it (same formula at d = 2.5 um).
  const double near_um = (r - std::sqrt(r * r - 0.0025 * 0.0025)) * 1000.0;
  REQUIRE_NEAR(z.minCoeff(), near_um, 1e-6);
  REQUIRE_NEAR(z.maxCoeff(), h_um, quantum_um);
}

TEST_CASE("distance_tile: heights do not depend on the thread count", "[sweep]") {
  const Cutter bull = make_cutter(CutterShape::BullNose);
  const Patch patch = square_patch(4.0, 0.01);
  PathSpec spiral;
  spiral.stepover_mm = 0.5;
  const Toolpath path = spiral_path(spiral, CutSpec{}, patch, bull);
  const Sweep one = envelope(bull, path, patch, true, 1);
  const Sweep three = envelope(bull, path, patch, true, 3);
  REQUIRE(std::memcmp(one.hf.z_um.data(), three.hf.z_um.data(), sizeof(float) * one.hf.cells()) ==
          0);
}

TEST_CASE("distance_tile: tilt and dish take the general envelope, unchanged", "[sweep]") {
  const Patch patch = square_patch(2.0, 0.01);
  Cutter tilted = make_cutter(CutterShape::Ball);
  tilted.tilt_deg = 0.5;
  Cutter dished = make_cutter(CutterShape::Flat);
  dished.dish_deg = 1.0;
  Cutter runout = make_cutter(CutterShape::BullNose);
  runout.runout_mm = 0.01;
  for (const Cutter& c : {tilted, dished, runout}) {
    PathSpec spec;
    spec.stepover_mm = 0.4;
    spec.angle_deg = 30.0;
    const Toolpath path = raster_path(spec, CutSpec{}, patch, c);
    const Sweep allowed = envelope(c, path, patch, true);
    REQUIRE_FALSE(allowed.level_distance);
    const Sweep general = envelope(c, path, patch, false);
    REQUIRE(std::memcmp(allowed.hf.z_um.data(), general.hf.z_um.data(),
                        sizeof(float) * allowed.hf.cells()) == 0);
  }
}

TEST_CASE("distance_tile: ramps and mixed heights fall back to the general envelope", "[sweep]") {
  const Cutter ball = make_cutter(CutterShape::Ball);
  const Patch patch = square_patch(2.0, 0.01);
  Toolpath path;
  Move level;
  level.start_mm = {-4.0, 0.6, 0.0};
  level.end_mm = {6.0, 0.6, 0.0};
  level.feed_mm_per_min = 1000.0;
  Move ramp = level;  // descends 0.05 mm over the patch
  ramp.start_mm = {-4.0, 1.2, 0.05};
  ramp.end_mm = {6.0, 1.2, 0.0};
  Move higher = level;  // level but 10 um above the first
  higher.start_mm = {-4.0, 1.6, 0.01};
  higher.end_mm = {6.0, 1.6, 0.01};
  path.moves = {level, ramp, higher};

  const SweepSetup setup = sweep_setup(ball, CutSpec{}, patch);
  REQUIRE(setup.level_distance);
  PreparedCounts counts;
  const std::vector<PreparedMove> moves = prepare_moves(
      path, CutSpec{}, patch, setup.envelope.reach_mm, setup.top_mm + kReachMarginMm, counts);
  const TileGrid tiles = tile_grid(setup.nx, setup.ny);
  const auto bins = bin_moves(moves, tiles, setup.cell_mm, setup.envelope.reach_mm);
  std::vector<float> grid(static_cast<std::size_t>(setup.nx) * setup.ny, 7.0f);
  std::int64_t visits = 0;
  for (int t = 0; t < tiles.count(); ++t) {
    REQUIRE(bins[t].size() == 3);
    REQUIRE_FALSE(distance_tile(setup, moves, bins[t], tiles.rect(t), grid.data(), 0, visits));
  }
  REQUIRE(std::all_of(grid.begin(), grid.end(), [](float v) { return v == 7.0f; }));

  const Sweep allowed = envelope(ball, path, patch, true);
  const Sweep general = envelope(ball, path, patch, false);
  REQUIRE(std::memcmp(allowed.hf.z_um.data(), general.hf.z_um.data(),
                      sizeof(float) * allowed.hf.cells()) == 0);
}

TEST_CASE("distance_tile: one-way returns above the cut leave the tiles to the level path",
          "[sweep]") {
  // issue 15: a one-way raster's return moves at the clearance height crossed every tile row,
  // so every tile fell back to the general envelope (7-8x slower). They can lower no cell once
  // the passes below reach the whole tile (derived: heights rise from the axis, so every cell is
  // at most z + p(U) with U the passes' largest distance to the tile's corners).
  const Cutter ball = make_cutter(CutterShape::Ball);
  const Patch patch = square_patch(3.0, 0.01);
  CutSpec cut;
  PathSpec spec;
  spec.stepover_mm = 0.3;
  spec.direction = RasterDirection::OneWay;
  const Toolpath path = raster_path(spec, cut, patch, ball);
  const SweepSetup setup = sweep_setup(ball, cut, patch);
  PreparedCounts counts;
  const std::vector<PreparedMove> moves = prepare_moves(
      path, cut, patch, setup.envelope.reach_mm, setup.top_mm + kReachMarginMm, counts);
  const TileGrid tiles = tile_grid(setup.nx, setup.ny);
  const auto bins = bin_moves(moves, tiles, setup.cell_mm, setup.envelope.reach_mm);
  std::vector<float> grid(static_cast<std::size_t>(setup.nx) * setup.ny, 7.0f);
  std::int64_t visits = 0;
  int with_return = 0, level_path = 0;
  for (int t = 0; t < tiles.count(); ++t) {
    const bool has_return = std::any_of(bins[t].begin(), bins[t].end(), [&](int k) {
      return !moves[k].vertical() && moves[k].z_min_mm >= cut.retract_mm;
    });
    const bool has_plunge = std::any_of(bins[t].begin(), bins[t].end(),
                                        [&](int k) { return moves[k].vertical(); });
    if (!has_return || has_plunge) continue;
    ++with_return;
    level_path += distance_tile(setup, moves, bins[t], tiles.rect(t), grid.data(), 0, visits);
  }
  CHECK(with_return > 0);
  CHECK(level_path == with_return);
  // And the floor is the general envelope's (kAgreeUm, as for the other rasters).
  const Sweep fast = envelope(ball, path, patch, true);
  const Sweep general = envelope(ball, path, patch, false);
  CHECK(max_scaled_diff_um(fast.hf, general.hf, ball.effective_corner_mm()) <= kAgreeUm);
}

}  // namespace cuspmap

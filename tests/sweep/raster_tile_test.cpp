// Tests of the raster tile of the level-distance sweep: at any angle, zigzag and one-way, the
// floor equals the general envelope's, each cell's height equals z + p(exact distance to the
// nearest pass) to float precision (power series and square-root forms), the result does not
// depend on the thread count, and arcs, crossing lines or pass ends in the tile take the old path.
// Method: double point-segment distance (Eberly, Geometric Tools for Computer Graphics, 2003) and
// the ball/torus profile of DESIGN.md "Geometry" as the oracle; the general envelope
// (tests/sweep/sweep_envelope_test.cpp checks it against per-cell minima) for whole floors.
#include "sweep/raster_tile.h"

#include <algorithm>
#include <cmath>
#include <cstring>
#include <vector>

#include "path/raster.h"
#include "sweep/distance_fixtures.h"
#include "sweep/distance_tile.h"
#include "sweep/nearest_rows.h"
#include "test_support.h"

namespace cuspmap {
namespace {

using test::envelope;
using test::kAgreeUm;
using test::make_cutter;
using test::max_scaled_diff_um;
using test::square_patch;

struct Prepared {
  SweepSetup setup;
  std::vector<PreparedMove> moves;
};

Prepared prepare(const Cutter& cutter, const Toolpath& path, const Patch& patch) {
  Prepared p;
  p.setup = sweep_setup(cutter, CutSpec{}, patch);
  PreparedCounts counts;
  p.moves = prepare_moves(path, CutSpec{}, patch, p.setup.envelope.reach_mm,
                          p.setup.top_mm + kReachMarginMm, counts);
  return p;
}

// The level lines at the lowest height (a one-way raster's returns left out), as raster_tile
// receives them.
std::vector<const PreparedMove*> level_lines(const std::vector<PreparedMove>& moves) {
  double z_low = 1e300;
  for (const PreparedMove& m : moves) {
    if (m.kind == MoveKind::Line && !m.vertical()) z_low = std::min(z_low, m.z0_mm);
  }
  std::vector<const PreparedMove*> out;
  for (const PreparedMove& m : moves) {
    if (m.kind == MoveKind::Line && !m.vertical() && m.z0_mm == z_low && m.z1_mm == z_low) {
      out.push_back(&m);
    }
  }
  return out;
}

Toolpath raster(double angle_deg, double stepover_mm, RasterDirection dir, const Cutter& cutter,
                const Patch& patch) {
  PathSpec spec;
  spec.stepover_mm = stepover_mm;
  spec.angle_deg = angle_deg;
  spec.direction = dir;
  return raster_path(spec, CutSpec{}, patch, cutter);
}

}  // namespace

TEST_CASE("raster_tile: angled rasters agree with the general envelope, zigzag and one-way",
          "[sweep]") {
  const Patch patch = square_patch(3.0, 0.01);
  for (CutterShape shape : {CutterShape::Ball, CutterShape::BullNose}) {
    const Cutter cutter = make_cutter(shape);
    for (double angle : {7.0, 30.0, 45.0, 89.9}) {
      for (RasterDirection dir : {RasterDirection::Zigzag, RasterDirection::OneWay}) {
        CAPTURE(static_cast<int>(shape), angle, static_cast<int>(dir));
        const Toolpath path = raster(angle, 0.3, dir, cutter, patch);
        const auto fast = envelope(cutter, path, patch, true);
        REQUIRE(fast.level_distance);
        const auto general = envelope(cutter, path, patch, false);
        CHECK(max_scaled_diff_um(fast.hf, general.hf, cutter.effective_corner_mm()) <= kAgreeUm);
      }
    }
  }
}

TEST_CASE("raster_tile: distance_tile takes it on an angled raster's tiles", "[sweep]") {
  // At 30 deg the block path keeps ~4 passes per cell; the raster tile evaluates at most two
  // lines per cell (derived: the nearest of parallel lines is one of the two around the cell).
  const Cutter ball = make_cutter(CutterShape::Ball);
  const Patch patch = square_patch(3.0, 0.01);
  const Prepared p = prepare(ball, raster(30.0, 0.3, RasterDirection::Zigzag, ball, patch), patch);
  const TileGrid tiles = tile_grid(p.setup.nx, p.setup.ny);
  const auto bins = bin_moves(p.moves, tiles, p.setup.cell_mm, p.setup.envelope.reach_mm);
  std::vector<float> grid(static_cast<std::size_t>(p.setup.nx) * p.setup.ny, 7.0f);
  for (int t = 0; t < tiles.count(); ++t) {
    const TileRect r = tiles.rect(t);
    std::int64_t visits = 0;
    REQUIRE(distance_tile(p.setup, p.moves, bins[t], r, grid.data(), 0, visits));
    CAPTURE(t);
    CHECK(visits <= 2 * static_cast<std::int64_t>(r.i1 - r.i0) * (r.j1 - r.j0));
  }
}

TEST_CASE("raster_tile: heights equal z + p(exact nearest distance) at any angle", "[sweep]") {
  // Oracle: the double distance from each cell centre to every pass segment, then
  // p = u^2 / (rc + sqrt(rc^2 - u^2)), u = d - (R - rc) (DESIGN.md "Geometry", no cancellation).
  // Stepover 0.3 mm keeps x = u^2 / rc^2 <= 1/16 (power series); 2.5 mm on the ball and 5 mm on
  // the bull-nose (flat 2 mm, corner 1 mm) do not (square-root form).
  const Patch patch = square_patch(3.0, 0.01);
  // Float heights carry 24 bits: 1e-6 relative (16 ulps) plus 1e-6 um for the um-scale cells
  // nearest a pass, where the float distance rounding dominates.
  constexpr double kRelative = 1e-6, kAbsoluteUm = 1e-6;
  struct Case {
    CutterShape shape;
    double stepover_mm;
  };
  for (const Case& cs : {Case{CutterShape::Ball, 0.3}, Case{CutterShape::Ball, 2.5},
                         Case{CutterShape::BullNose, 0.3}, Case{CutterShape::BullNose, 5.0},
                         Case{CutterShape::Flat, 0.3}}) {
    const Cutter cutter = make_cutter(cs.shape);
    for (double angle : {0.0, 7.0, 30.0, 45.0, 89.9, 90.0, 150.0}) {
      CAPTURE(static_cast<int>(cs.shape), cs.stepover_mm, angle);
      const Toolpath path = raster(angle, cs.stepover_mm, RasterDirection::OneWay, cutter, patch);
      const Prepared p = prepare(cutter, path, patch);
      const std::vector<const PreparedMove*> lines = level_lines(p.moves);
      const TileRect tile{37, 37 + 200, 11, 11 + 45};  // uneven on purpose
      std::vector<float> grid(static_cast<std::size_t>(p.setup.nx) * p.setup.ny, 7.0f);
      const double base_um = (lines.front()->z0_mm + p.setup.axial_min_mm) * 1000.0;
      std::int64_t visits = 0;
      REQUIRE(raster_tile(p.setup, lines, tile, base_um, grid.data(), 0, false, visits));
      // The streamed stores write the same values.
      std::vector<float> streamed(grid.size(), 7.0f);
      REQUIRE(raster_tile(p.setup, lines, tile, base_um, streamed.data(), 0, true, visits));
      stream_fence();
      REQUIRE(std::memcmp(streamed.data(), grid.data(), sizeof(float) * grid.size()) == 0);
      const double rc = p.setup.corner_mm, flat = p.setup.flat_mm;
      const double reach = p.setup.envelope.reach_mm;
      double worst = 0.0;
      for (int j = 0; j < p.setup.ny; ++j) {
        for (int i = 0; i < p.setup.nx; ++i) {
          const float got = grid[static_cast<std::size_t>(j) * p.setup.nx + i];
          if (i < tile.i0 || i >= tile.i1 || j < tile.j0 || j >= tile.j1) {
            REQUIRE(got == 7.0f);  // outside the tile: untouched
            continue;
          }
          const Eigen::Vector2d q((i + 0.5) * patch.cell_mm, (j + 0.5) * patch.cell_mm);
          double d2 = 1e300;
          for (const PreparedMove* m : lines) {
            const Eigen::Vector2d ab = m->b_mm - m->a_mm;
            const double t = std::clamp((q - m->a_mm).dot(ab) / ab.squaredNorm(), 0.0, 1.0);
            d2 = std::min(d2, (q - (m->a_mm + t * ab)).squaredNorm());
          }
          const double d = std::sqrt(d2);
          CAPTURE(i, j, d);
          if (d > reach) {
            REQUIRE(std::isnan(got));
            continue;
          }
          const double u = std::clamp(d - flat, 0.0, rc);
          const double p_mm = rc > 0.0 ? u * u / (rc + std::sqrt(rc * rc - u * u)) : 0.0;
          const double h_um = base_um + 1000.0 * p_mm;
          // Plus a float distance error of 1e-6 x the reach (16 ulps of the few-mm offsets the
          // distances are differences of) magnified by the slope dp/du (derived).
          const double slope = rc > 0.0 && u < rc ? u / std::sqrt(rc * rc - u * u) : 0.0;
          const double allowed_um =
              kRelative * std::abs(h_um) + kAbsoluteUm + 1000.0 * slope * kRelative * reach;
          worst = std::max(worst, std::abs(got - h_um) / allowed_um);
        }
      }
      CHECK(worst <= 1.0);
    }
  }
}

TEST_CASE("raster_tile: arcs, crossing lines and pass ends in the tile take the old path",
          "[sweep]") {
  const Cutter ball = make_cutter(CutterShape::Ball);
  const Patch patch = square_patch(2.0, 0.01);
  Move pass;
  pass.start_mm = {-4.0, 0.6, 0.0};
  pass.end_mm = {6.0, 0.6 + 10.0 * std::tan(0.5), 0.0};  // ~28.6 deg
  pass.feed_mm_per_min = 1000.0;
  Move parallel = pass;
  parallel.start_mm.y() -= 0.3;
  parallel.end_mm.y() -= 0.3;
  Move crossing = pass;  // perpendicular to the pass
  crossing.start_mm = {1.0, -4.0, 0.0};
  crossing.end_mm = {1.0 - 10.0 * std::tan(0.5), 6.0, 0.0};
  Move short_pass = parallel;  // ends inside the patch
  short_pass.start_mm.y() -= 0.3;
  short_pass.end_mm = short_pass.start_mm + 0.5 * (parallel.end_mm - parallel.start_mm);
  Move arc = pass;
  arc.kind = MoveKind::Arc;
  arc.start_mm = {0.2, 1.0, 0.0};
  arc.end_mm = {1.8, 1.0, 0.0};
  arc.centre_mm = {1.0, 1.0};
  arc.ccw = true;
  const TileRect tile{0, 200, 0, 200};
  for (const Move& odd : {crossing, short_pass, arc}) {
    Toolpath path;
    path.moves = {pass, parallel, odd};
    const Prepared p = prepare(ball, path, patch);
    REQUIRE(p.moves.size() == 3);
    std::vector<const PreparedMove*> kept = {&p.moves[0], &p.moves[1], &p.moves[2]};
    std::vector<float> grid(static_cast<std::size_t>(p.setup.nx) * p.setup.ny, 7.0f);
    std::int64_t visits = 0;
    CAPTURE(static_cast<int>(odd.kind));
    REQUIRE_FALSE(raster_tile(p.setup, kept, tile, 0.0, grid.data(), 0, false, visits));
    REQUIRE(std::all_of(grid.begin(), grid.end(), [](float v) { return v == 7.0f; }));
    // The whole sweep (old block path for this mix) still agrees with the general envelope.
    const auto fast = envelope(ball, path, patch, true);
    const auto general = envelope(ball, path, patch, false);
    CHECK(max_scaled_diff_um(fast.hf, general.hf, ball.effective_corner_mm()) <= kAgreeUm);
  }
  // The two parallel passes alone are a raster.
  Toolpath two;
  two.moves = {pass, parallel};
  const Prepared p = prepare(ball, two, patch);
  std::vector<const PreparedMove*> kept = {&p.moves[0], &p.moves[1]};
  std::vector<float> grid(static_cast<std::size_t>(p.setup.nx) * p.setup.ny, 7.0f);
  std::int64_t visits = 0;
  REQUIRE(raster_tile(p.setup, kept, tile, 0.0, grid.data(), 0, false, visits));
}

TEST_CASE("raster_tile: angled heights do not depend on the thread count", "[sweep]") {
  const Cutter ball = make_cutter(CutterShape::Ball);
  const Patch patch = square_patch(6.0, 0.01);
  for (RasterDirection dir : {RasterDirection::Zigzag, RasterDirection::OneWay}) {
    const Toolpath path = raster(30.0, 0.3, dir, ball, patch);
    const auto one = envelope(ball, path, patch, true, 1);
    const auto two = envelope(ball, path, patch, true, 2);
    REQUIRE(std::memcmp(one.hf.z_um.data(), two.hf.z_um.data(),
                        sizeof(float) * one.hf.cells()) == 0);
  }
}

}  // namespace cuspmap

// Tests of LineTeeth::sweep_run: the SIMD lanes leave exactly the heights LineTeeth::height_mm
// leaves cell by cell (bit for bit), for rows parallel to the move (lanes), angled moves, ramps,
// several tooth families, ball and bull-nose profiles and runout (scalar fallback), with rows
// partly unreached and partly lowered already. Method: derived (the lanes are the scalar path's
// own arithmetic; the scalar path itself is checked against the time-stepping oracle in
// tests/sweep/teeth_runout_test.cpp and sweep_teeth_test.cpp).
#include "sweep/teeth_line.h"

#include <cmath>
#include <cstring>
#include <limits>
#include <random>
#include <vector>

#include "core/units.h"
#include "sweep/prepare_moves.h"
#include "sweep/sweep_setup.h"
#include "sweep/teeth_fixtures.h"
#include "test_support.h"

namespace cuspmap {
namespace {

Move line(double x0, double y0, double z0, double x1, double y1, double z1) {
  Move m;
  m.start_mm = {x0, y0, z0};
  m.end_mm = {x1, y1, z1};
  m.feed_mm_per_min = 1500.0;
  return m;
}

// A 6 mm, 3-flute flat end mill with a 1 deg dish (the pump-cover demo's tool, invented).
Cutter dished_flat() {
  Cutter c;
  c.shape = CutterShape::Flat;
  c.diameter_mm = 6.0;
  c.dish_deg = 1.0;
  c.teeth = 3;
  return c;
}

// Sweeps every grid row a move reaches both ways and requires equal bytes. Rows start as a mix
// of unreached cells and heights near the move's own (so the per-cell bounds cut both ways).
void require_run_equals_cells(const Cutter& cutter, const Toolpath& path) {
  Patch patch;
  patch.size_x_mm = patch.size_y_mm = 3.0;
  patch.cell_mm = 0.002;
  CutSpec cut;
  cut.feed_mm_per_min = 1500.0;
  const SweepSetup setup = sweep_setup(cutter, cut, patch);
  PreparedCounts counts;
  const std::vector<PreparedMove> moves = prepare_moves(
      path, cut, patch, setup.envelope.reach_mm, setup.top_mm + kReachMarginMm, counts);
  REQUIRE(!moves.empty());
  std::mt19937 rng(15);
  std::uniform_real_distribution<float> start_um(-0.5f, 1.5f);
  int rows = 0;
  for (const PreparedMove& m : moves) {
    if (m.kind != MoveKind::Line || m.vertical()) continue;
    LineTeeth lanes(setup, m), cells(setup, m);
    for (int j = 0; j < setup.ny; j += 37) {
      const double y = (j + 0.5) * setup.cell_mm;
      std::vector<float> row(setup.nx);
      for (int i = 0; i < setup.nx; ++i) {
        row[i] = i % 3 == 0 ? std::numeric_limits<float>::infinity() : start_um(rng);
      }
      std::vector<float> expect = row;
      for (int i = 0; i < setup.nx; ++i) {
        const Eigen::Vector2d rel = Eigen::Vector2d((i + 0.5) * setup.cell_mm, y) - m.a_mm;
        const double h = cells.height_mm(rel.dot(m.dir), rel.dot(m.perp), expect[i] / kUmPerMm);
        const float h_um = static_cast<float>(h * kUmPerMm);
        if (h_um < expect[i]) expect[i] = h_um;
      }
      lanes.sweep_run(y, 0, setup.nx - 1, row.data());
      CAPTURE(j, m.a_mm.x(), m.a_mm.y());
      REQUIRE(std::memcmp(row.data(), expect.data(), row.size() * sizeof(float)) == 0);
      ++rows;
    }
  }
  REQUIRE(rows > 0);
}

TEST_CASE("sweep_run: untilted dished flat, rows parallel to the move, equals height_mm",
          "[sweep]") {
  Toolpath path;
  path.moves = {line(-4.0, 1.0, 0.0, 7.0, 1.0, 0.0), line(7.0, 1.5, 0.0, -4.0, 1.5, 0.0)};
  require_run_equals_cells(dished_flat(), path);
}

TEST_CASE("sweep_run: tram error, axial offsets (one family per tooth), equals height_mm",
          "[sweep]") {
  Cutter c = dished_flat();
  c.tilt_deg = 0.01;
  c.tilt_toward_deg = 90.0;
  c.axial_offsets_um = {0.0, 0.4, -0.3};
  Toolpath path;
  path.moves = {line(-4.0, 1.2, 0.0, 7.0, 1.2, 0.0)};
  require_run_equals_cells(c, path);
}

TEST_CASE("sweep_run: angled move, ramp, on-line row, equals height_mm", "[sweep]") {
  Toolpath path;
  // 30 deg (the cells' offsets differ: scalar per cell); a ramp along X; a move on a row centre.
  path.moves = {line(-2.0, -1.0, 0.0, 4.0, 2.4641016, 0.0), line(-4.0, 2.0, 0.0, 7.0, 2.0, 0.01),
                line(-4.0, 0.001, 0.0, 7.0, 0.001, 0.0)};
  require_run_equals_cells(dished_flat(), path);
}

TEST_CASE("sweep_run: ball and bull-nose (circle pieces), runout (Newton fallback)", "[sweep]") {
  Toolpath path;
  path.moves = {line(-4.0, 1.0, 0.0, 7.0, 1.0, 0.0)};
  Cutter ball;
  ball.shape = CutterShape::Ball;
  ball.diameter_mm = 2.0;
  ball.teeth = 2;
  require_run_equals_cells(ball, path);
  Cutter runout = dished_flat();
  runout.runout_mm = 0.005;
  runout.runout_phase_deg = 40.0;
  require_run_equals_cells(runout, path);
  require_run_equals_cells(test::offset_tilted_bull(), path);
}

}  // namespace
}  // namespace cuspmap

// Tests of the tooth-resolved sweep with radial runout, tilt and arcs against the time-stepping
// tooth oracle (tests/sweep/brute_force_stamp.h), with cells placed in the band near the reach
// limit, where each tooth's own reach (R plus its share of the runout) decides the lowest crossing.
// Method: tooth-trajectory time stepping (Altintas, Manufacturing Automation, ch. 2) as oracle.
#include <cmath>
#include <random>
#include <vector>

#include "path/trochoidal_path.h"
#include "sweep/brute_force_stamp.h"
#include "sweep/simulate_floor.h"
#include "sweep/teeth_fixtures.h"
#include "test_support.h"

namespace cuspmap {
namespace {

// Oracle steps per tooth period: the linear interpolation of a crossing time errs by O(step^2),
// ~1e-5 mm of edge position at 500 steps, i.e. ~2e-4 um on a 1 deg dish (derived).
constexpr int kOracleSteps = 500;
// Allowed disagreement: the oracle's own error above plus float storage (derived).
constexpr double kSlackUm = 1e-3;

Move line(double x0, double y0, double x1, double y1, double feed) {
  Move m;
  m.start_mm = {x0, y0, 0.0};
  m.end_mm = {x1, y1, 0.0};
  m.feed_mm_per_min = feed;
  return m;
}

Heightfield teeth_floor(const Cutter& c, const Toolpath& path, const CutSpec& cut,
                        const Patch& patch) {
  SimSpec sim;
  sim.tooth_marks = true;
  sim.threads = 2;
  return simulate_floor(c, path, cut, patch, sim);
}

// Compares every `stride`-th cell with the oracle; returns the number compared.
int compare_with_oracle(const Cutter& c, const Toolpath& path, const CutSpec& cut,
                        const Patch& patch, int stride) {
  const Heightfield hf = teeth_floor(c, path, cut, patch);
  const bool cw = cut.spindle == SpindleDirection::Cw;
  int compared = 0;
  for (int j = 0; j < hf.ny; ++j) {
    for (int i = 0; i < hf.nx; i += stride) {
      const double ref = test::time_stepped_teeth_um(c, path, patch.floor_z_mm,
                                                     {hf.x_mm(i), hf.y_mm(j)}, cut.rpm, cw,
                                                     kOracleSteps);
      CAPTURE(i, j, hf.x_mm(i), hf.y_mm(j));
      if (!std::isfinite(ref)) {
        REQUIRE(std::isnan(hf.z_um(j, i)));
        continue;
      }
      REQUIRE_NEAR(hf.z_um(j, i), ref, kSlackUm);
      ++compared;
    }
  }
  return compared;
}

Move arc(double x0, double y0, double x1, double y1, double cx, double cy, bool ccw, double z0,
         double z1, double feed) {
  Move m;
  m.kind = MoveKind::Arc;
  m.start_mm = {x0, y0, z0};
  m.end_mm = {x1, y1, z1};
  m.centre_mm = {cx, cy};
  m.ccw = ccw;
  m.feed_mm_per_min = feed;
  return m;
}

Cutter dished_flat(int teeth, double runout_mm, double phase_deg) {
  Cutter c;
  c.shape = CutterShape::Flat;
  c.diameter_mm = 6.0;
  c.dish_deg = 1.0;
  c.teeth = teeth;
  c.runout_mm = runout_mm;
  c.runout_phase_deg = phase_deg;
  return c;
}

}  // namespace

TEST_CASE("issue_13: runout cells near the reach limit get the lowest tooth crossing", "[sweep]") {
  // The case: 6 mm flat, 1 deg dish, 3 teeth, 5 um runout at phase 0, 10 um cells, one
  // line at y = 0; the rows at y = 2.985 .. 3.005 lie where the teeth reach unequally (R - e to
  // R + e). The cell at y = 2.995 came out 0.0044 um above the oracle.
  const Cutter c = dished_flat(3, 0.005, 0.0);
  CutSpec cut;
  cut.rpm = 6000.0;
  cut.spindle = SpindleDirection::Cw;
  Toolpath path;
  path.moves.push_back(line(-4.0, 0.0, 4.2, 0.0, 900.0));
  Patch patch;
  patch.size_x_mm = 0.3;
  patch.size_y_mm = 0.03;
  patch.cell_mm = 0.01;
  patch.origin_y_mm = 2.98;
  REQUIRE(compare_with_oracle(c, path, cut, patch, 1) > 50);
}

TEST_CASE("simulate_floor: random runout, phase and tilt agree with the tooth oracle in the rim "
          "band",
          "[sweep]") {
  // Fixed seed: the cases are random in choice but the same on every run.
  std::mt19937 rng(1313);
  std::uniform_real_distribution<double> unit(0.0, 1.0);
  for (int run = 0; run < 3; ++run) {
    Cutter c = dished_flat(2 + run % 3, 0.002 + 0.008 * unit(rng), 360.0 * unit(rng));
    c.tilt_deg = 0.2 * unit(rng);
    c.tilt_toward_deg = 360.0 * unit(rng);
    CutSpec cut;
    cut.rpm = 5000.0 + 5000.0 * unit(rng);
    cut.spindle = run % 2 ? SpindleDirection::Ccw : SpindleDirection::Cw;
    const double angle = 0.3 * unit(rng), feed = 600.0 + 600.0 * unit(rng);
    Toolpath path;
    path.moves.push_back(line(-3.3 * std::cos(angle), -3.3 * std::sin(angle),
                              3.5 * std::cos(angle), 3.5 * std::sin(angle), feed));
    // Rows across the band R - 2e .. R + e on the left of the pass (and R - e on the right).
    const double band_y = 3.0 / std::cos(angle);
    Patch patch;
    patch.size_x_mm = 0.1;
    patch.cell_mm = 0.002;
    patch.size_y_mm = 3.0 * c.runout_mm + 0.004;
    patch.origin_y_mm = band_y - 2.0 * c.runout_mm - 0.002;
    CAPTURE(run, c.teeth, c.runout_mm, c.runout_phase_deg, c.tilt_deg, c.tilt_toward_deg);
    REQUIRE(compare_with_oracle(c, path, cut, patch, 12) > 20);
    patch.origin_y_mm = -band_y - c.runout_mm - 0.002;
    REQUIRE(compare_with_oracle(c, path, cut, patch, 12) > 10);
  }
}

TEST_CASE("simulate_floor: tooth crossings along arcs, helices and full loops equal the oracle",
          "[sweep]") {
  // Arcs whose cells lie outside and inside the arc's circle (the bearing's two regimes), a
  // helix with tilt and axial offsets, a full circle with runout, and a small loop where the
  // bearing runs almost with the tooth: each crossing is a bracketed root between closed-form
  // turning points, compared with time stepping.
  Cutter flat = dished_flat(3, 0.006, 40.0);
  Cutter ball;
  ball.shape = CutterShape::Ball;
  ball.diameter_mm = 2.0;
  ball.teeth = 2;
  const Cutter bull = test::offset_tilted_bull();
  struct Case {
    const char* name;
    Cutter cutter;
    Move move;
    bool cw;
  };
  const std::vector<Case> cases = {
      {"ball, wide arc", ball, arc(-0.5, -1.0, 2.0, 1.5, 2.0, -1.0, false, 0.0, 0.0, 500.0), true},
      {"ball, small arc around the patch", ball,
       arc(0.5, -0.3, 0.5, -0.3, 0.5, 0.5, false, 0.0, 0.0, 400.0), false},
      {"bull-nose helix, tilt, offsets", bull,
       arc(1.6, 0.5, 0.5, 1.6, 0.5, 0.5, true, 0.01, -0.01, 700.0), true},
      {"flat with runout, full circle", flat,
       arc(3.4, 0.5, 3.4, 0.5, 0.6, 0.5, true, 0.0, 0.0, 900.0), true},
      {"ball, tight loop", ball, arc(0.55, 0.5, 0.55, 0.5, 0.5, 0.5, false, 0.0, 0.0, 300.0),
       true},
  };
  Patch patch;
  patch.size_x_mm = 1.2;
  patch.size_y_mm = 1.0;
  patch.cell_mm = 0.05;
  for (const Case& c : cases) {
    CAPTURE(c.name);
    CutSpec cut;
    cut.rpm = 6000.0;
    cut.spindle = c.cw ? SpindleDirection::Cw : SpindleDirection::Ccw;
    Toolpath path;
    path.moves.push_back(c.move);
    REQUIRE(compare_with_oracle(c.cutter, path, cut, patch, 4) > 10);
  }
}

TEST_CASE("simulate_floor: a trochoidal floor with runout equals the tooth oracle", "[sweep]") {
  // The path module's loops (full circles joined by lines), a dished flat with runout.
  const Cutter c = dished_flat(2, 0.004, 75.0);
  CutSpec cut;
  cut.rpm = 4000.0;
  cut.feed_mm_per_min = 800.0;
  cut.spindle = SpindleDirection::Cw;
  Patch patch;
  patch.size_x_mm = 0.3;
  patch.size_y_mm = 0.15;
  patch.cell_mm = 0.03;
  PathSpec spec;
  spec.kind = PathKind::Trochoidal;
  spec.stepover_mm = 1.0;
  spec.loop_diameter_mm = 1.0;
  spec.advance_mm = 0.4;
  const Toolpath path = trochoidal_path(spec, cut, patch, c);
  REQUIRE(compare_with_oracle(c, path, cut, patch, 2) > 10);
}

}  // namespace cuspmap

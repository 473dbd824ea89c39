// Tests of the tooth-resolved sweep: against a time-stepping oracle at sample cells, the ball's
// feed mark (handbook), and the rim marks a tram error leaves (derived geometry).
// Method: tooth-trajectory time stepping (Altintas, Manufacturing Automation, ch. 2) as oracle.
#include <algorithm>
#include <cmath>
#include <complex>
#include <numbers>

#include "path/raster.h"
#include "sweep/brute_force_stamp.h"
#include "sweep/simulate_floor.h"
#include "sweep/teeth_fixtures.h"
#include "test_support.h"

namespace cuspmap {
namespace {

Move line(double x0, double y0, double z0, double x1, double y1, double z1, double feed) {
  Move m;
  m.start_mm = {x0, y0, z0};
  m.end_mm = {x1, y1, z1};
  m.feed_mm_per_min = feed;
  return m;
}

Heightfield teeth_floor(const Cutter& c, const Toolpath& path, const CutSpec& cut,
                        const Patch& patch, int threads = 2) {
  SimSpec sim;
  sim.tooth_marks = true;
  sim.threads = threads;
  return simulate_floor(c, path, cut, patch, sim);
}

}  // namespace

TEST_CASE("simulate_floor: tooth crossings equal a time-stepping oracle", "[sweep]") {
  // Oracle: each tooth edge followed in 1/500 of a tooth period; linear interpolation of the
  // crossing time errs by O(step^2), far below the 0.002 um checked here (float storage slack).
  constexpr double kSlackUm = 2e-3;
  constexpr int kOracleSteps = 500;
  Patch patch;
  patch.size_x_mm = 1.2;
  patch.size_y_mm = 1.0;
  patch.cell_mm = 0.1;
  CutSpec cut;
  cut.rpm = 6000.0;

  Cutter ball;
  ball.shape = CutterShape::Ball;
  ball.diameter_mm = 2.0;
  ball.teeth = 2;
  Cutter flat;
  flat.shape = CutterShape::Flat;
  flat.diameter_mm = 2.0;
  flat.dish_deg = 1.0;
  flat.teeth = 3;
  flat.runout_mm = 0.01;
  flat.runout_phase_deg = 30.0;
  const Cutter bull = test::offset_tilted_bull();

  struct Case {
    const char* name;
    Cutter cutter;
    Toolpath path;
    bool cw;
  };
  std::vector<Case> cases;
  Toolpath one_line;
  one_line.moves.push_back(line(-1.0, 0.43, 0.0, 2.2, 0.61, 0.0, 600.0));  // fz 0.05 mm
  cases.push_back({"ball line", ball, one_line, true});
  cases.push_back({"flat with runout", flat, one_line, false});
  Toolpath ramp;
  ramp.moves.push_back(line(1.9, -0.4, 0.01, -0.8, 1.3, -0.01, 800.0));
  cases.push_back({"bull-nose ramp, offsets, tilt", bull, ramp, true});
  Toolpath bend;
  bend.moves.push_back(line(-1.0, 0.2, 0.0, 0.3, 0.2, 0.0, 500.0));
  Move a;
  a.kind = MoveKind::Arc;
  a.start_mm = {0.3, 0.2, 0.0};
  a.end_mm = {0.3, 1.0, 0.0};
  a.centre_mm = {0.3, 0.6};
  a.ccw = true;
  a.feed_mm_per_min = 500.0;
  bend.moves.push_back(a);
  Move plunge = line(0.3, 1.0, 0.0, 0.3, 1.0, -0.02, 100.0);
  bend.moves.push_back(plunge);
  cases.push_back({"ball line, arc, plunge", ball, bend, true});
  cases.push_back({"flat with runout on arc", flat, bend, false});

  for (const Case& c : cases) {
    CAPTURE(c.name);
    cut.spindle = c.cw ? SpindleDirection::Cw : SpindleDirection::Ccw;
    const Heightfield hf = teeth_floor(c.cutter, c.path, cut, patch);
    int compared = 0;
    for (int j = 0; j < hf.ny; j += 2) {
      for (int i = 0; i < hf.nx; i += 2) {
        const double ref =
            test::time_stepped_teeth_um(c.cutter, c.path, patch.floor_z_mm,
                                        {hf.x_mm(i), hf.y_mm(j)}, cut.rpm, c.cw, kOracleSteps);
        CAPTURE(i, j);
        if (!std::isfinite(ref)) {
          REQUIRE(std::isnan(hf.z_um(j, i)));
          continue;
        }
        REQUIRE_NEAR(hf.z_um(j, i), ref, kSlackUm);
        ++compared;
      }
    }
    REQUIRE(compared > 10);
  }
}

TEST_CASE("simulate_floor: a ball's tooth marks follow the feed-mark circle geometry", "[sweep]") {
  // Handbook feed mark of a ball end mill: h = R - sqrt(R^2 - (fz/2)^2), the circle of the edge
  // swept fz apart. Derived for the radial-edge model on a row at lateral offset w from a pass:
  // the edge sweeps the row's vertical plane on the section circle of radius rho = sqrt(R^2 -
  // w^2), and the cell's bearing atan2(w, x) + kappa x (kappa = omega / v) must step by 2 pi / Z
  // between crossings, so the crossings around the closest approach lie at +-a with
  // |kappa a - sgn(w) atan(a / |w|)| = pi / Z. The row's marks are rho - sqrt(rho^2 - a^2): the
  // handbook form with the section radius, and with a -> fz/2 as |kappa w| grows. (On the pass
  // line itself every edge meets the tip, which cuts the line at the tip height: no mark.)
  Cutter ball;
  ball.diameter_mm = 6.0;
  const double r = 3.0, cell = 0.001, fz = 0.1;
  CutSpec cut;
  cut.rpm = 10000.0;
  cut.spindle = SpindleDirection::Cw;
  for (int teeth : {2, 3}) {
    ball.teeth = teeth;
    const double feed = fz * teeth * cut.rpm;
    const double kappa = -2.0 * std::numbers::pi * cut.rpm / feed;  // rad per mm, cw < 0
    Toolpath path;
    path.moves.push_back(line(-3.5, 0.0, 0.0, 4.5, 0.0, 0.0, feed));
    for (double w_target : {0.3, -0.3, 0.8, -0.8, 1.5}) {
      Patch patch;  // four rows around the target offset, 1 mm = 10 marks long
      patch.size_x_mm = 1.0;
      patch.size_y_mm = 4 * cell;
      patch.cell_mm = cell;
      patch.origin_y_mm = w_target - 2 * cell;
      const Heightfield hf = teeth_floor(ball, path, cut, patch);
      const double w = hf.y_mm(2);
      auto gap = [&](double a) {
        return std::abs(kappa * a - std::copysign(std::atan(a / std::abs(w)), w)) -
               std::numbers::pi / teeth;
      };
      double lo = 0.0, hi = fz;  // gap(0) < 0 < gap(fz) in this regime (|kappa w| > 10)
      for (int it = 0; it < 100; ++it) (gap(0.5 * (lo + hi)) < 0.0 ? lo : hi) = 0.5 * (lo + hi);
      const double a = 0.5 * (lo + hi);
      const double rho = std::sqrt(r * r - w * w);
      const double h_um = (rho - std::sqrt(rho * rho - a * a)) * 1000.0;
      // Grid quantum: slope of the section circle at +-a times one cell.
      const double quantum_um = a / std::sqrt(rho * rho - a * a) * cell * 1000.0;
      const auto row = hf.z_um.row(2);
      CAPTURE(teeth, w, a, h_um);
      REQUIRE_NEAR(row.maxCoeff() - row.minCoeff(), h_um, std::max(0.01 * h_um, quantum_um));
      // The base of the marks is the envelope, the ball at distance |w|.
      REQUIRE_NEAR(row.minCoeff(), (r - rho) * 1000.0, quantum_um);
    }
  }
  // Where the handbook's assumptions hold (w << R and |kappa w| >> 1: a large ball, a row far
  // from the pass line), the simulated marks are the handbook feed mark. The spacing then differs
  // from fz by the relative 1/|kappa w| (from the crossing condition above), the mark (~a^2) by
  // twice that, the section radius from R by w^2 / 2R^2: allowed on top of 1% (issue's rule).
  ball.diameter_mm = 200.0;
  ball.teeth = 2;
  const double big_r = 100.0, fine = 0.0002, feed = fz * 2 * cut.rpm;
  const double kappa = 2.0 * std::numbers::pi * cut.rpm / feed;
  Toolpath path;
  path.moves.push_back(line(-101.0, 0.0, 0.0, 102.0, 0.0, 0.0, feed));
  Patch patch;
  patch.size_x_mm = 0.5;
  patch.size_y_mm = 2 * fine;
  patch.cell_mm = fine;
  patch.origin_y_mm = 5.0;
  const Heightfield hf = teeth_floor(ball, path, cut, patch);
  const double w = hf.y_mm(0);
  const double handbook_um = (big_r - std::sqrt(big_r * big_r - 0.25 * fz * fz)) * 1000.0;
  const double regime = 2.0 / (kappa * w) + w * w / (2.0 * big_r * big_r);
  const double quantum_um = 0.5 * fz / big_r * fine * 1000.0;
  const auto row = hf.z_um.row(0);
  CAPTURE(w, handbook_um, regime);
  REQUIRE_NEAR(row.maxCoeff() - row.minCoeff(), handbook_um,
               (0.01 + regime) * handbook_um + quantum_um);
}

namespace {

// Phase (rad) of the fundamental of a row's heights at period `period_mm` along X, after
// removing the row's mean (the row need not hold a whole number of periods).
double row_phase(const Heightfield& hf, int j, double period_mm) {
  const double mean = hf.z_um.row(j).cast<double>().mean();
  std::complex<double> sum = 0.0;
  for (int i = 0; i < hf.nx; ++i) {
    const double a = 2.0 * std::numbers::pi * hf.x_mm(i) / period_mm;
    sum += (hf.z_um(j, i) - mean) * std::complex<double>(std::cos(a), -std::sin(a));
  }
  return std::arg(sum);
}

double wrap_pi(double a) { return std::remainder(a, 2.0 * std::numbers::pi); }

}  // namespace

TEST_CASE("simulate_floor: zigzag under tram error alternates the lean of the rim marks",
          "[sweep]") {
  // Derived geometry (DESIGN.md tooth model): tilted towards +X, the face's lowest point over a
  // cell at lateral offset w from a pass is the rim point at bearing asin(w/R) from +X, whichever
  // way the pass runs. A tooth is there when its angle equals that bearing, so the mark through
  // the cell lies at x = x0 + (vx/omega) asin(w/R) + sqrt(R^2 - w^2) (+ n fz): the rim arc,
  // leaned by the odd term. Row phases at period fz then differ across the pass by
  // -(2 pi / fz) 2 (vx/omega) asin(w/R) = +-2 Z asin(w/R): the sign follows the feed direction,
  // so one-way passes all lean alike and zigzag passes alternate.
  Cutter flat;
  flat.shape = CutterShape::Flat;
  flat.diameter_mm = 6.0;
  flat.dish_deg = 1.0;
  flat.teeth = 3;
  flat.tilt_deg = 0.3;
  flat.tilt_toward_deg = 0.0;
  const double r = 3.0, fz = 0.047, step = 2.5, cell = 0.005;
  CutSpec cut;
  cut.rpm = 10000.0;
  cut.feed_mm_per_min = fz * flat.teeth * cut.rpm;
  cut.spindle = SpindleDirection::Cw;
  Patch patch;
  // 21 mark periods; fz is not a whole number of cells, so the marks fall at every phase of
  // the grid and the row phase is not rounded to a whole cell (a ramp sampled at the same
  // phase in every period would give phases in steps of 2 pi cell / fz).
  patch.size_x_mm = 21 * fz;
  patch.size_y_mm = 5.7;  // passes at y = 0, 2.5, 5 (and 7.5)
  patch.cell_mm = cell;
  const int m = 119;  // rows at y_k +- (m + 0.5) cell, w ~ 0.6 mm inside the +-1.25 mm band
  const double w = (m + 0.5) * cell;
  const double expected = 2.0 * flat.teeth * std::asin(w / r);  // for vx > 0, omega < 0
  for (RasterDirection dir : {RasterDirection::OneWay, RasterDirection::Zigzag}) {
    PathSpec spec;
    spec.stepover_mm = step;
    spec.direction = dir;
    const Toolpath path = raster_path(spec, cut, patch, flat);
    const Heightfield hf = teeth_floor(flat, path, cut, patch);
    for (int k : {1, 2}) {
      const int j_pass = static_cast<int>(std::lround(k * step / cell));  // y_k on a row edge
      REQUIRE(j_pass + m < hf.ny);
      const double lean =
          wrap_pi(row_phase(hf, j_pass + m, fz) - row_phase(hf, j_pass - m - 1, fz));
      const double sign = (dir == RasterDirection::Zigzag && k % 2 == 1) ? -1.0 : 1.0;
      CAPTURE(static_cast<int>(dir), k, lean, expected);
      // 0.1 rad (a twelfth of the lean): the fundamental's phase also follows the small change
      // of the marks' ramp shape across the band (the cell's bearing turns at w v / R^2 at the
      // rim, with the sign of w) and a row that is not exactly 21 periods; ~0.03 rad here.
      REQUIRE_NEAR(lean, sign * expected, 0.1);
    }
  }
}

}  // namespace cuspmap


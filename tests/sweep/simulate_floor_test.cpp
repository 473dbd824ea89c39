// Tests of simulate_floor on raster floors: handbook cusp heights, no feed-direction
// pseudo-cusps, rotation invariance, the dished flat's flat floor and the marks tram error leaves
// (derived geometry), thread-count determinism, skipping, memory limit.
// Method: handbook scallop formulas (Machinery's Handbook), derived tilt geometry (in each test).
#include "sweep/simulate_floor.h"

#include <algorithm>
#include <cmath>
#include <cstring>
#include <numbers>
#include <thread>

#include "core/input_error.h"
#include "path/raster.h"
#include "sweep/brute_force_stamp.h"
#include "test_support.h"

namespace cuspmap {
namespace {

constexpr double kDeg = std::numbers::pi / 180.0;

struct Stats {
  double mean = 0.0, stddev = 0.0, lo = 1e300, hi = -1e300;
  double range() const { return hi - lo; }
};

// Statistics of the cells whose centres lie at least `margin` inside the patch.
Stats interior_stats(const Heightfield& hf, double margin_mm) {
  Stats s;
  double sum = 0.0, sum2 = 0.0;
  long n = 0;
  for (int j = 0; j < hf.ny; ++j) {
    for (int i = 0; i < hf.nx; ++i) {
      const double x = (i + 0.5) * hf.cell_mm, y = (j + 0.5) * hf.cell_mm;
      if (x < margin_mm || y < margin_mm || x > hf.nx * hf.cell_mm - margin_mm ||
          y > hf.ny * hf.cell_mm - margin_mm) {
        continue;
      }
      const double z = hf.z_um(j, i);
      REQUIRE(std::isfinite(z));
      sum += z;
      sum2 += z * z;
      s.lo = std::min(s.lo, z);
      s.hi = std::max(s.hi, z);
      ++n;
    }
  }
  REQUIRE(n > 0);
  s.mean = sum / n;
  s.stddev = std::sqrt(std::max(0.0, sum2 / n - s.mean * s.mean));
  return s;
}

Heightfield raster_floor(const Cutter& c, double step, double angle, RasterDirection dir,
                         const Patch& patch, bool teeth = false, int threads = 2) {
  PathSpec spec;
  spec.stepover_mm = step;
  spec.angle_deg = angle;
  spec.direction = dir;
  CutSpec cut;
  const Toolpath path = raster_path(spec, cut, patch, c);
  SimSpec sim;
  sim.threads = threads;
  sim.tooth_marks = teeth;
  return simulate_floor(c, path, cut, patch, sim);
}

Patch square_patch(double size, double cell) {
  Patch p;
  p.size_x_mm = p.size_y_mm = size;
  p.cell_mm = cell;
  return p;
}

}  // namespace

TEST_CASE("simulate_floor: ball raster cusp equals the handbook scallop height", "[sweep]") {
  Cutter ball;
  ball.diameter_mm = 6.0;
  const double r = 3.0;
  for (double step : {0.3, 0.5, 1.0}) {
    for (double cell : {0.01, 0.005}) {
      CAPTURE(step, cell);
      const Heightfield hf =
          raster_floor(ball, step, 0.0, RasterDirection::OneWay, square_patch(2.0, cell));
      // Machinery's Handbook (scallop height of a ball end mill): h = R - sqrt(R^2 - (s/2)^2).
      const double h_um = (r - std::sqrt(r * r - 0.25 * step * step)) * 1000.0;
      // Grid quantum: the height change across one cell at the cusp, where the profile's slope
      // is (s/2) / sqrt(R^2 - (s/2)^2); cell centres miss the crest and the pass line by at most
      // half a cell each.
      const double quantum_um = 0.5 * step / std::sqrt(r * r - 0.25 * step * step) * cell * 1000.0;
      const Stats s = interior_stats(hf, 0.0);
      REQUIRE_NEAR(s.range(), h_um, std::max(0.01 * h_um, quantum_um));
    }
  }
}

TEST_CASE("simulate_floor: bull-nose raster cusp equals the corner-radius scallop", "[sweep]") {
  Cutter bull;
  bull.shape = CutterShape::BullNose;
  bull.diameter_mm = 4.0;
  bull.corner_radius_mm = 1.0;
  const double r = 2.0, rc = 1.0;
  for (double step : {2.3, 2.6, 2.9}) {
    for (double cell : {0.02, 0.01}) {
      CAPTURE(step, cell);
      const Heightfield hf =
          raster_floor(bull, step, 0.0, RasterDirection::Zigzag, square_patch(6.0, cell));
      // Bull-nose scallop (DESIGN.md closed forms; torus corner of radius rc beyond the flat of
      // radius R - rc): h = rc - sqrt(rc^2 - (s/2 - (R - rc))^2) for s > 2 (R - rc).
      const double u = 0.5 * step - (r - rc);
      const double h_um = (rc - std::sqrt(rc * rc - u * u)) * 1000.0;
      const double quantum_um = u / std::sqrt(rc * rc - u * u) * cell * 1000.0;  // as for the ball
      const Stats s = interior_stats(hf, 0.0);
      REQUIRE_NEAR(s.range(), h_um, std::max(0.01 * h_um, quantum_um));
    }
  }
  // Below the flat width 2 (R - rc) the flat bottoms overlap: no cusp at all (same source).
  const Heightfield flat_floor =
      raster_floor(bull, 1.9, 0.0, RasterDirection::OneWay, square_patch(4.0, 0.02));
  REQUIRE(interior_stats(flat_floor, 0.0).range() <= 1e-4);
}

TEST_CASE("simulate_floor: no feed-direction pseudo-cusps along a pass", "[sweep]") {
  // The envelope is exact along the feed: at angle 0 every row is one height (float precision).
  Cutter ball;
  ball.diameter_mm = 6.0;
  const Heightfield hf =
      raster_floor(ball, 0.4, 0.0, RasterDirection::Zigzag, square_patch(3.0, 0.01));
  for (int j = 0; j < hf.ny; ++j) {
    const auto row = hf.z_um.row(j);
    CAPTURE(j);
    const float top = row.maxCoeff();
    REQUIRE(row.maxCoeff() - row.minCoeff() <=
            4.0f * std::numeric_limits<float>::epsilon() * std::max(1.0f, top));
  }
  // The brute-force stamp of the same path does show pseudo-cusps along the feed at its sampling
  // step (ball sagitta of the step, derived): this is what the exact envelope avoids.
  Patch small = square_patch(1.0, 0.01);
  PathSpec spec;
  spec.stepover_mm = 0.4;
  const Toolpath path = raster_path(spec, CutSpec{}, small, ball);
  const Heightfield stamped = test::brute_force_stamp(ball, path, small, 0.1);
  double along = 0.0;
  for (int j = 0; j < stamped.ny; ++j) {
    const auto row = stamped.z_um.row(j);
    along = std::max(along, static_cast<double>(row.maxCoeff() - row.minCoeff()));
  }
  REQUIRE(along > 0.1);
}

TEST_CASE("simulate_floor: raster statistics do not change when the angle turns 90 deg",
          "[sweep]") {
  Cutter ball;
  ball.diameter_mm = 4.0;
  const Patch patch = square_patch(3.0, 0.01);
  // At 0 and 90 deg the pattern maps onto the grid exactly (square patch turned about its
  // centre): equal up to float rounding of the fast path.
  const Stats a =
      interior_stats(raster_floor(ball, 0.35, 0.0, RasterDirection::OneWay, patch), 0.1);
  const Stats b =
      interior_stats(raster_floor(ball, 0.35, 90.0, RasterDirection::OneWay, patch), 0.1);
  REQUIRE_NEAR(a.mean, b.mean, 1e-3);
  REQUIRE_NEAR(a.stddev, b.stddev, 1e-3);
  REQUIRE_NEAR(a.range(), b.range(), 1e-3);
  // At 25 and 115 deg cells sample the cusps at other phases: allow the grid quantum on the
  // range and 1% on mean and deviation (sampling of a periodic profile, derived).
  const double r = 2.0, s = 0.35;
  const double h_um = (r - std::sqrt(r * r - 0.25 * s * s)) * 1000.0;
  const double quantum_um = 0.5 * s / std::sqrt(r * r - 0.25 * s * s) * 0.01 * 1000.0;
  const Stats c = interior_stats(raster_floor(ball, s, 25.0, RasterDirection::OneWay, patch), 0.1);
  const Stats d = interior_stats(raster_floor(ball, s, 115.0, RasterDirection::OneWay, patch), 0.1);
  REQUIRE_NEAR(c.mean, d.mean, 0.01 * h_um);
  REQUIRE_NEAR(c.stddev, d.stddev, 0.01 * h_um);
  REQUIRE_NEAR(c.range(), d.range(), quantum_um);
  REQUIRE_NEAR(c.range(), h_um, quantum_um);
}

TEST_CASE("simulate_floor: a tilted ball leaves the untilted cusp (contact shift only)",
          "[sweep]") {
  // DESIGN.md "Geometry": ball cutters are tilt-invariant apart from the contact shift. In the
  // first-order model R - sqrt(R^2 - v^2) - tan(tau) v.n has its lowest point R tan(tau) along n,
  // R (1 - sqrt(1 + tan^2 tau)) ~ R tau^2 / 2 low (derived): the cusp is unchanged to O(tau^2).
  Cutter ball;
  ball.diameter_mm = 6.0;
  const Patch patch = square_patch(2.0, 0.01);
  const double step = 0.5, r = 3.0;
  const Stats plain =
      interior_stats(raster_floor(ball, step, 0.0, RasterDirection::OneWay, patch), 0.0);
  const double quantum_um = 0.5 * step / std::sqrt(r * r - 0.25 * step * step) * 0.01 * 1000.0;
  for (double toward : {0.0, 90.0, 45.0}) {
    CAPTURE(toward);
    ball.tilt_deg = 1.0;
    ball.tilt_toward_deg = toward;
    const Stats tilted =
        interior_stats(raster_floor(ball, step, 0.0, RasterDirection::OneWay, patch), 0.0);
    const double t = std::tan(1.0 * kDeg);
    REQUIRE_NEAR(tilted.range(), plain.range(), std::max(0.01 * plain.range(), quantum_um));
    REQUIRE_NEAR(tilted.lo, plain.lo + r * (1.0 - std::sqrt(1.0 + t * t)) * 1000.0, quantum_um);
  }
}

TEST_CASE("simulate_floor: a dished flat end mill leaves a flat floor in envelope mode",
          "[sweep]") {
  // DESIGN.md "Geometry": the dished face's lowest point is its rim, which passes every cell of
  // the cut at the tip height.
  Cutter flat;
  flat.shape = CutterShape::Flat;
  flat.diameter_mm = 6.0;
  flat.dish_deg = 1.0;
  const Heightfield hf =
      raster_floor(flat, 2.0, 0.0, RasterDirection::OneWay, square_patch(6.0, 0.01));
  REQUIRE(interior_stats(hf, 0.0).range() < 0.05);
}

TEST_CASE("simulate_floor: tram error along the feed leaves tan(tau) times the ball cusp",
          "[sweep]") {
  // Derived geometry: tilted towards the feed, the face's lowest point over a cell at lateral
  // offset w is the rim point ahead, at -tan(tau) sqrt(R^2 - w^2); neighbouring passes meet at
  // w = s/2, so the cusp is tan(tau) (R - sqrt(R^2 - (s/2)^2)).
  Cutter flat;
  flat.shape = CutterShape::Flat;
  flat.diameter_mm = 6.0;
  flat.dish_deg = 1.0;
  flat.tilt_toward_deg = 0.0;  // raster along +X
  const double r = 3.0;
  for (double tau : {0.5, -0.3}) {
    for (double step : {1.0, 2.0}) {
      CAPTURE(tau, step);
      flat.tilt_deg = tau;
      const Heightfield hf =
          raster_floor(flat, step, 0.0, RasterDirection::Zigzag, square_patch(6.0, 0.01));
      const double t = std::abs(std::tan(tau * kDeg));
      const double h_um = t * (r - std::sqrt(r * r - 0.25 * step * step)) * 1000.0;
      // Quantum: slope of -tan(tau) sqrt(R^2 - w^2) at w = s/2, times one cell.
      const double quantum_um = t * 0.5 * step / std::sqrt(r * r - 0.25 * step * step) * 10.0;
      REQUIRE_NEAR(interior_stats(hf, 0.0).range(), h_um, std::max(0.01 * h_um, quantum_um));
    }
  }
}

TEST_CASE("simulate_floor: tram error across the feed leaves a saw-tooth of step s tan(tau)",
          "[sweep]") {
  // Derived geometry: tilted across the feed (low side towards +Y), every point of a chord at
  // lateral offset w is lowered by tan(tau) w, so a pass leaves the plane -tan(tau)(y - y_k) and
  // the lowest pass over y is the one furthest below within R: above y = R (where the first pass
  // stops reaching) a saw-tooth, slope -tan(tau), rising by s tan(tau) at y = y_k + R.
  Cutter flat;
  flat.shape = CutterShape::Flat;
  flat.diameter_mm = 6.0;
  flat.tilt_deg = 0.4;
  flat.tilt_toward_deg = 90.0;
  const double step = 1.5, cell = 0.01, r = 3.0;
  const double t = std::tan(0.4 * kDeg);
  Patch patch = square_patch(3.0, cell);
  patch.size_y_mm = 9.0;
  const Heightfield hf = raster_floor(flat, step, 0.0, RasterDirection::OneWay, patch);
  int jumps = 0;
  double lo = 1e300, hi = -1e300;
  for (int j = 1; j < hf.ny; ++j) {
    if (hf.y_mm(j - 1) <= r) continue;
    for (int i : {0, hf.nx / 2, hf.nx - 1}) {
      const double z = hf.z_um(j, i);
      lo = std::min(lo, z);
      hi = std::max(hi, z);
    }
    const double dz = hf.z_um(j, hf.nx / 2) - hf.z_um(j - 1, hf.nx / 2);
    CAPTURE(j, dz);
    if (dz > 0.0) {
      ++jumps;
      REQUIRE_NEAR(dz, (step - cell) * t * 1000.0, 1e-3);
    } else {
      REQUIRE_NEAR(dz, -cell * t * 1000.0, 1e-3);
    }
  }
  REQUIRE(jumps == 3);  // at y = 4.5, 6 and 7.5 mm
  // Peak to valley: one step of s tan(tau), less at most one cell of the slope (grid quantum).
  REQUIRE_NEAR(hi - lo, step * t * 1000.0, t * cell * 1000.0);
}

TEST_CASE("simulate_floor: heights do not depend on the thread count", "[sweep]") {
  Cutter flat;
  flat.shape = CutterShape::Flat;
  flat.diameter_mm = 2.0;
  flat.dish_deg = 1.0;
  flat.tilt_deg = 0.2;
  flat.tilt_toward_deg = 60.0;
  flat.teeth = 3;
  const Patch patch = square_patch(1.5, 0.01);
  for (bool teeth : {false, true}) {
    CAPTURE(teeth);
    const Heightfield one = raster_floor(flat, 0.6, 30.0, RasterDirection::Zigzag, patch, teeth, 1);
    const Heightfield three =
        raster_floor(flat, 0.6, 30.0, RasterDirection::Zigzag, patch, teeth, 3);
    REQUIRE(std::memcmp(one.z_um.data(), three.z_um.data(), sizeof(float) * one.cells()) == 0);
  }
}

TEST_CASE("simulate_floor: moves that cannot reach the patch are skipped, unreached cells NaN",
          "[sweep]") {
  Cutter ball;
  ball.diameter_mm = 2.0;
  Patch patch = square_patch(4.0, 0.05);
  patch.floor_z_mm = 10.0;
  Toolpath path;
  Move cut;
  cut.start_mm = {0.5, 0.5, 10.0};
  cut.end_mm = {1.5, 0.5, 10.0};
  cut.feed_mm_per_min = 500.0;
  Move high = cut;  // tip 1.01 mm above the floor: the ball reaches up only R = 1 mm
  high.start_mm.z() = high.end_mm.z() = 11.01;
  Move away = cut;  // 1.2 mm outside the patch, beyond the reach
  away.start_mm = {-2.2, 1.0, 10.0};
  away.end_mm = {-2.2, 3.0, 10.0};
  Move still = cut;  // zero length
  still.end_mm = still.start_mm;
  path.moves = {cut, high, away, still};
  SweepStats stats;
  const Heightfield hf = simulate_floor(ball, path, CutSpec{}, patch, SimSpec{}, &stats);
  REQUIRE(stats.moves_swept == 1);
  REQUIRE(stats.moves_skipped == 3);
  REQUIRE(stats.cell_updates > 0);
  REQUIRE(std::isnan(hf.z_um(hf.ny - 1, hf.nx - 1)));
  // Cell (1.025, 0.525) lies 0.025 mm beside the axis: ball height R - sqrt(R^2 - d^2).
  REQUIRE(hf.z_um(10, 20) == Approx((1.0 - std::sqrt(1.0 - 0.025 * 0.025)) * 1000.0).epsilon(1e-5));
  REQUIRE(reached_cells(hf) < hf.cells() / 4);
}

TEST_CASE("simulate_floor: a grid over the memory limit is refused before sweeping", "[sweep]") {
  SimSpec sim;
  sim.max_memory_bytes = 1000;
  REQUIRE_THROWS_AS(simulate_floor(Cutter{}, Toolpath{}, CutSpec{}, square_patch(1.0, 0.01), sim),
                    InputError);
}

TEST_CASE("simulate_floor: progress is reported from the calling thread, ending at 1", "[sweep]") {
  Cutter ball;
  ball.diameter_mm = 2.0;
  const Patch patch = square_patch(3.0, 0.005);
  PathSpec spec;
  spec.stepover_mm = 0.2;
  const Toolpath path = raster_path(spec, CutSpec{}, patch, ball);
  for (int threads : {1, 2}) {
    std::vector<double> seen;
    const std::thread::id caller = std::this_thread::get_id();
    bool same_thread = true;
    SimSpec sim;
    sim.threads = threads;
    sim.progress = [&](double f) {
      seen.push_back(f);
      same_thread = same_thread && std::this_thread::get_id() == caller;
    };
    simulate_floor(ball, path, CutSpec{}, patch, sim);
    REQUIRE(same_thread);
    REQUIRE_FALSE(seen.empty());
    REQUIRE(seen.back() == 1.0);
    REQUIRE(std::is_sorted(seen.begin(), seen.end()));
  }
}

}  // namespace cuspmap

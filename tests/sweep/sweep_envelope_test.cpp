// Tests of the envelope sweep against independent oracles: brute-force stamping (sampling
// sagitta as tolerance, derived below) and a dense per-cell minimisation along each move.
// Method: Z-map stamping oracle (Choi & Jerard 1998) and golden-section minimisation (Kiefer 1953).
#include <algorithm>
#include <cmath>
#include <numbers>

#include "sweep/brute_force_stamp.h"
#include "sweep/simulate_floor.h"
#include "test_support.h"

namespace cuspmap {
namespace {

// Slack for float storage of heights (um): a float holds ~7 digits, heights here stay below
// ~2000 um, so rounding is under 2e-4 um; the float fast path adds up to ~1e-6 mm where the
// cutter surface is not steep. 0.002 um covers both with margin.
constexpr double kFloatSlackUm = 2e-3;

Move line(double x0, double y0, double z0, double x1, double y1, double z1) {
  Move m;
  m.kind = MoveKind::Line;
  m.start_mm = {x0, y0, z0};
  m.end_mm = {x1, y1, z1};
  m.feed_mm_per_min = 1000.0;
  return m;
}

Move arc(double x0, double y0, double x1, double y1, double cx, double cy, bool ccw, double z0,
         double z1) {
  Move m;
  m.kind = MoveKind::Arc;
  m.start_mm = {x0, y0, z0};
  m.end_mm = {x1, y1, z1};
  m.centre_mm = {cx, cy};
  m.ccw = ccw;
  m.feed_mm_per_min = 1000.0;
  return m;
}

Heightfield envelope(const Cutter& c, const Toolpath& path, const Patch& patch) {
  SimSpec sim;
  sim.threads = 2;
  return simulate_floor(c, path, CutSpec{}, patch, sim);
}

// Largest |fast - oracle| over cells where both are finite and `use(oracle_um)` holds; also
// checks that fast and the oracle agree on which cells are reached (except where `use` fails).
template <class Use>
double max_gap_dense(const Heightfield& fast, const Cutter& c, const Toolpath& path,
                     const Patch& patch, Use use) {
  double gap = 0.0;
  for (int j = 0; j < fast.ny; ++j) {
    for (int i = 0; i < fast.nx; ++i) {
      double ref = std::numeric_limits<double>::infinity();
      const Eigen::Vector2d p(fast.x_mm(i), fast.y_mm(j));
      for (const Move& m : path.moves) {
        ref = std::min(ref, test::dense_min_along_move_um(c, m, patch.floor_z_mm, p, 801));
      }
      const double got = fast.z_um(j, i);
      if (!std::isfinite(ref) || !use(ref)) continue;
      CAPTURE(i, j, got, ref);
      REQUIRE(std::isfinite(got));
      gap = std::max(gap, std::abs(got - ref));
    }
  }
  return gap;
}

}  // namespace

TEST_CASE("simulate_floor: ball line envelope equals the per-cell minimum along the move",
          "[sweep]") {
  Cutter ball;
  ball.shape = CutterShape::Ball;
  ball.diameter_mm = 2.0;
  Patch patch;
  patch.size_x_mm = 3.0;
  patch.size_y_mm = 2.0;
  patch.cell_mm = 0.05;
  Toolpath path;
  path.moves.push_back(line(-0.5, 0.2, 0.0, 3.2, 1.9, 0.0));  // ~25 deg across the patch
  const Heightfield hf = envelope(ball, path, patch);
  const double gap = max_gap_dense(hf, ball, path, patch, [](double) { return true; });
  REQUIRE(gap <= kFloatSlackUm);
}

TEST_CASE("simulate_floor: ramps, tilt and arcs equal the per-cell minimum along the move",
          "[sweep]") {
  Patch patch;
  patch.size_x_mm = 3.0;
  patch.size_y_mm = 2.5;
  patch.cell_mm = 0.05;
  patch.floor_z_mm = 1.0;
  Cutter bull;
  bull.shape = CutterShape::BullNose;
  bull.diameter_mm = 2.0;
  bull.corner_radius_mm = 0.4;
  bull.dish_deg = 1.5;
  Cutter flat;
  flat.shape = CutterShape::Flat;
  flat.diameter_mm = 2.0;
  flat.dish_deg = 1.0;
  Cutter ball;
  ball.shape = CutterShape::Ball;
  ball.diameter_mm = 2.0;

  struct Case {
    const char* name;
    Cutter cutter;
    Move move;
  };
  std::vector<Case> cases;
  cases.push_back({"bull-nose ramp", bull, line(-0.4, 0.3, 1.2, 3.3, 2.1, 0.9)});
  cases.push_back({"dished flat ramp", flat, line(3.2, 0.4, 0.95, -0.3, 1.7, 1.05)});
  Cutter tilted_flat = flat;
  tilted_flat.tilt_deg = 0.8;
  tilted_flat.tilt_toward_deg = 35.0;
  cases.push_back({"tilted dished flat line", tilted_flat, line(-0.5, 1.0, 1.0, 3.5, 1.4, 1.0)});
  Cutter tilted_bull = bull;
  tilted_bull.tilt_deg = -0.6;
  tilted_bull.tilt_toward_deg = 200.0;
  cases.push_back({"tilted bull-nose ramp", tilted_bull, line(0.2, -0.3, 1.1, 2.6, 2.8, 1.0)});
  Cutter tilted_ball = ball;
  tilted_ball.tilt_deg = 1.0;
  tilted_ball.tilt_toward_deg = 90.0;
  cases.push_back({"tilted ball ramp", tilted_ball, line(-0.5, 0.6, 1.3, 3.5, 1.5, 1.0)});
  cases.push_back({"ball level arc", ball, arc(2.5, 1.25, 0.5, 1.25, 1.5, 1.25, true, 1.0, 1.0)});
  cases.push_back({"bull-nose helix", bull, arc(2.3, 0.5, 0.7, 2.0, 1.5, 1.25, false, 1.1, 0.95)});
  cases.push_back(
      {"tilted flat arc", tilted_flat, arc(0.5, 0.2, 2.6, 0.9, 1.4, 1.9, true, 1.0, 1.0)});
  cases.push_back(
      {"dished flat full circle", flat, arc(2.1, 1.25, 2.1, 1.25, 1.5, 1.25, true, 1.0, 1.0)});
  cases.push_back({"ball plunge", ball, line(1.5, 1.2, 1.5, 1.5, 1.2, 0.98)});
  for (const Case& c : cases) {
    CAPTURE(c.name);
    Toolpath path;
    path.moves.push_back(c.move);
    const Heightfield hf = envelope(c.cutter, path, patch);
    const double gap = max_gap_dense(hf, c.cutter, path, patch, [](double) { return true; });
    REQUIRE(gap <= kFloatSlackUm);
  }
}

TEST_CASE("simulate_floor: envelope agrees with brute-force stamping within its sampling error",
          "[sweep]") {
  // The stamp samples each move every ds: between samples it misses the true lowest point by
  // at most the profile's rise over the distance to the nearest sample (derived per case).
  constexpr double kDsMm = 0.005;
  Patch patch;
  patch.size_x_mm = 2.5;
  patch.size_y_mm = 2.0;
  patch.cell_mm = 0.02;
  Cutter ball;
  ball.diameter_mm = 2.0;
  const double r = 1.0;
  auto compare = [&](const Cutter& c, const Toolpath& path, auto tol_um_at) {
    const Heightfield fast = envelope(c, path, patch);
    const Heightfield stamp = test::brute_force_stamp(c, path, patch, kDsMm);
    int compared = 0;
    for (int j = 0; j < fast.ny; ++j) {
      for (int i = 0; i < fast.nx; ++i) {
        const double tol = tol_um_at(fast.x_mm(i), fast.y_mm(j));
        if (!(tol >= 0.0) || !std::isfinite(stamp.z_um(j, i))) continue;
        CAPTURE(i, j);
        // The stamp never goes below the exact envelope, and misses it by at most tol.
        REQUIRE(stamp.z_um(j, i) >= fast.z_um(j, i) - kFloatSlackUm);
        REQUIRE_NEAR(stamp.z_um(j, i), fast.z_um(j, i), tol + kFloatSlackUm);
        ++compared;
      }
    }
    REQUIRE(compared > fast.cells() / 4);
  };
  // Ball along a line at lateral offset w: the height along the line is the section circle of
  // radius rho = sqrt(R^2 - w^2), so the sagitta over half a step is rho - sqrt(rho^2 - (ds/2)^2).
  auto ball_sagitta_um = [&](double w) {
    const double rho = std::sqrt(r * r - w * w), x = 0.5 * kDsMm;
    return (rho - std::sqrt(rho * rho - x * x)) * 1000.0;
  };

  SECTION("zigzag raster") {
    Toolpath path;
    for (int k = 0; k < 9; ++k) {
      const double y = 0.25 * k, x0 = k % 2 ? 3.6 : -1.1, x1 = k % 2 ? -1.1 : 3.6;
      path.moves.push_back(line(x0, y, 0.0, x1, y, 0.0));
      if (k < 8) path.moves.push_back(line(x1, y, 0.0, x1, y + 0.25, 0.0));
    }
    // Every cell is nearest to a pass within s/2 = 0.125 mm; the links lie outside the reach.
    compare(ball, path, [&](double, double) { return ball_sagitta_um(0.125); });
  }
  SECTION("level arc") {
    Toolpath path;
    path.moves.push_back(arc(2.2, 1.0, 1.0, 2.2, 1.0, 1.0, true, 0.0, 0.0));
    // A sample ds/2 of arc away from the foot point lies at x^2 <= (rho_c / ra)(ds/2)^2 along
    // the section (rho_c <= ra + R the cell's distance from the centre); compare cells within
    // 0.8 R of the arc (section radius >= 0.6 R).
    compare(ball, path, [&](double x, double y) {
      const double rho_c = std::hypot(x - 1.0, y - 1.0), ra = 1.2;
      const double angle = std::atan2(y - 1.0, x - 1.0);
      if (angle < 0.0 || angle > 0.5 * std::numbers::pi || std::abs(rho_c - ra) > 0.8 * r) {
        return -1.0;
      }
      const double rho = 0.6 * r, along2 = (rho_c / ra) * 0.25 * kDsMm * kDsMm;
      return (rho - std::sqrt(rho * rho - along2)) * 1000.0;
    });
  }
  SECTION("ramp") {
    Toolpath path;
    path.moves.push_back(line(-0.5, 0.4, 0.05, 3.0, 1.6, -0.05));  // slope g ~ 0.027
    // Height along the ramp: g s + section circle; its curvature at the lowest point is at most
    // 1.01 / rho for |g| < 0.1, so the miss is <= 1.01 (ds/2)^2 / (2 rho); cells |w| <= 0.8 R.
    const Eigen::Vector2d a(-0.5, 0.4), d = Eigen::Vector2d(3.5, 1.2).normalized();
    compare(ball, path, [&](double x, double y) {
      const Eigen::Vector2d v = Eigen::Vector2d(x, y) - a;
      const double w = std::abs(v.x() * d.y() - v.y() * d.x());
      if (w > 0.8 * r) return -1.0;
      return 1.01 * 0.125 * kDsMm * kDsMm / (0.6 * r) * 1000.0;
    });
  }
  SECTION("tilted dished flat") {
    Cutter flat;
    flat.shape = CutterShape::Flat;
    flat.diameter_mm = 2.0;
    flat.dish_deg = 1.0;
    flat.tilt_deg = 0.5;
    flat.tilt_toward_deg = 20.0;
    Toolpath path;
    path.moves.push_back(line(-1.1, 1.0, 0.0, 3.6, 1.0, 0.0));
    // The lowest point is on the rim, where the height along the path changes by at most
    // tan(dish) + tan(tilt) per mm: the nearest sample inside the cutter is within ds, so the
    // miss is <= (tan(dish) + tan(tilt)) ds, for chords longer than 2 ds (|w| < sqrt(R^2 - ds^2)).
    const double slope =
        std::tan(1.0 * std::numbers::pi / 180.0) + std::tan(0.5 * std::numbers::pi / 180.0);
    compare(flat, path, [&](double, double y) {
      const double w = std::abs(y - 1.0);
      if (w * w > r * r - kDsMm * kDsMm) return -1.0;
      return slope * kDsMm * 1000.0;
    });
  }
}

}  // namespace cuspmap

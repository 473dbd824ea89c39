// The tooth-resolved forward model of the fit (infer/tooth_model): the per-pass start shift is
// the spindle phase nuisance, so a shift of one revolution (or of one tooth without runout) must
// leave a pass's floor unchanged and a shift of s must move its marks s along the feed.
#include "infer/tooth_model.h"

#include <catch2/catch.hpp>
#include <cmath>

#include "test_support.h"

namespace cuspmap {
namespace {

// A dished 6 mm flat, 3 teeth, fz 0.05 mm, one pass along +X through a 0.6 x 0.3 mm window.
ToothModel flat_model(double runout_um) {
  ToothModel m;
  m.cutter.shape = CutterShape::Flat;
  m.cutter.diameter_mm = 6.0;
  m.cutter.teeth = 3;
  m.cutter.runout_mm = runout_um * 1e-3;
  m.stepover_mm = 0.8;
  m.offset_mm = 0.0;
  m.feed_per_tooth_mm = 0.05;
  m.window.cell_mm = 0.005;
  m.window.size_x_mm = 0.6 - 0.0025;
  m.window.size_y_mm = 0.3 - 0.0025;
  m.threads = 2;
  place_passes(m, RasterDirection::OneWay, 0);
  return m;
}

int centre_pass(const ToothModel& m) {
  for (size_t k = 0; k < m.pass_index.size(); ++k) {
    if (m.pass_index[k] == 0) return static_cast<int>(k);
  }
  return -1;
}

// Largest |a - b| over cells finite in both, um.
double max_diff(const Heightfield& a, const Heightfield& b, int skip_cols = 0) {
  double d = 0.0;
  for (int j = 0; j < a.ny; ++j) {
    for (int i = skip_cols; i < a.nx - skip_cols; ++i) {
      if (std::isfinite(a.z_um(j, i)) && std::isfinite(b.z_um(j, i))) {
        d = std::max(d, std::abs(static_cast<double>(a.z_um(j, i)) - b.z_um(j, i)));
      }
    }
  }
  return d;
}

}  // namespace

TEST_CASE("simulate_tooth_pass: the start shift is the spindle phase", "[infer][tooth]") {
  ToothParams g;
  g.dish_deg = 1.0;
  g.tilt_along_deg = 0.02;
  for (double runout_um : {0.0, 5.0}) {
    CAPTURE(runout_um);
    ToothModel m = flat_model(0.0);
    g.runout_cos_um = runout_um;
    const Cutter c = tooth_cutter(m, g);
    REQUIRE(c.runout_mm == Approx(runout_um * 1e-3));
    const int k = centre_pass(m);
    REQUIRE(k >= 0);
    const Heightfield f0 = simulate_tooth_pass(m, c, k, 0.0);
    // The marks are deep enough to tell shifts apart: a 1 deg dish over half a 0.05 mm feed
    // per tooth, ~0.4 um (derived), far above float rounding.
    const Heightfield quarter = simulate_tooth_pass(m, c, k, 0.0125);
    REQUIRE(max_diff(f0, quarter) > 0.05);
    // One revolution (Z fz = 0.15 mm) later the same tooth is at the same place (derived).
    REQUIRE(max_diff(f0, simulate_tooth_pass(m, c, k, 0.15)) < 1e-3);
    // One tooth (fz) later: the same floor only when the teeth cut alike (derived; runout
    // makes one tooth cut further out, Kline & DeVor 1983).
    const double tooth = max_diff(f0, simulate_tooth_pass(m, c, k, 0.05));
    if (runout_um == 0.0) {
      REQUIRE(tooth < 1e-3);
    } else {
      REQUIRE(tooth > 0.01);
    }
    // Starting s = 2 cells earlier moves the marks 2 cells back along the feed (derived):
    // floor_s(x) = floor_0(x + s) away from the window's ends.
    const Heightfield fs = simulate_tooth_pass(m, c, k, 0.01);
    Heightfield moved = f0;
    for (int j = 0; j < f0.ny; ++j) {
      for (int i = 0; i + 2 < f0.nx; ++i) moved.z_um(j, i) = f0.z_um(j, i + 2);
    }
    REQUIRE(max_diff(fs, moved, 4) < 1e-3);
  }
}

TEST_CASE("min_into: cell-wise minimum, NaN is not reached", "[infer][tooth]") {
  // a = [1 NaN 3], b = [2 5 NaN] -> [1 5 3] (derived).
  Heightfield a, b;
  a.nx = b.nx = 3;
  a.ny = b.ny = 1;
  a.z_um.resize(1, 3);
  b.z_um.resize(1, 3);
  a.z_um << 1.0f, kUnreached, 3.0f;
  b.z_um << 2.0f, 5.0f, kUnreached;
  Heightfield out = a;
  out.z_um.setConstant(kUnreached);
  min_into(a, out);
  min_into(b, out);
  REQUIRE(out.z_um(0, 0) == 1.0f);
  REQUIRE(out.z_um(0, 1) == 5.0f);
  REQUIRE(out.z_um(0, 2) == 3.0f);
}

}  // namespace cuspmap

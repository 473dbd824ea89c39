// Heightfield agreement between the user's G-code and the built-in strategies: a raster written
// as G-code by the DESIGN.md raster contract leaves the same floor as the built-in raster, and
// the two-centre spiral written as G2/G3 (I/J) leaves the same floor as the built-in spiral.
// Method: both paths are swept by simulate_floor (the revolving-cutter envelope) on one grid.
#include <charconv>
#include <cmath>
#include <string>

#include "path/gcode_reader.h"
#include "path/path_test_geometry.h"
#include "path/raster.h"
#include "path/spiral_path.h"
#include "sweep/simulate_floor.h"
#include "test_support.h"

namespace cuspmap {
namespace {

// A G-code number: 6 decimals (0.5 nm rounding), locale-free.
std::string num(char letter, double v) {
  char buf[40];
  buf[0] = letter;
  const auto [end, ec] = std::to_chars(buf + 1, buf + sizeof buf, v, std::chars_format::fixed, 6);
  (void)ec;
  return std::string(buf, end);
}

Patch sweep_patch() {
  Patch p;
  p.size_x_mm = 4.0;
  p.size_y_mm = 3.0;
  p.cell_mm = 0.02;
  return p;
}

// Largest |a - b| over cells finite in both, um; the NaN masks must match.
double max_difference_um(const Heightfield& a, const Heightfield& b) {
  REQUIRE(a.nx == b.nx);
  REQUIRE(a.ny == b.ny);
  double worst = 0.0;
  for (int j = 0; j < a.ny; ++j) {
    for (int i = 0; i < a.nx; ++i) {
      const float za = a.z_um(j, i), zb = b.z_um(j, i);
      CAPTURE(i, j);
      REQUIRE(std::isnan(za) == std::isnan(zb));
      if (!std::isnan(za)) worst = std::max(worst, static_cast<double>(std::abs(za - zb)));
    }
  }
  return worst;
}

// The G-code program's coordinates are rounded to 0.5 nm; for a ball of R = 3 mm the floor's
// slope across a pass is at most s / (2R) < 0.1 here, so heights move by < 0.05 nm. Float heights
// in um carry ~7 digits (1e-4 um at 100 um). Tolerance: 1e-3 um, above both.
constexpr double kAgreementUm = 1e-3;

}  // namespace

TEST_CASE("simulate_floor: a G-code raster leaves the built-in raster's floor", "[path]") {
  const Patch patch = sweep_patch();
  const Cutter ball = test::test_ball();
  CutSpec cut;
  PathSpec spec;
  spec.kind = PathKind::Raster;
  spec.stepover_mm = 0.4;
  spec.direction = RasterDirection::OneWay;
  const Toolpath built = raster_path(spec, cut, patch, ball);
  // DESIGN.md raster contract at angle 0: passes along +X at y = k s, k = 0 .. ceil(size_y / s),
  // each from x = -R to size_x + R; one-way links lift to the clearance height.
  const double r = ball.radius_mm();
  const int passes = static_cast<int>(std::ceil(patch.size_y_mm / spec.stepover_mm));
  std::string program = "G21 G90 G17 G94 M3 S10000\n";
  for (int k = 0; k <= passes; ++k) {
    const double y = k * spec.stepover_mm;
    program += "G0 " + num('X', -r) + " " + num('Y', y) + " Z2\n";
    program += "G1 Z0 F1000\n";
    program += "G1 " + num('X', patch.size_x_mm + r) + "\n";
    program += "G0 Z2\n";
  }
  program += "M30\n";
  const BuiltPath read = read_gcode_text(program, "raster.nc", cut, patch, ball);
  const SimSpec sim;
  const Heightfield a = simulate_floor(ball, built, cut, patch, sim);
  const Heightfield b = simulate_floor(ball, read.path, cut, patch, sim);
  CHECK(max_difference_um(a, b) <= kAgreementUm);
}

TEST_CASE("simulate_floor: a spiral written as G2/G3 leaves the built-in spiral's floor", "[path]") {
  const Patch patch = sweep_patch();
  const Cutter ball = test::test_ball();
  CutSpec cut;
  PathSpec spec;
  spec.kind = PathKind::Spiral;
  spec.stepover_mm = 0.3;
  const Toolpath built = spiral_path(spec, cut, patch, ball);
  // The construction of spiral_path.h written independently: half turn n about B = M + (s/4, 0)
  // (odd n) or A = M - (s/4, 0) (even n), radius n s / 2, counter-clockwise (climb, M3, out),
  // until both centres' last turns pass every corner by R.
  const double s = spec.stepover_mm, b = s / 2, r_tool = ball.radius_mm();
  const Eigen::Vector2d m(patch.size_x_mm / 2, patch.size_y_mm / 2);
  const Eigen::Vector2d ca = m - Eigen::Vector2d(b / 2, 0), cb = m + Eigen::Vector2d(b / 2, 0);
  const double reach_a = (Eigen::Vector2d(patch.size_x_mm, patch.size_y_mm) - ca).norm() + r_tool;
  const double reach_b = (Eigen::Vector2d(0, patch.size_y_mm) - cb).norm() + r_tool;
  std::string program = "G21 G90 G17 G94 M3 S10000\nG0 " + num('X', ca.x()) + " " +
                        num('Y', ca.y()) + " Z2\nG1 Z0 F1000\n";
  Eigen::Vector2d at = ca;
  bool done_a = false, done_b = false;
  for (int n = 1; !(done_a && done_b); ++n) {
    const bool odd = n % 2 == 1;
    const Eigen::Vector2d c = odd ? cb : ca;
    const double rad = n * b;
    const Eigen::Vector2d end = c + Eigen::Vector2d(odd ? rad : -rad, 0);
    program += "G3 " + num('X', end.x()) + " " + num('Y', end.y()) + " " + num('I', c.x() - at.x()) +
               " " + num('J', c.y() - at.y()) + "\n";
    at = end;
    (odd ? done_b : done_a) = rad >= (odd ? reach_b : reach_a);
  }
  program += "G0 Z2\nM30\n";
  const BuiltPath read = read_gcode_text(program, "spiral.nc", cut, patch, ball);
  const SimSpec sim;
  const Heightfield ha = simulate_floor(ball, built, cut, patch, sim);
  const Heightfield hb = simulate_floor(ball, read.path, cut, patch, sim);
  CHECK(max_difference_um(ha, hb) <= kAgreementUm);
}

}  // namespace cuspmap

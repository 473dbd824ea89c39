// Tests of the tooth-resolved sweep: against a time-stepping oracle at sample cells, the ball's
// feed mark (handbook), and the rim marks a tram error leaves (derived geometry).
#include <algorithm>
#include <cmath>
#include <complex>
#include <numbers>

#include "path/raster.h"
#include "sweep/brute_force_stamp.h"
#include "sweep/simulate_floor.h"
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

Heightfield teeth(const Cutter& c, const Toolpath& path, const CutSpec& cut, const Patch& patch,
                  int threads = 2) {
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
  Cutter bull;
  bull.shape = CutterShape::BullNose;
  bull.diameter_mm = 1.6;
  bull.corner_radius_mm = 0.3;
  bull.teeth = 4;
  bull.axial_offsets_um = {0.0, 1.5, -0.5, 0.8};
  bull.tilt_deg = 0.3;
  bull.tilt_toward_deg = 120.0;

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
    const Heightfield hf = teeth(c.cutter, c.path, cut, patch);
    int compared = 0;
    for (int j = 0; j < hf.ny; j += 2) {
      for (int i = 0; i < hf.nx; i += 2) {
        const double ref = test::time_stepped_teeth_um(c.cutter, c.path, patch.floor_z_mm,
                                                       {hf.x_mm(i), hf.y_mm(j)}, cut.rpm, c.cw,
                                                       kOracleSteps);
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

}  // namespace cuspmap

// Tests of toolpath_machine_time on hand-built paths: pass counting (links, retracts and plunges
// are not passes), time = length / feed + passes x overhead, rotated rasters.
#include "finish/toolpath_machine_time.h"

#include <cmath>
#include <numbers>

#include "test_support.h"

namespace cuspmap {
namespace {

Move line(Eigen::Vector3d a, Eigen::Vector3d b, double feed, bool rapid = false) {
  Move m;
  m.start_mm = a;
  m.end_mm = b;
  m.feed_mm_per_min = feed;
  m.rapid = rapid;
  return m;
}

}  // namespace

TEST_CASE("toolpath_machine_time: one-way raster, passes and links", "[finish]") {
  // Two one-way passes 100 mm long at y = 0 and y = 1, feed 600 mm/min; link: retract 2 mm,
  // rapid back at 6000 mm/min, plunge at feed.
  //   y=1  o------------------>   pass 2
  //        ^ plunge (feed)
  //        :<.................    rapid back at z = 2
  //   y=0  o------------------>   pass 1, then retract (rapid)
  Toolpath p;
  p.moves.push_back(line({0, 0, 0}, {100, 0, 0}, 600));
  p.moves.push_back(line({100, 0, 0}, {100, 0, 2}, 6000, true));
  p.moves.push_back(line({100, 0, 2}, {0, 1, 2}, 6000, true));
  p.moves.push_back(line({0, 1, 2}, {0, 1, 0}, 600));
  p.moves.push_back(line({0, 1, 0}, {100, 1, 0}, 600));
  const MachineTime t = toolpath_machine_time(p, 0.0, 1.5);
  REQUIRE(t.passes == 2);
  const double back = std::hypot(100.0, 1.0);
  REQUIRE_NEAR(t.path_length_mm, 200.0 + 2.0 + back + 2.0, 1e-9);
  REQUIRE_NEAR(t.cycle_time_s, 202.0 / 600.0 * 60.0 + (2.0 + back) / 6000.0 * 60.0, 1e-9);
  REQUIRE_NEAR(t.overhead_s, 3.0, 1e-12);
  REQUIRE_NEAR(t.machine_time_s, t.cycle_time_s + 3.0, 1e-12);
}

TEST_CASE("toolpath_machine_time: zigzag links across the passes are not passes", "[finish]") {
  // Passes at 30 deg; links perpendicular to them, at feed.
  const double a = 30.0 * std::numbers::pi / 180.0;
  const Eigen::Vector3d u(std::cos(a), std::sin(a), 0), n(-std::sin(a), std::cos(a), 0);
  Toolpath p;
  Eigen::Vector3d at(0, 0, -0.1);
  for (int k = 0; k < 5; ++k) {
    const Eigen::Vector3d end = at + (k % 2 ? -50.0 : 50.0) * u;
    p.moves.push_back(line(at, end, 1000));
    if (k < 4) p.moves.push_back(line(end, end + 0.4 * n, 1000));
    at = end + 0.4 * n;
  }
  const MachineTime t = toolpath_machine_time(p, 30.0, 0.0);
  REQUIRE(t.passes == 5);
  REQUIRE_NEAR(t.machine_time_s, (250.0 + 4 * 0.4) / 1000.0 * 60.0, 1e-9);
  REQUIRE(toolpath_machine_time(p, 120.0, 0.0).passes == 4);  // the links, seen as passes
  REQUIRE(toolpath_machine_time(Toolpath{}, 0.0, 1.0).machine_time_s == 0.0);
}

}  // namespace cuspmap

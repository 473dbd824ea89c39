// Machine time of a raster path: cycle time from the moves, passes counted from the geometry,
// plus a per-pass overhead. Lengths mm, times s. O(moves).
// Method: time = sum(length / feed) + passes x overhead (DESIGN.md "Finish decisions").
#include "finish/toolpath_machine_time.h"

#include <cassert>
#include <cmath>
#include <numbers>

namespace cuspmap {
namespace {

// A move counts as level and parallel to the passes within these limits: raster passes are built
// exactly level and exactly along the angle, so only round-off (~1e-12 mm) needs absorbing.
constexpr double kLevelTolMm = 1e-9;
constexpr double kParallelSin = 1e-9;

}  // namespace

MachineTime toolpath_machine_time(const Toolpath& path, double pass_angle_deg,
                                  double pass_overhead_s) {
  assert(pass_overhead_s >= 0.0 && "overhead is validated where it enters");
  const double a = pass_angle_deg * std::numbers::pi / 180.0;
  const Eigen::Vector2d along(std::cos(a), std::sin(a));
  MachineTime t;
  for (const Move& m : path.moves) {
    if (m.rapid || m.kind != MoveKind::Line) continue;
    const Eigen::Vector3d d = m.end_mm - m.start_mm;
    const double len_xy = std::hypot(d.x(), d.y());
    if (len_xy <= kLevelTolMm || std::abs(d.z()) > kLevelTolMm) continue;
    const double cross = along.x() * d.y() - along.y() * d.x();
    if (std::abs(cross) <= kParallelSin * len_xy) ++t.passes;
  }
  t.path_length_mm = path_length_mm(path, true);
  t.cycle_time_s = cycle_time_s(path);
  t.overhead_s = t.passes * pass_overhead_s;
  t.machine_time_s = t.cycle_time_s + t.overhead_s;
  return t;
}

}  // namespace cuspmap

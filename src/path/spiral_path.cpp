// Spiral of tangent-continuous semicircles with constant stepover (see spiral_path.h).
// Inputs mm, deg; output arcs. Cost O(half turns) = O(2 (half diagonal + R) / (s/2)).
// Method: two-centre semicircle spiral (Lockwood, A Book of Curves, 1961, ch. 16).
#include "path/spiral_path.h"

#include <algorithm>
#include <cmath>
#include <numbers>
#include <vector>

#include "core/input_error.h"
#include "core/units.h"
#include "path/check_length.h"
#include "path/path_builder.h"

namespace cuspmap {
namespace {

struct HalfTurn {
  Eigen::Vector2d start, end, centre;
};

}  // namespace

Toolpath spiral_path(const PathSpec& spec, const CutSpec& cut, const Patch& patch,
                     const Cutter& cutter) {
  check_length_mm(spec.stepover_mm, "path.stepover", false);
  const double s = spec.stepover_mm;
  const double angle = spec.angle_deg * std::numbers::pi / 180.0;
  const Eigen::Vector2d u(std::cos(angle), std::sin(angle));
  const Eigen::Vector2d mid(patch.origin_x_mm + 0.5 * patch.size_x_mm,
                            patch.origin_y_mm + 0.5 * patch.size_y_mm);
  const double b = 0.5 * s;  // radius growth per half turn
  const Eigen::Vector2d centre_a = mid - 0.5 * b * u, centre_b = mid + 0.5 * b * u;
  // Radius each centre's semicircles must reach: farthest patch corner plus R.
  double need_a = 0.0, need_b = 0.0;
  for (int corner = 0; corner < 4; ++corner) {
    const Eigen::Vector2d p(patch.origin_x_mm + (corner & 1 ? patch.size_x_mm : 0.0),
                            patch.origin_y_mm + (corner & 2 ? patch.size_y_mm : 0.0));
    need_a = std::max(need_a, (p - centre_a).norm());
    need_b = std::max(need_b, (p - centre_b).norm());
  }
  need_a += cutter.radius_mm();
  need_b += cutter.radius_mm();
  const double half_turns = std::ceil(std::max(need_a, need_b) / b) + 1.0;
  if (half_turns > 1e7) {
    throw InputError("path.stepover " + format_number(s) +
                     " mm: the spiral would need more half turns than a path may hold");
  }
  // Outward, counter-clockwise, in the frame where u is +x: half turn n is about B (odd n,
  // from angle pi to 2 pi: the half below the joint line) or A (even n, 0 to pi: above it).
  const bool cw_spindle = cut.spindle == SpindleDirection::Cw;
  const bool ccw_travel = spec.outward ? (spec.climb == cw_spindle) : (spec.climb != cw_spindle);
  const bool build_ccw = spec.outward ? ccw_travel : !ccw_travel;  // reversal flips the sense
  // A cw build runs each semicircle through the other half: the mirror image across the line.
  std::vector<HalfTurn> turns;
  bool reached_a = false, reached_b = false;
  for (int n = 1; !(reached_a && reached_b); ++n) {
    const bool odd = n % 2 == 1;
    const Eigen::Vector2d c = odd ? centre_b : centre_a;
    const double r = n * b;
    const Eigen::Vector2d start = odd ? Eigen::Vector2d(c - r * u) : Eigen::Vector2d(c + r * u);
    const Eigen::Vector2d end = odd ? Eigen::Vector2d(c + r * u) : Eigen::Vector2d(c - r * u);
    turns.push_back({start, end, c});
    (odd ? reached_b : reached_a) = r >= (odd ? need_b : need_a);
  }
  PathBuilder builder(cut, patch, "path.stepover");
  if (spec.outward) {
    builder.go_to(turns.front().start, true);
    for (const HalfTurn& t : turns) builder.arc_to(t.end, t.centre, build_ccw);
  } else {
    builder.go_to(turns.back().end, true);
    for (auto it = turns.rbegin(); it != turns.rend(); ++it) {
      builder.arc_to(it->start, it->centre, !build_ccw);
    }
  }
  builder.retract();
  return builder.take();
}

}  // namespace cuspmap

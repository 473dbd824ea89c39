// Trochoidal loops along raster lanes (see trochoidal_path.h). Inputs mm, deg; output lines and
// full-circle arcs. Cost O(lanes x loops).
// Method: circle + linear advance per loop (Otkur & Lazoglu 2007), lanes as DESIGN.md's raster.
#include "path/trochoidal_path.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <numbers>

#include "core/input_error.h"
#include "core/units.h"
#include "path/check_length.h"
#include "path/path_builder.h"

namespace cuspmap {
namespace {

// The defaults of path_spec.h: loop diameter D/2, advance D/10 (common practice, no source).
constexpr double kDefaultLoopDiameterPerD = 0.5;
constexpr double kDefaultAdvancePerD = 0.1;

}  // namespace

Toolpath trochoidal_path(const PathSpec& spec, const CutSpec& cut, const Patch& patch,
                         const Cutter& cutter) {
  check_length_mm(spec.stepover_mm, "path.stepover", false);
  check_length_mm(spec.loop_diameter_mm, "path.loop_diameter", true);
  check_length_mm(spec.advance_mm, "path.advance", true);
  const double d = cutter.diameter_mm, r_tool = cutter.radius_mm();
  const double rho = 0.5 * (spec.loop_diameter_mm > 0.0 ? spec.loop_diameter_mm
                                                         : kDefaultLoopDiameterPerD * d);
  const double advance = spec.advance_mm > 0.0 ? spec.advance_mm : kDefaultAdvancePerD * d;
  const double s = spec.stepover_mm;
  if (s > 2.0 * (r_tool + rho)) {
    throw InputError("path.stepover " + format_number(s) +
                     " mm: trochoidal lanes further apart than their swept width 2 (R + loop "
                     "radius) = " + format_number(2.0 * (r_tool + rho)) +
                     " mm leave uncut strips");
  }
  const double angle = spec.angle_deg * std::numbers::pi / 180.0;
  const Eigen::Vector2d u(std::cos(angle), std::sin(angle)), v(-u.y(), u.x());
  double u_min = std::numeric_limits<double>::infinity(), u_max = -u_min;
  double v_min = u_min, v_max = -u_min;
  for (int corner = 0; corner < 4; ++corner) {
    const Eigen::Vector2d p(patch.origin_x_mm + (corner & 1 ? patch.size_x_mm : 0.0),
                            patch.origin_y_mm + (corner & 2 ? patch.size_y_mm : 0.0));
    u_min = std::min(u_min, p.dot(u));
    u_max = std::max(u_max, p.dot(u));
    v_min = std::min(v_min, p.dot(v));
    v_max = std::max(v_max, p.dot(v));
  }
  const double lanes = std::ceil((v_max - v_min) / s) + 1.0;
  const double u_first = u_min - (r_tool + rho), u_last = u_max + r_tool + rho;
  const double loops = std::ceil((u_last - u_first) / advance) + 1.0;
  if (lanes * loops > 1e7) {
    throw InputError("path.advance " + format_number(advance) + " mm and path.stepover " +
                     format_number(s) + " mm: the path would need about " +
                     format_number(2.0 * lanes * loops) + " moves; use larger values");
  }
  const bool cw_spindle = cut.spindle == SpindleDirection::Cw;
  const bool ccw = spec.climb == cw_spindle;
  const int n_lanes = static_cast<int>(lanes), n_loops = static_cast<int>(loops);
  PathBuilder builder(cut, patch, "path.advance");
  for (int k = 0; k < n_lanes; ++k) {
    const bool reverse = spec.direction == RasterDirection::Zigzag && k % 2 == 1;
    const Eigen::Vector2d t = reverse ? Eigen::Vector2d(-u) : u;  // travel direction
    // Start point on the side where a ccw (cw) circle moves along t: t's right (left).
    const Eigen::Vector2d side = ccw ? Eigen::Vector2d(t.y(), -t.x()) : Eigen::Vector2d(-t.y(), t.x());
    const double lane_v = v_min + k * s;
    for (int j = 0; j < n_loops; ++j) {
      const double along = u_first + (reverse ? n_loops - 1 - j : j) * advance;
      const Eigen::Vector2d centre = along * u + lane_v * v;
      const Eigen::Vector2d start = centre + rho * side;
      if (j == 0) {
        builder.go_to(start, spec.direction == RasterDirection::Zigzag);
      } else {
        builder.line_to(start);
      }
      builder.arc_to(start, centre, ccw);
    }
  }
  builder.retract();
  return builder.take();
}

}  // namespace cuspmap

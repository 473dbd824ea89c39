// Raster finishing path: passes k * stepover apart across the patch, rotated about its centre,
// each long enough that the cutter is clear of the patch at both ends; one-way or zigzag links.
// Inputs: PathSpec, CutSpec, Patch, Cutter (mm, deg, mm/min); output: Toolpath of lines.
// Method: DESIGN.md raster contract; pass ends from the patch clipped to a slab around the pass
// (Sutherland & Hodgman, Reentrant polygon clipping, CACM 1974).
#include "path/raster.h"

#include <algorithm>
#include <array>
#include <cassert>
#include <cmath>
#include <cstddef>
#include <limits>
#include <numbers>
#include <vector>

namespace cuspmap {
namespace {

// Relative slack on size / stepover so that 10 mm / 0.25 mm is exactly 40 steps, not 41
// (same rule as core/heightfield grid_dimensions).
constexpr double kCountSlack = 1e-9;

// A point in the pass frame: along the passes (d) and across them (n), from the patch centre.
struct FramePoint {
  double d = 0.0;
  double n = 0.0;
};

// Extent along d of the patch rectangle clipped to lo <= n <= hi; false when the clip is empty.
bool clipped_extent(const std::array<FramePoint, 4>& rect, double lo, double hi, double& d_min,
                    double& d_max) {
  std::vector<FramePoint> poly(rect.begin(), rect.end());
  auto clip = [&poly](double bound, double side) {  // keep side * (n - bound) >= 0
    std::vector<FramePoint> out;
    const std::size_t m = poly.size();
    for (std::size_t i = 0; i < m; ++i) {
      const FramePoint a = poly[i], b = poly[(i + 1) % m];
      const double fa = side * (a.n - bound), fb = side * (b.n - bound);
      if (fa >= 0.0) out.push_back(a);
      if ((fa >= 0.0) != (fb >= 0.0)) {
        const double t = fa / (fa - fb);
        out.push_back({a.d + t * (b.d - a.d), a.n + t * (b.n - a.n)});
      }
    }
    poly = std::move(out);
  };
  clip(lo, 1.0);
  clip(hi, -1.0);
  if (poly.empty()) return false;
  d_min = std::numeric_limits<double>::infinity();
  d_max = -d_min;
  for (const FramePoint& p : poly) {
    d_min = std::min(d_min, p.d);
    d_max = std::max(d_max, p.d);
  }
  return true;
}

Move line_move(const Eigen::Vector3d& from, const Eigen::Vector3d& to, double feed, bool rapid) {
  Move m;
  m.kind = MoveKind::Line;
  m.start_mm = from;
  m.end_mm = to;
  m.feed_mm_per_min = feed;
  m.rapid = rapid;
  return m;
}

}  // namespace

int raster_margin_passes(double stepover_mm, const Cutter& cutter) {
  assert(stepover_mm > 0.0 && "raster needs a stepover");
  // An untilted cutter without runout whose end rises from its axis (ball, bull-nose, undished
  // flat) cuts each cell lowest from the nearest pass: passes beyond the patch change nothing.
  const bool lowest_on_axis = cutter.tilt_deg == 0.0 && cutter.runout_mm == 0.0 &&
                              (cutter.shape == CutterShape::Ball || cutter.dish_deg == 0.0);
  if (lowest_on_axis) return 0;
  const double reach = cutter.radius_mm() + cutter.runout_mm;
  return static_cast<int>(std::ceil(reach / stepover_mm - kCountSlack));
}

Toolpath raster_path(const PathSpec& spec, const CutSpec& cut, const Patch& patch,
                     const Cutter& cutter, int margin_passes) {
  assert(margin_passes >= 0 && "a margin adds passes");
  assert(spec.kind == PathKind::Raster && spec.stepover_mm > 0.0 && "raster needs a stepover");
  const double step = spec.stepover_mm;
  // The cutter clears the patch when its axis is its reach away: R, plus the runout circle.
  const double reach = cutter.radius_mm() + cutter.runout_mm;
  const double angle = spec.angle_deg * std::numbers::pi / 180.0;
  const Eigen::Vector2d d(std::cos(angle), std::sin(angle));
  const Eigen::Vector2d n(-d.y(), d.x());
  const Eigen::Vector2d centre(patch.origin_x_mm + 0.5 * patch.size_x_mm,
                               patch.origin_y_mm + 0.5 * patch.size_y_mm);
  std::array<FramePoint, 4> rect;
  const double hx = 0.5 * patch.size_x_mm, hy = 0.5 * patch.size_y_mm;
  const std::array<Eigen::Vector2d, 4> corners = {
      Eigen::Vector2d(-hx, -hy), {hx, -hy}, {hx, hy}, {-hx, hy}};
  for (int c = 0; c < 4; ++c) rect[c] = {corners[c].dot(d), corners[c].dot(n)};

  // At angle 0 pass k lies at y = origin_y + k step, i.e. n-offset k step - size_y / 2 from the
  // centre; the rotated pattern keeps those offsets and covers the patch's extent along n.
  const double offset0 = -hy;
  const double half_n =
      0.5 * (patch.size_x_mm * std::abs(n.x()) + patch.size_y_mm * std::abs(n.y()));
  const long k_first =
      static_cast<long>(std::floor((-half_n - offset0) / step + kCountSlack)) - margin_passes;
  const long k_last =
      static_cast<long>(std::ceil((half_n - offset0) / step - kCountSlack)) + margin_passes;

  // Pass ends along d: the patch within max(reach, step) of the pass, plus the reach, so every
  // patch point the cutter (or a zigzag link between two passes) can touch is behind the ends.
  const double slab = std::max(reach, step);
  double full_lo = 0.0, full_hi = 0.0;
  clipped_extent(rect, -1e300, 1e300, full_lo, full_hi);
  struct Pass {
    double offset, lo, hi;
  };
  std::vector<Pass> passes;
  for (long k = k_first; k <= k_last; ++k) {
    Pass p{offset0 + static_cast<double>(k) * step, full_lo, full_hi};
    if (!clipped_extent(rect, p.offset - slab, p.offset + slab, p.lo, p.hi)) {
      p.lo = full_lo;
      p.hi = full_hi;
    }
    p.lo -= reach;
    p.hi += reach;
    passes.push_back(p);
  }
  const bool zigzag = spec.direction == RasterDirection::Zigzag;
  if (zigzag) {
    // Both ends of a side link at the outer of the two pass ends, so the link stays clear.
    // Pairs follow the program's own passes (margin passes continue the alternation outward).
    const std::size_t shift = static_cast<std::size_t>(margin_passes) % 2;
    for (std::size_t k = 0; k + 1 < passes.size(); ++k) {
      if ((k + shift) % 2 == 0) {
        passes[k].hi = passes[k + 1].hi = std::max(passes[k].hi, passes[k + 1].hi);
      } else {
        passes[k].lo = passes[k + 1].lo = std::min(passes[k].lo, passes[k + 1].lo);
      }
    }
  }

  const double z_cut = patch.floor_z_mm + cut.depth_mm;
  const double z_clear = patch.floor_z_mm + cut.retract_mm;
  auto at = [&](double offset, double along, double z) {
    const Eigen::Vector2d xy = centre + offset * n + along * d;
    return Eigen::Vector3d(xy.x(), xy.y(), z);
  };
  Toolpath path;
  const std::size_t margin = static_cast<std::size_t>(margin_passes);
  for (std::size_t k = 0; k < passes.size(); ++k) {
    const Pass& p = passes[k];
    const bool forward = !zigzag || (k + margin) % 2 == 0;
    const Eigen::Vector3d start = at(p.offset, forward ? p.lo : p.hi, z_cut);
    const Eigen::Vector3d end = at(p.offset, forward ? p.hi : p.lo, z_cut);
    if (k > 0) {
      const Eigen::Vector3d prev_end = path.moves.back().end_mm;
      if (zigzag) {
        path.moves.push_back(line_move(prev_end, start, cut.feed_mm_per_min, false));
      } else {
        const Eigen::Vector3d up(prev_end.x(), prev_end.y(), z_clear);
        const Eigen::Vector3d over(start.x(), start.y(), z_clear);
        path.moves.push_back(line_move(prev_end, up, cut.rapid_mm_per_min, true));
        path.moves.push_back(line_move(up, over, cut.rapid_mm_per_min, true));
        path.moves.push_back(line_move(over, start, cut.rapid_mm_per_min, true));
      }
    }
    path.moves.push_back(line_move(start, end, cut.feed_mm_per_min, false));
  }
  return path;
}

}  // namespace cuspmap

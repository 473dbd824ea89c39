// Offset finishing path: rings from path/offset_rings.h, ordered depth first, oriented for climb
// or conventional cutting, and linked (see offset_path.h). Cost O(loops^2 + link x region).
// Method: Clipper 6.4 offsets (offset_rings.h); up/down milling geometry (Altintas 2012, ch. 2).
#include "path/offset_path.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <vector>

#include "core/input_error.h"
#include "core/units.h"
#include "path/check_length.h"
#include "path/offset_rings.h"
#include "path/path_builder.h"
#include "path/path_limits.h"
#include "path/point_in_polygon.h"

namespace cuspmap {
namespace {

using Polygon = std::vector<Eigen::Vector2d>;

double cross(const Eigen::Vector2d& a, const Eigen::Vector2d& b) { return a.x() * b.y() - a.y() * b.x(); }

// True when segments ab and cd cross at a point interior to both.
bool crosses(const Eigen::Vector2d& a, const Eigen::Vector2d& b, const Eigen::Vector2d& c,
             const Eigen::Vector2d& d) {
  const double d1 = cross(b - a, c - a), d2 = cross(b - a, d - a);
  const double d3 = cross(d - c, a - c), d4 = cross(d - c, b - c);
  return ((d1 > 0 && d2 < 0) || (d1 < 0 && d2 > 0)) && ((d3 > 0 && d4 < 0) || (d3 < 0 && d4 > 0));
}

// A straight link from a to b keeps the tool inside the boundary when it stays in the region
// of allowed tool centres: it crosses no edge of it and its midpoint lies inside.
bool link_inside(const Eigen::Vector2d& a, const Eigen::Vector2d& b, const std::vector<Polygon>& region) {
  bool mid_inside = false;
  const Eigen::Vector2d mid = 0.5 * (a + b);
  for (const Polygon& p : region) {
    for (std::size_t i = 0; i < p.size(); ++i) {
      if (crosses(a, b, p[i], p[(i + 1) % p.size()])) return false;
    }
    mid_inside = mid_inside || point_in_polygon(mid, p);
  }
  return mid_inside;
}

// The loop's elements running clockwise (want_cw) or counter-clockwise, starting at the element
// start nearest to `here`.
std::vector<LoopElement> arranged(const OffsetLoop& loop, bool want_cw, const Eigen::Vector2d& here) {
  std::vector<LoopElement> e = loop.elements;
  if ((polygon_signed_area_mm2(loop.polygon_mm) < 0.0) != want_cw) {
    std::reverse(e.begin(), e.end());
    for (LoopElement& x : e) {
      std::swap(x.start_mm, x.end_mm);
      x.ccw = !x.ccw;
    }
  }
  std::size_t best = 0;
  for (std::size_t i = 1; i < e.size(); ++i) {
    if ((e[i].start_mm - here).squaredNorm() < (e[best].start_mm - here).squaredNorm()) best = i;
  }
  std::rotate(e.begin(), e.begin() + static_cast<std::ptrdiff_t>(best), e.end());
  return e;
}

double distance_to_loop(const OffsetLoop& loop, const Eigen::Vector2d& here) {
  double best = std::numeric_limits<double>::infinity();
  for (const LoopElement& e : loop.elements) best = std::min(best, (e.start_mm - here).norm());
  return best;
}

// Depth-first cutting of the ring tree.
class RingWalker {
 public:
  RingWalker(const OffsetRings& rings, bool want_cw, PathBuilder& builder)
      : rings_(rings), want_cw_(want_cw), builder_(builder), children_(rings.loops.size() + 1),
        done_(rings.loops.size(), false) {
    const std::vector<OffsetLoop>& loops = rings.loops;
    const std::size_t root = loops.size();  // virtual root holding the level-0 rings
    for (std::size_t i = 0; i < loops.size(); ++i) {
      std::size_t parent = root;
      int parent_level = -1;
      if (loops[i].level != 0) {
        for (std::size_t j = 0; j < loops.size(); ++j) {
          const int lj = loops[j].level;
          const bool candidate = loops[i].level > 0 ? lj == loops[i].level - 1 : lj > parent_level;
          if (candidate && point_in_polygon(loops[i].polygon_mm.front(), loops[j].polygon_mm)) {
            parent = j;
            parent_level = lj;
            if (loops[i].level > 0) break;
          }
        }
      }
      children_[parent].push_back(i);
    }
  }

  void run(const Eigen::Vector2d& start_near) {
    here_ = start_near;
    visit_children(rings_.loops.size());
  }

 private:
  void visit_children(std::size_t node) {
    for (;;) {
      std::size_t next = 0;
      double best = std::numeric_limits<double>::infinity();
      for (std::size_t c : children_[node]) {
        // A ring's centre passes are its detours (cut()); only a stray one under the root is
        // cut here.
        if (done_[c] || (rings_.loops[c].level < 0 && node != rings_.loops.size())) continue;
        const double d = distance_to_loop(rings_.loops[c], here_);
        if (d < best) {
          best = d;
          next = c;
        }
      }
      if (best == std::numeric_limits<double>::infinity()) return;
      cut(next);
      visit_children(next);
    }
  }

  void cut(std::size_t i) {
    done_[i] = true;
    const std::vector<LoopElement> e = arranged(rings_.loops[i], want_cw_, here_);
    // The centre passes inside this ring (and outside its inner rings) are cut as detours from
    // the ring's vertex nearest to each, out and back, instead of after the inner rings.
    std::vector<std::vector<std::size_t>> detours(e.size());
    if (rings_.loops[i].level >= 0) {
      for (std::size_t c : children_[i]) {
        if (rings_.loops[c].level >= 0) continue;
        const Eigen::Vector2d at = rings_.loops[c].polygon_mm.front();
        std::size_t best = 0;
        for (std::size_t k = 1; k < e.size(); ++k) {
          if ((e[k].start_mm - at).squaredNorm() < (e[best].start_mm - at).squaredNorm()) best = k;
        }
        detours[best].push_back(c);
      }
    }
    const Eigen::Vector2d start = e.front().start_mm;
    builder_.go_to(start, builder_.empty() || link_inside(here_, start, rings_.region_mm));
    here_ = start;
    for (std::size_t k = 0; k < e.size(); ++k) {
      for (std::size_t c : detours[k]) {
        cut(c);
        builder_.go_to(e[k].start_mm, link_inside(here_, e[k].start_mm, rings_.region_mm));
        here_ = e[k].start_mm;
      }
      const LoopElement& x = e[k];
      if (x.arc) {
        builder_.arc_to(x.end_mm, x.centre_mm, x.ccw);
      } else {
        builder_.line_to(x.end_mm);
      }
    }
    here_ = builder_.position_mm();
  }

  const OffsetRings& rings_;
  bool want_cw_;
  PathBuilder& builder_;
  std::vector<std::vector<std::size_t>> children_;
  std::vector<bool> done_;
  Eigen::Vector2d here_{0, 0};
};

}  // namespace

Toolpath offset_path(const PathSpec& spec, const CutSpec& cut, const Patch& patch,
                     const Cutter& cutter, std::vector<Polygon>* wall_region_mm) {
  check_length_mm(spec.stepover_mm, "path.stepover", false);
  const double s = spec.stepover_mm;
  Polygon boundary = spec.boundary_mm;
  if (boundary.empty()) {
    const double x0 = patch.origin_x_mm, y0 = patch.origin_y_mm;
    const double x1 = x0 + patch.size_x_mm, y1 = y0 + patch.size_y_mm;
    boundary = {{x0, y0}, {x1, y0}, {x1, y1}, {x0, y1}};
  } else {
    for (const Eigen::Vector2d& p : boundary) {
      if (!std::isfinite(p.x()) || !std::isfinite(p.y())) throw InputError("path.boundary: every point must be a finite [x, y] in mm");
    }
    if (boundary.size() < 3 || std::abs(polygon_signed_area_mm2(boundary)) == 0.0) {
      throw InputError("path.boundary: needs at least 3 points [x, y] enclosing an area");
    }
  }
  const bool wall = spec.edge == OffsetEdge::Wall;
  const OffsetRings rings = offset_rings(boundary, wall ? cutter.radius_mm() : 0.0, s, kMaxPathMoves);
  if (rings.loops.empty()) {
    throw InputError(std::string(spec.boundary_mm.empty() ? "patch.size" : "path.boundary") +
                     ": the region is narrower than the cutter (D " +
                     format_number(cutter.diameter_mm) + " mm) everywhere; no offset pass fits");
  }
  const bool want_cw = spec.climb == (cut.spindle == SpindleDirection::Cw);
  PathBuilder builder(cut, patch, "path.stepover");
  RingWalker(rings, want_cw, builder).run(boundary.front());
  builder.retract();
  if (wall_region_mm != nullptr && wall) *wall_region_mm = rings.region_mm;
  return builder.take();
}

}  // namespace cuspmap

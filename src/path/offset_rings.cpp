// Rings of a polygon by repeated offsetting from the boundary, with round corners rebuilt as
// exact arcs, and centre passes over what the rings leave farther than s/2 (see offset_rings.h).
// Cost O(rings x boundary vertices x log) + O(ring vertices x reflex vertices) for arc rebuild.
// Method: Clipper 6.4 ClipperOffset (jtRound, etClosedPolygon / etClosedLine) and Clipper
// difference; Vatti, "A generic solution to polygon clipping", Comm. ACM 35(7), 1992.
#include "path/offset_rings.h"

#include <clipper.hpp>

#include <algorithm>
#include <cmath>
#include <string>

#include "core/input_error.h"
#include "core/units.h"

namespace cuspmap {
namespace {

using ClipperLib::IntPoint;
using ClipperLib::Path;
using ClipperLib::Paths;

IntPoint to_int(const Eigen::Vector2d& p) {
  return IntPoint(std::llround(p.x() * kClipperUnitsPerMm), std::llround(p.y() * kClipperUnitsPerMm));
}
Eigen::Vector2d to_mm(const IntPoint& p) {
  return {static_cast<double>(p.X) / kClipperUnitsPerMm, static_cast<double>(p.Y) / kClipperUnitsPerMm};
}

// Drops polygons thinner than kMinSliverMm (2 area / perimeter).
Paths without_slivers(const Paths& in) {
  Paths out;
  for (const Path& p : in) {
    if (p.size() < 3) continue;
    double perimeter = 0.0;
    for (std::size_t i = 0; i < p.size(); ++i) perimeter += (to_mm(p[(i + 1) % p.size()]) - to_mm(p[i])).norm();
    const double area = std::abs(ClipperLib::Area(p)) / (kClipperUnitsPerMm * kClipperUnitsPerMm);
    if (perimeter > 0.0 && 2.0 * area / perimeter >= kMinSliverMm) out.push_back(p);
  }
  return out;
}

Paths offset_inward(const Path& boundary, double d_mm) {
  ClipperLib::ClipperOffset co(2.0, kOffsetArcToleranceMm * kClipperUnitsPerMm);
  co.AddPath(boundary, ClipperLib::jtRound, ClipperLib::etClosedPolygon);
  Paths out;
  co.Execute(out, -d_mm * kClipperUnitsPerMm);
  return without_slivers(out);
}

// One polygon of Clipper's output as loop elements: runs of vertices on the circle of radius d
// about one reflex boundary vertex become one arc; everything else stays lines.
std::vector<LoopElement> rebuild_arcs(const std::vector<Eigen::Vector2d>& pts, double d_mm,
                                      const std::vector<Eigen::Vector2d>& reflex) {
  const std::size_t n = pts.size();
  std::vector<int> owner(n, -1);
  int hint = -1;
  for (std::size_t i = 0; i < n; ++i) {
    auto on = [&](int r) { return std::abs((pts[i] - reflex[r]).norm() - d_mm) <= kArcSnapMm; };
    if (hint >= 0 && on(hint)) {
      owner[i] = hint;
      continue;
    }
    for (int r = 0; r < static_cast<int>(reflex.size()); ++r) {
      if (on(r)) {
        owner[i] = hint = r;
        break;
      }
    }
  }
  // Start where a run begins, so no run wraps around the end of the vertex list.
  std::size_t first = 0;
  while (first < n && owner[first] >= 0 && owner[first] == owner[(first + n - 1) % n]) ++first;
  if (first == n) first = 0;  // one owner throughout (not produced by a polygon's offset)
  struct Node {
    Eigen::Vector2d entry, exit;
    int owner;
    double sweep;
  };
  std::vector<Node> nodes;
  for (std::size_t k = 0; k < n;) {
    const std::size_t i = (first + k) % n;
    std::size_t m = 1;
    if (owner[i] >= 0) {
      while (m < n && owner[(i + m) % n] == owner[i]) ++m;
    }
    if (m >= 2) {
      const Eigen::Vector2d c = reflex[owner[i]];
      double sweep = 0.0;
      for (std::size_t j = 0; j + 1 < m; ++j) {
        const Eigen::Vector2d a = pts[(i + j) % n] - c, b = pts[(i + j + 1) % n] - c;
        sweep += std::atan2(a.x() * b.y() - a.y() * b.x(), a.dot(b));
      }
      auto snap = [&](const Eigen::Vector2d& p) { return Eigen::Vector2d(c + d_mm * (p - c).normalized()); };
      nodes.push_back({snap(pts[i]), snap(pts[(i + m - 1) % n]), owner[i], sweep});
    } else {
      nodes.push_back({pts[i], pts[i], -1, 0.0});
    }
    k += m;
  }
  std::vector<LoopElement> elements;
  for (std::size_t j = 0; j < nodes.size(); ++j) {
    const Node& a = nodes[j];
    if (a.owner >= 0) {
      LoopElement arc;
      arc.arc = true;
      arc.start_mm = a.entry;
      arc.end_mm = a.exit;
      arc.centre_mm = reflex[a.owner];
      arc.ccw = a.sweep > 0.0;
      elements.push_back(arc);
    }
    const Node& b = nodes[(j + 1) % nodes.size()];
    if ((b.entry - a.exit).norm() > 0.0) {
      LoopElement line;
      line.start_mm = a.exit;
      line.end_mm = b.entry;
      elements.push_back(line);
    }
  }
  return elements;
}

// The spine of a region: its inward offset by the largest distance that leaves anything (found
// by bisection to kOffsetArcToleranceMm), a thin loop about the region's medial axis.
Paths spine(const Path& region) {
  double lo = 0.0, hi = 0.0;
  for (const IntPoint& q : region) {
    const Eigen::Vector2d v = to_mm(q) - to_mm(region.front());
    hi = std::max(hi, v.norm());
  }
  Paths best{region};
  ClipperLib::ClipperOffset co(2.0, kOffsetArcToleranceMm * kClipperUnitsPerMm);
  co.AddPath(region, ClipperLib::jtRound, ClipperLib::etClosedPolygon);
  while (hi - lo > kOffsetArcToleranceMm) {
    const double mid = 0.5 * (lo + hi);
    Paths shrunk;
    co.Execute(shrunk, -mid * kClipperUnitsPerMm);
    if (shrunk.empty()) {
      hi = mid;
    } else {
      lo = mid;
      best = std::move(shrunk);
    }
  }
  return best;
}

// Centre passes over uncovered regions: each region's spine, then the spines of whatever of it
// still lies farther than s/2 from that spine (a region whose lobes vanish at different depths),
// up to kMaxSpineRounds; what remains after that is cut along its outline.
Paths centre_passes(const Paths& uncovered, double stepover_mm) {
  // Rounds of spines per region: each round covers at least the fattest lobe left, and offset
  // pockets leave regions of one to three lobes (corner wedges, centres, necks).
  constexpr int kMaxSpineRounds = 8;
  Paths passes, todo = uncovered;
  for (int round = 0; round < kMaxSpineRounds && !todo.empty(); ++round) {
    Paths next;
    for (const Path& region : todo) {
      const Paths s = spine(region);
      passes.insert(passes.end(), s.begin(), s.end());
      ClipperLib::ClipperOffset band(2.0, kOffsetArcToleranceMm * kClipperUnitsPerMm);
      band.AddPaths(s, ClipperLib::jtRound, ClipperLib::etClosedLine);
      Paths covered;
      band.Execute(covered, 0.5 * stepover_mm * kClipperUnitsPerMm);
      ClipperLib::Clipper clip;
      clip.AddPath(region, ClipperLib::ptSubject, true);
      clip.AddPaths(covered, ClipperLib::ptClip, true);
      Paths left;
      clip.Execute(ClipperLib::ctDifference, left, ClipperLib::pftNonZero, ClipperLib::pftNonZero);
      for (const Path& p : without_slivers(left)) next.push_back(p);
    }
    todo = std::move(next);
  }
  passes.insert(passes.end(), todo.begin(), todo.end());
  return passes;
}

std::vector<Eigen::Vector2d> polygon_mm(const Path& p) {
  std::vector<Eigen::Vector2d> out;
  out.reserve(p.size());
  for (const IntPoint& q : p) out.push_back(to_mm(q));
  return out;
}

}  // namespace

OffsetRings offset_rings(const std::vector<Eigen::Vector2d>& boundary_mm, double first_mm,
                         double stepover_mm, std::size_t max_elements) {
  Path boundary;
  for (const Eigen::Vector2d& p : boundary_mm) boundary.push_back(to_int(p));
  if (!ClipperLib::Orientation(boundary)) ClipperLib::ReversePath(boundary);  // ccw
  // Reflex vertices of the ccw boundary turn clockwise; their offsets are round corners.
  std::vector<Eigen::Vector2d> reflex;
  const std::size_t nb = boundary.size();
  for (std::size_t i = 0; i < nb; ++i) {
    const Eigen::Vector2d a = to_mm(boundary[(i + nb - 1) % nb]), b = to_mm(boundary[i]),
                          c = to_mm(boundary[(i + 1) % nb]);
    const Eigen::Vector2d e0 = b - a, e1 = c - b;
    if (e0.x() * e1.y() - e0.y() * e1.x() < 0.0) reflex.push_back(b);
  }
  OffsetRings out;
  Paths all_rings;
  std::size_t elements = 0;
  for (int k = 0;; ++k) {
    const double d = first_mm + k * stepover_mm;
    const Paths rings = offset_inward(boundary, d);
    if (rings.empty()) break;
    if (k == 0) {
      for (const Path& p : rings) out.region_mm.push_back(polygon_mm(p));
    }
    for (const Path& p : rings) {
      OffsetLoop loop;
      loop.polygon_mm = polygon_mm(p);
      loop.elements = rebuild_arcs(loop.polygon_mm, d, reflex);
      loop.level = k;
      elements += loop.elements.size();
      if (elements > max_elements) {
        throw InputError("path.stepover " + format_number(stepover_mm) +
                         " mm: the offset rings would need more than " +
                         std::to_string(max_elements) + " moves; use a larger stepover");
      }
      out.loops.push_back(std::move(loop));
      all_rings.push_back(p);
    }
  }
  if (out.loops.empty()) return out;
  // Uncovered: tool-centre region minus every ring's band of half-width s/2.
  ClipperLib::ClipperOffset bands_offset(2.0, kOffsetArcToleranceMm * kClipperUnitsPerMm);
  bands_offset.AddPaths(all_rings, ClipperLib::jtRound, ClipperLib::etClosedLine);
  Paths bands;
  bands_offset.Execute(bands, 0.5 * stepover_mm * kClipperUnitsPerMm);
  Paths region;
  for (const OffsetLoop& loop : out.loops) {
    if (loop.level == 0) region.push_back(all_rings[&loop - out.loops.data()]);
  }
  ClipperLib::Clipper clip;
  clip.AddPaths(region, ClipperLib::ptSubject, true);
  clip.AddPaths(bands, ClipperLib::ptClip, true);
  Paths uncovered;
  clip.Execute(ClipperLib::ctDifference, uncovered, ClipperLib::pftNonZero, ClipperLib::pftNonZero);
  // Each uncovered piece is cut along its spine (see centre_passes): tracing its outline instead
  // would put the pass on the very line that is s/2 from the rings and wander round every
  // corner wedge.
  for (const Path& p : centre_passes(without_slivers(uncovered), stepover_mm)) {
    OffsetLoop loop;
    loop.polygon_mm = polygon_mm(p);
    loop.level = -1;
    for (std::size_t i = 0; i < loop.polygon_mm.size(); ++i) {
      LoopElement line;
      line.start_mm = loop.polygon_mm[i];
      line.end_mm = loop.polygon_mm[(i + 1) % loop.polygon_mm.size()];
      loop.elements.push_back(line);
    }
    elements += loop.elements.size();
    if (elements > max_elements) {
      throw InputError("path.stepover " + format_number(stepover_mm) +
                       " mm: the offset rings would need more than " +
                       std::to_string(max_elements) + " moves; use a larger stepover");
    }
    out.loops.push_back(std::move(loop));
  }
  return out;
}

}  // namespace cuspmap

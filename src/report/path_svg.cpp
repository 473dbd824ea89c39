// Plan-view SVG of a toolpath over the floor outline (solid cutting moves, dashed moves above the
// floor, exact arcs). O(moves). Method: SVG 1.1 path data (M, L, A commands).
#include "report/path_svg.h"

#include <algorithm>
#include <charconv>
#include <cmath>
#include <limits>
#include <numbers>

namespace cuspmap {
namespace {

// Moves whose tip stays within this height of the floor are drawn as cutting moves: 1 um, far
// below any retract and far above rounding of programmed Z values.
constexpr double kOnFloorMm = 0.001;
// Longest side of the drawing, px (the viewBox keeps mm).
constexpr double kSidePx = 800.0;

std::string num(double v) {
  char buf[64];
  const auto r = std::to_chars(buf, buf + sizeof buf, v, std::chars_format::general, 9);
  return std::string(buf, r.ptr);
}

// Appends every part (strings or literals) to out.
template <typename... Parts>
void put(std::string& out, const Parts&... parts) {
  (out.append(parts), ...);
}

// SVG Y runs down; the drawing flips it so +Y is up.
std::string point(const Eigen::Vector3d& p) {
  std::string s;
  put(s, num(p.x()), " ", num(-p.y()));
  return s;
}

}  // namespace

std::string encode_path_svg(const Toolpath& path, const Patch& patch,
                            const std::vector<Eigen::Vector2d>& boundary_mm, double floor_z_mm) {
  double x0 = patch.origin_x_mm, y0 = patch.origin_y_mm;
  double x1 = x0 + patch.size_x_mm, y1 = y0 + patch.size_y_mm;
  auto grow = [&](double x, double y) {
    x0 = std::min(x0, x);
    x1 = std::max(x1, x);
    y0 = std::min(y0, y);
    y1 = std::max(y1, y);
  };
  for (const Eigen::Vector2d& p : boundary_mm) grow(p.x(), p.y());
  for (const Move& m : path.moves) {
    grow(m.start_mm.x(), m.start_mm.y());
    grow(m.end_mm.x(), m.end_mm.y());
    if (m.kind == MoveKind::Arc) {
      const double r = arc_radius_mm(m);
      grow(m.centre_mm.x() - r, m.centre_mm.y() - r);
      grow(m.centre_mm.x() + r, m.centre_mm.y() + r);
    }
  }
  const double w = std::max(x1 - x0, 1e-6), h = std::max(y1 - y0, 1e-6);
  const double margin = 0.03 * std::max(w, h);
  const double stroke = 0.002 * std::max(w, h);
  const double scale = kSidePx / std::max(w, h);
  const std::string sw = num(stroke);
  std::string svg;
  put(svg, "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"",
      num(std::round((w + 2 * margin) * scale)), "\" height=\"", num(std::round((h + 2 * margin) * scale)),
      "\" viewBox=\"", num(x0 - margin), " ", num(-y1 - margin), " ", num(w + 2 * margin), " ",
      num(h + 2 * margin), "\">\n");
  put(svg, "<title>toolpath in plan view (mm, +Y up): solid = cutting at the floor, dashed = above it; "
           "grey = the floor simulated",
      boundary_mm.empty() ? "" : ", blue = the offset boundary", "</title>\n");
  put(svg, "<rect x=\"", num(x0 - margin), "\" y=\"", num(-y1 - margin), "\" width=\"",
      num(w + 2 * margin), "\" height=\"", num(h + 2 * margin), "\" fill=\"white\"/>\n");
  put(svg, "<rect x=\"", num(patch.origin_x_mm), "\" y=\"", num(-(patch.origin_y_mm + patch.size_y_mm)),
      "\" width=\"", num(patch.size_x_mm), "\" height=\"", num(patch.size_y_mm),
      "\" fill=\"#eeeeee\" stroke=\"#888888\" stroke-width=\"", sw, "\"/>\n");
  if (!boundary_mm.empty()) {
    put(svg, "<polygon fill=\"none\" stroke=\"#1f5fa8\" stroke-width=\"", num(2 * stroke), "\" points=\"");
    for (const Eigen::Vector2d& p : boundary_mm) put(svg, num(p.x()), ",", num(-p.y()), " ");
    put(svg, "\"/>\n");
  }
  // Consecutive moves of one kind (cutting or above the floor) share one path element.
  std::string cutting, above;
  Eigen::Vector3d last_cut(std::nan(""), 0, 0), last_above(std::nan(""), 0, 0);
  for (const Move& m : path.moves) {
    const bool on_floor = std::max(m.start_mm.z(), m.end_mm.z()) <= floor_z_mm + kOnFloorMm;
    std::string& d = on_floor ? cutting : above;
    Eigen::Vector3d& last = on_floor ? last_cut : last_above;
    if (!(last.head<2>() == m.start_mm.head<2>())) put(d, "M", point(m.start_mm));
    if (m.kind == MoveKind::Arc) {
      const double r = arc_radius_mm(m);
      const double sweep = arc_sweep_rad(m);
      // A full circle (or more) is drawn as two half arcs: one SVG arc cannot close on itself.
      const int halves = std::abs(sweep) >= 2.0 * std::numbers::pi - 1e-12 ? 2 : 1;
      for (int k = 1; k <= halves; ++k) {
        Eigen::Vector3d to = m.end_mm;
        if (halves == 2 && k == 1) to.head<2>() = 2.0 * m.centre_mm - m.start_mm.head<2>();
        const bool large = halves == 1 && std::abs(sweep) > std::numbers::pi;
        // Y is flipped, so a ccw arc in the part is clockwise on screen (SVG sweep-flag 0).
        put(d, "A", num(r), " ", num(r), " 0 ", large ? "1 " : "0 ", m.ccw ? "0 " : "1 ", point(to));
      }
    } else {
      put(d, "L", point(m.end_mm));
    }
    last = m.end_mm;
  }
  if (!above.empty()) {
    put(svg, "<path fill=\"none\" stroke=\"#c2491d\" stroke-width=\"", sw, "\" stroke-dasharray=\"",
        num(4 * stroke), " ", num(3 * stroke), "\" d=\"", above, "\"/>\n");
  }
  if (!cutting.empty()) {
    put(svg, "<path fill=\"none\" stroke=\"black\" stroke-width=\"", sw,
        "\" stroke-linejoin=\"round\" d=\"", cutting, "\"/>\n");
  }
  if (!path.moves.empty()) {
    const Eigen::Vector3d& s = path.moves.front().start_mm;
    put(svg, "<circle cx=\"", num(s.x()), "\" cy=\"", num(-s.y()), "\" r=\"", num(4 * stroke),
        "\" fill=\"#2e8b3a\"><title>start</title></circle>\n");
  }
  put(svg, "</svg>\n");
  return svg;
}

}  // namespace cuspmap

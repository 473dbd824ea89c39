// Point-in-polygon test and signed area of a closed polygon in the XY plane.
// Inputs mm; outputs a yes/no and mm^2. Cost O(vertices).
// Method: crossing-number test (W. R. Franklin, PNPOLY, 1970s/2006); shoelace formula.
#pragma once

#include <Eigen/Core>
#include <vector>

namespace cuspmap {

/// True when q lies inside the closed polygon (even-odd rule); points exactly on an edge may
/// fall either way.
/// @param[in] q_mm  point; @param[in] polygon_mm  vertices in order, closing edge implied
bool point_in_polygon(const Eigen::Vector2d& q_mm, const std::vector<Eigen::Vector2d>& polygon_mm);

/// Signed area, mm^2: positive when the vertices run counter-clockwise (seen from +Z).
double polygon_signed_area_mm2(const std::vector<Eigen::Vector2d>& polygon_mm);

}  // namespace cuspmap

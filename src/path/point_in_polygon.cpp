// Point-in-polygon (crossing number) and signed polygon area (see point_in_polygon.h).
// Inputs mm; outputs bool, mm^2. Cost O(vertices).
// Method: W. R. Franklin's PNPOLY crossing test; shoelace formula.
#include "path/point_in_polygon.h"

namespace cuspmap {

bool point_in_polygon(const Eigen::Vector2d& q, const std::vector<Eigen::Vector2d>& p) {
  bool in = false;
  for (std::size_t i = 0, j = p.size() - 1; i < p.size(); j = i++) {
    if ((p[i].y() > q.y()) != (p[j].y() > q.y()) &&
        q.x() < (p[j].x() - p[i].x()) * (q.y() - p[i].y()) / (p[j].y() - p[i].y()) + p[i].x()) {
      in = !in;
    }
  }
  return in;
}

double polygon_signed_area_mm2(const std::vector<Eigen::Vector2d>& p) {
  double twice = 0.0;
  for (std::size_t i = 0; i < p.size(); ++i) {
    const Eigen::Vector2d& a = p[i];
    const Eigen::Vector2d& b = p[(i + 1) % p.size()];
    twice += a.x() * b.y() - a.y() * b.x();
  }
  return 0.5 * twice;
}

}  // namespace cuspmap

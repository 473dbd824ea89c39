// Liang-Barsky clipping of a segment to an axis-aligned box (parameter interval of the inside).
// Method: Liang & Barsky, ACM Transactions on Graphics 3(1), 1984.
#include "core/clip_segment.h"

#include <algorithm>

namespace cuspmap {

bool clip_segment(double x0, double y0, double x1, double y1, double lo_x, double hi_x,
                  double lo_y, double hi_y, double& t0, double& t1) {
  const double dx = x1 - x0, dy = y1 - y0;
  const double p[4] = {-dx, dx, -dy, dy};
  const double q[4] = {x0 - lo_x, hi_x - x0, y0 - lo_y, hi_y - y0};
  t0 = 0.0;
  t1 = 1.0;
  for (int k = 0; k < 4; ++k) {
    if (p[k] == 0.0) {
      if (q[k] < 0.0) return false;  // parallel to this edge and outside it
      continue;
    }
    const double t = q[k] / p[k];
    if (p[k] < 0.0) {
      t0 = std::max(t0, t);
    } else {
      t1 = std::min(t1, t);
    }
    if (t0 > t1) return false;
  }
  return true;
}

}  // namespace cuspmap

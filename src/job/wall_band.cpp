// Wall band of a walled pocket: cells outside the tool-centre region set to NaN and summarised.
// Cost O(rows x edges + cells). Method: even-odd scanline fill at cell-centre rows.
#include "job/wall_band.h"

#include <algorithm>
#include <cmath>
#include <limits>

namespace cuspmap {

void split_wall_band(const std::vector<std::vector<Eigen::Vector2d>>& region_mm, Heightfield& hf,
                     WallBand& band) {
  if (region_mm.empty()) return;
  std::vector<double> xs;
  for (int j = 0; j < hf.ny; ++j) {
    const double y = hf.origin_y_mm + (j + 0.5) * hf.cell_mm;
    // Crossings of the row with every edge (half-open in y, so a vertex counts once).
    xs.clear();
    for (const auto& poly : region_mm) {
      for (std::size_t k = 0; k < poly.size(); ++k) {
        const Eigen::Vector2d& a = poly[k];
        const Eigen::Vector2d& b = poly[(k + 1) % poly.size()];
        if ((a.y() <= y) == (b.y() <= y)) continue;
        xs.push_back(a.x() + (y - a.y()) / (b.y() - a.y()) * (b.x() - a.x()));
      }
    }
    std::sort(xs.begin(), xs.end());
    std::size_t next = 0;  // crossings passed so far: odd = inside
    for (int i = 0; i < hf.nx; ++i) {
      const double x = hf.origin_x_mm + (i + 0.5) * hf.cell_mm;
      while (next < xs.size() && xs[next] <= x) ++next;
      if (next % 2 == 1) continue;
      float& z = hf.z_um(j, i);
      if (std::isfinite(z)) {
        band.highest_point_um = band.cells == 0 ? z : std::max<double>(band.highest_point_um, z);
        band.lowest_point_um = band.cells == 0 ? z : std::min<double>(band.lowest_point_um, z);
        ++band.cells;
      }
      z = std::numeric_limits<float>::quiet_NaN();
    }
  }
}

}  // namespace cuspmap

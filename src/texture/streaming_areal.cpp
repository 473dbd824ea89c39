// Streaming plane sums and residual moments, row-parallel with per-row partials merged in row
// order. Inputs: bands (um, mm); outputs: PlaneSums, extremes, ArealMoments.
// Method: see streaming_areal.h.
#include "texture/streaming_areal.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <thread>
#include <vector>

namespace cuspmap {

void parallel_rows(int count, int threads, const std::function<void(int)>& body) {
  const int n = std::clamp(threads, 1, std::max(1, count));
  if (n == 1) {
    for (int k = 0; k < count; ++k) body(k);
    return;
  }
  std::vector<std::thread> pool;
  for (int t = 0; t < n; ++t) {
    pool.emplace_back([&, t] {
      for (int k = t; k < count; k += n) body(k);
    });
  }
  for (std::thread& th : pool) th.join();
}

StreamingPlane::StreamingPlane(int nx, int ny, double cell_mm, double origin_x_mm,
                               double origin_y_mm) {
  sums.x0_mm = origin_x_mm + 0.5 * nx * cell_mm;
  sums.y0_mm = origin_y_mm + 0.5 * ny * cell_mm;
}

void StreamingPlane::add_band(const Heightfield& band, int threads) {
  struct RowSums {
    double n = 0, sx = 0, sxx = 0, sz = 0, sxz = 0;
    double lo = std::numeric_limits<double>::infinity();
    double hi = -std::numeric_limits<double>::infinity();
  };
  std::vector<RowSums> rows(band.ny);
  parallel_rows(band.ny, threads, [&](int j) {
    RowSums r;
    const float* z = band.z_um.data() + static_cast<std::int64_t>(j) * band.nx;
    for (int i = 0; i < band.nx; ++i) {
      const double v = z[i];
      if (std::isnan(v)) continue;
      const double x = band.x_mm(i) - sums.x0_mm;
      r.n += 1.0;
      r.sx += x;
      r.sxx += x * x;
      r.sz += v;
      r.sxz += x * v;
      r.lo = std::min(r.lo, v);
      r.hi = std::max(r.hi, v);
    }
    rows[j] = r;
  });
  for (int j = 0; j < band.ny; ++j) {
    const RowSums& r = rows[j];
    if (r.n == 0.0) continue;
    const double y = band.y_mm(j) - sums.y0_mm;
    sums.n += r.n;
    sums.sx += r.sx;
    sums.sy += y * r.n;
    sums.sxx += r.sxx;
    sums.sxy += y * r.sx;
    sums.syy += y * y * r.n;
    sums.sz += r.sz;
    sums.sxz += r.sxz;
    sums.syz += y * r.sz;
    min_um = reached == 0 ? r.lo : std::min(min_um, r.lo);
    max_um = reached == 0 ? r.hi : std::max(max_um, r.hi);
    reached += static_cast<std::int64_t>(r.n);
  }
}

void add_residual_band(const Heightfield& band, const Plane& plane, int threads,
                       ArealMoments& moments) {
  std::vector<ArealMoments> rows(band.ny);
  parallel_rows(band.ny, threads, [&](int j) {
    ArealMoments m;
    const double y = band.y_mm(j);
    const float* z = band.z_um.data() + static_cast<std::int64_t>(j) * band.nx;
    for (int i = 0; i < band.nx; ++i) {
      const float v = z[i];
      if (std::isnan(v)) continue;
      m.add(static_cast<float>(v - plane.at(band.x_mm(i), y)));
    }
    rows[j] = m;
  });
  for (const ArealMoments& m : rows) moments.merge(m);
}

}  // namespace cuspmap

// Least-squares plane fit through the finite cells of a heightfield, and plane removal.
// Inputs: heights um, cell centres mm; output: Plane (um, um/mm) or a residual heightfield.
// Method: normal equations of ordinary least squares (ISO 25178-2:2012 §3.1.8 F-operator),
// solved with a complete orthogonal decomposition so degenerate layouts get the least-norm plane.
#include "texture/fit_plane.h"

#include <Eigen/Dense>
#include <algorithm>
#include <cassert>
#include <cmath>
#include <vector>

#include "core/large_buffer.h"
#include "core/parallel_blocks.h"

namespace cuspmap {
namespace {

// Rows per partial plane sum (fixed, whatever the thread count).
constexpr int kPlaneRowsPerBlock = 64;

}  // namespace

void PlaneSums::add_row(double y_mm, double count, double sum_x, double sum_xx, double sum_z,
                        double sum_xz) {
  const double y = y_mm - y0_mm;
  n += count;
  sx += sum_x;
  sy += y * count;
  sxx += sum_xx;
  sxy += y * sum_x;
  syy += y * y * count;
  sz += sum_z;
  sxz += sum_xz;
  syz += y * sum_z;
}

void PlaneSums::merge(const PlaneSums& o) {
  assert(o.x0_mm == x0_mm && o.y0_mm == y0_mm && "plane sums must share their centre");
  n += o.n;
  sx += o.sx;
  sy += o.sy;
  sxx += o.sxx;
  sxy += o.sxy;
  syy += o.syy;
  sz += o.sz;
  sxz += o.sxz;
  syz += o.syz;
}

Plane PlaneSums::solve() const {
  Plane plane;
  plane.x0_mm = x0_mm;
  plane.y0_mm = y0_mm;
  if (n <= 0.0) return plane;
  Eigen::Matrix3d a;
  a << n, sx, sy, sx, sxx, sxy, sy, sxy, syy;
  const Eigen::Vector3d b(sz, sxz, syz);
  const Eigen::Vector3d c = a.completeOrthogonalDecomposition().solve(b);
  plane.z0_um = c(0);
  plane.gx_um_per_mm = c(1);
  plane.gy_um_per_mm = c(2);
  return plane;
}

Plane fit_plane(const Heightfield& hf) {
  PlaneSums sums;
  sums.x0_mm = hf.origin_x_mm + 0.5 * hf.nx * hf.cell_mm;
  sums.y0_mm = hf.origin_y_mm + 0.5 * hf.ny * hf.cell_mm;
  // Fixed row blocks summed on threads and merged in order: the same plane for any count.
  const int blocks = (hf.ny + kPlaneRowsPerBlock - 1) / kPlaneRowsPerBlock;
  std::vector<PlaneSums> part(static_cast<std::size_t>(blocks), sums);
  // x of every column from the centre, and a full row's sums of 1, x, x^2 (the same for every
  // row without unreached cells).
  std::vector<double> xs(static_cast<std::size_t>(hf.nx));
  double full_sx = 0.0, full_sxx = 0.0;
  for (int i = 0; i < hf.nx; ++i) {
    xs[static_cast<std::size_t>(i)] = hf.x_mm(i) - sums.x0_mm;
    full_sx += xs[static_cast<std::size_t>(i)];
    full_sxx += xs[static_cast<std::size_t>(i)] * xs[static_cast<std::size_t>(i)];
  }
  parallel_blocks(blocks, 0, [&](int b) {
    PlaneSums& p = part[static_cast<std::size_t>(b)];
    for (int j = b * kPlaneRowsPerBlock; j < std::min(hf.ny, (b + 1) * kPlaneRowsPerBlock); ++j) {
      // One row's sums of the terms that vary along it; y enters once per row (add_row).
      const float* z = &hf.z_um(j, 0);
      bool finite = true;
      for (int i = 0; i < hf.nx; ++i) finite &= !std::isnan(z[i]);
      double n = 0.0, sx = 0.0, sxx = 0.0, sz = 0.0, sxz = 0.0;
      if (finite) {
        n = hf.nx, sx = full_sx, sxx = full_sxx;
        for (int i = 0; i < hf.nx; ++i) {
          sz += z[i];
          sxz += xs[static_cast<std::size_t>(i)] * z[i];
        }
      } else {
        for (int i = 0; i < hf.nx; ++i) {
          if (std::isnan(z[i])) continue;
          const double x = xs[static_cast<std::size_t>(i)];
          n += 1.0, sx += x, sxx += x * x, sz += z[i], sxz += x * z[i];
        }
      }
      p.add_row(hf.y_mm(j), n, sx, sxx, sz, sxz);
    }
  });
  for (const PlaneSums& p : part) sums.merge(p);
  return sums.solve();
}

ResidualRows::ResidualRows(const Heightfield& hf, const Plane& plane)
    : hf_(hf), plane_(plane), x_term_um_(static_cast<std::size_t>(std::max(hf.nx, 0))) {
  for (int i = 0; i < hf.nx; ++i) {
    x_term_um_[static_cast<std::size_t>(i)] =
        plane.z0_um + plane.gx_um_per_mm * (hf.x_mm(i) - plane.x0_mm);
  }
}

void ResidualRows::row(int j, float* out) const {
  const double y_term_um = plane_.gy_um_per_mm * (hf_.y_mm(j) - plane_.y0_mm);
  const float* z = &hf_.z_um(j, 0);
  const double* xt = x_term_um_.data();
  for (int i = 0; i < hf_.nx; ++i) {
    const float r = static_cast<float>(z[i] - (xt[i] + y_term_um));
    out[i] = std::isnan(z[i]) ? z[i] : r;
  }
}

Heightfield remove_plane(const Heightfield& hf, const Plane& plane) {
  // Every cell is written once (no copy of the heights first): unreached cells stay NaN.
  Heightfield out;
  out.nx = hf.nx;
  out.ny = hf.ny;
  out.cell_mm = hf.cell_mm;
  out.origin_x_mm = hf.origin_x_mm;
  out.origin_y_mm = hf.origin_y_mm;
  out.z_um.resize(hf.ny, hf.nx);
  advise_huge_pages(out.z_um.data(), static_cast<std::size_t>(out.z_um.size()) * sizeof(float));
  const ResidualRows rows(hf, plane);
  if (hf.nx > 0) parallel_blocks(hf.ny, 0, [&](int j) { rows.row(j, &out.z_um(j, 0)); });
  return out;
}

}  // namespace cuspmap

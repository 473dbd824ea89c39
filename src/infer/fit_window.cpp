// The measured window of the floor fit (see fit_window.h).
// Inputs: Heightfield, stepover mm; output: FitWindow. Cost O(window samples).
// Method: strided decimation; thin QR of [1, x, y] (Golub & Van Loan 2013, 5.2).
#include "infer/fit_window.h"

#include <algorithm>
#include <cmath>

#include "infer/floor_fit.h"

namespace cuspmap {

FitWindow make_fit_window(const Heightfield& hf, double stepover_mm) {
  FitWindow w;
  const double cell = hf.cell_mm;
  const int max_cells = static_cast<int>(std::ceil(kMaxFitPeriods * stepover_mm / cell));
  const int cx = std::min(hf.nx, std::max(max_cells, 1)), cy = std::min(hf.ny, std::max(max_cells, 1));
  const int stride = std::max(1, (std::max(cx, cy) + kMaxFitSamples - 1) / kMaxFitSamples);
  const int nx = cx / stride, ny = cy / stride;
  const int i0 = (hf.nx - nx * stride) / 2, j0 = (hf.ny - ny * stride) / 2;
  Heightfield& m = w.measured;
  m.nx = nx;
  m.ny = ny;
  m.cell_mm = stride * cell;
  // Sample (a, b) is measured cell (i0 + a stride, j0 + b stride): its centre is the window
  // cell's centre when the window starts half a window cell before it.
  m.origin_x_mm = hf.x_mm(i0) - 0.5 * m.cell_mm;
  m.origin_y_mm = hf.y_mm(j0) - 0.5 * m.cell_mm;
  m.z_um.resize(ny, nx);
  for (int b = 0; b < ny; ++b) {
    for (int a = 0; a < nx; ++a) m.z_um(b, a) = hf.z_um(j0 + b * stride, i0 + a * stride);
  }
  w.patch.cell_mm = m.cell_mm;
  w.patch.origin_x_mm = m.origin_x_mm;
  w.patch.origin_y_mm = m.origin_y_mm;
  // Half a cell short of whole: the grid takes ceil(size / cell) cells, exactly nx and ny.
  w.patch.size_x_mm = (nx - 0.5) * m.cell_mm;
  w.patch.size_y_mm = (ny - 0.5) * m.cell_mm;
  w.x0_mm = m.origin_x_mm + 0.5 * nx * m.cell_mm;
  w.y0_mm = m.origin_y_mm + 0.5 * ny * m.cell_mm;
  for (int b = 0; b < ny; ++b) {
    for (int a = 0; a < nx; ++a) {
      if (std::isfinite(m.z_um(b, a))) w.index.push_back(b * nx + a);
    }
  }
  const int n = static_cast<int>(w.index.size());
  w.basis.resize(n, 3);
  for (int k = 0; k < n; ++k) {
    const int a = w.index[k] % nx, b = w.index[k] / nx;
    w.basis(k, 0) = 1.0;
    w.basis(k, 1) = m.x_mm(a) - w.x0_mm;
    w.basis(k, 2) = m.y_mm(b) - w.y0_mm;
  }
  Eigen::HouseholderQR<Eigen::MatrixXd> qr(w.basis);
  w.q = qr.householderQ() * Eigen::MatrixXd::Identity(n, 3);
  return w;
}

}  // namespace cuspmap

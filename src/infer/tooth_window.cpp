// Full-resolution window for the tooth-resolved fit and its projected residual.
// Inputs: Heightfield, lay, stepover, revolution; output: ToothWindow. Cost O(cells).
// Method: thin QR of the plane basis (Golub & Van Loan, Matrix Computations, §5.2).
#include "infer/tooth_window.h"

#include <algorithm>
#include <cmath>
#include <numbers>
#include <Eigen/Dense>

namespace cuspmap {
namespace {

// Stepovers the window spans across the lay: two bands and their boundaries (derived: each
// band is cut mostly by its own pass, so two whole bands carry every per-pass effect).
constexpr double kAcrossStepovers = 2.5;

}  // namespace

ToothWindow tooth_window(const Heightfield& hf, double lay_deg, double stepover_mm,
                         double revolution_mm, double revolutions, int max_cells) {
  const double cell = hf.cell_mm;
  const bool along_x = std::abs(std::cos(lay_deg * std::numbers::pi / 180.0)) >= 0.7071;
  const int n_along_max = along_x ? hf.nx : hf.ny, n_across_max = along_x ? hf.ny : hf.nx;
  int n_along = std::min(n_along_max,
                         static_cast<int>(std::ceil(revolutions * revolution_mm / cell)));
  int n_across = std::min(n_across_max,
                          static_cast<int>(std::ceil(kAcrossStepovers * stepover_mm / cell)));
  n_along = std::max(n_along, std::min(n_along_max, max_cells / std::max(n_across, 1)));
  n_across = std::max(1, std::min(n_across, max_cells / std::max(n_along, 1)));
  const int nx = along_x ? n_along : n_across, ny = along_x ? n_across : n_along;
  const int i0 = (hf.nx - nx) / 2, j0 = (hf.ny - ny) / 2;
  ToothWindow w;
  Heightfield& m = w.measured;
  m.nx = nx;
  m.ny = ny;
  m.cell_mm = cell;
  m.origin_x_mm = hf.x_mm(i0) - 0.5 * cell;
  m.origin_y_mm = hf.y_mm(j0) - 0.5 * cell;
  m.z_um = hf.z_um.block(j0, i0, ny, nx);
  w.patch.cell_mm = cell;
  w.patch.origin_x_mm = m.origin_x_mm;
  w.patch.origin_y_mm = m.origin_y_mm;
  // Half a cell short of whole: the grid takes ceil(size / cell) cells, exactly nx and ny.
  w.patch.size_x_mm = (nx - 0.5) * cell;
  w.patch.size_y_mm = (ny - 0.5) * cell;
  for (int k = 0; k < nx * ny; ++k) {
    if (std::isfinite(m.z_um(k / nx, k % nx))) w.index.push_back(k);
  }
  const int n = static_cast<int>(w.index.size());
  Eigen::MatrixXd basis(n, 3);
  w.values.resize(n);
  const double x0 = m.origin_x_mm + 0.5 * nx * cell, y0 = m.origin_y_mm + 0.5 * ny * cell;
  for (int k = 0; k < n; ++k) {
    const int a = w.index[k] % nx, b = w.index[k] / nx;
    basis(k, 0) = 1.0;
    basis(k, 1) = m.x_mm(a) - x0;
    basis(k, 2) = m.y_mm(b) - y0;
    w.values[k] = m.z_um(b, a);
  }
  Eigen::HouseholderQR<Eigen::MatrixXd> qr(basis);
  w.q = qr.householderQ() * Eigen::MatrixXd::Identity(n, 3);
  return w;
}

Eigen::VectorXd ToothWindow::residual(const Heightfield& model) const {
  const int n = static_cast<int>(index.size());
  Eigen::VectorXd r(n);
  for (int k = 0; k < n; ++k) {
    const float s = model.z_um.data()[index[static_cast<size_t>(k)]];
    r[k] = values[k] - (std::isfinite(s) ? s : 0.0);
  }
  return r - q * (q.transpose() * r);
}

}  // namespace cuspmap

// The full-resolution window of the tooth-resolved fit (infer/tooth_window): its size from the
// lay, stepover and revolution, its cells at the measured cells, the plane projected out.
#include "infer/tooth_window.h"

#include <catch2/catch.hpp>
#include <cmath>

#include "test_support.h"

namespace cuspmap {

TEST_CASE("tooth_window: full-resolution block, plane projected out", "[infer][tooth]") {
  // 400 x 300 cells of 5 um holding a plane 0.7 + 2 x - 1 y um with a missing cell.
  Heightfield hf;
  hf.nx = 400;
  hf.ny = 300;
  hf.cell_mm = 0.005;
  hf.z_um.resize(hf.ny, hf.nx);
  for (int j = 0; j < hf.ny; ++j) {
    for (int i = 0; i < hf.nx; ++i) {
      hf.z_um(j, i) = static_cast<float>(0.7 + 2.0 * hf.x_mm(i) - hf.y_mm(j));
    }
  }
  hf.z_um(150, 200) = kUnreached;
  // Lay along X, stepover 0.4 mm, revolution 0.15 mm: 6 revolutions (180 cells) along, 2.5
  // stepovers (200 cells) across, then grown along up to the cell budget (derived from the
  // constants in tooth_window.h).
  const ToothWindow w = tooth_window(hf, 0.0, 0.4, 0.15);
  CAPTURE(w.measured.nx, w.measured.ny);
  REQUIRE(w.measured.ny == 200);
  REQUIRE(w.measured.nx == std::min(400, kMaxToothWindowCells / 200));
  REQUIRE(static_cast<int>(w.index.size()) == w.measured.nx * w.measured.ny - 1);
  // The window's cells are the measured cells: its first cell is measured cell (i0, j0).
  const int i0 = (hf.nx - w.measured.nx) / 2, j0 = (hf.ny - w.measured.ny) / 2;
  REQUIRE(w.measured.x_mm(0) == Approx(hf.x_mm(i0)));
  REQUIRE(w.measured.y_mm(0) == Approx(hf.y_mm(j0)));
  // A flat model leaves the plane, which the projection removes (Golub & Pereyra 1973).
  Heightfield zero = w.measured;
  zero.z_um.setZero();
  REQUIRE(w.residual(zero).cwiseAbs().maxCoeff() < 1e-3);
}

}  // namespace cuspmap

// Areal parameters: moments merge across tiles, plane removal, Sa/Sq of a sinusoidal surface,
// Sdr of a tilted plane, NaN cells left out.
// Sources: Todhunter et al. (2020), Surf. Topogr.: Metrol. Prop. 8 015010 (sinusoidal surface:
// Sa = 2A/pi, Sq = A/sqrt 2, Sku = 1.5); ISO 25178-2:2012 §4.3.2 Sdr definition (a plane of
// slope g develops sqrt(1 + g^2) - 1).
#include "texture/areal_parameters.h"

#include <cmath>
#include <numbers>

#include "test_support.h"
#include "texture/areal_moments.h"
#include "texture/fit_plane.h"

using namespace cuspmap;

namespace {

constexpr double kPi = std::numbers::pi;

Heightfield grid(int nx, int ny, double cell) {
  Heightfield hf;
  hf.nx = nx;
  hf.ny = ny;
  hf.cell_mm = cell;
  hf.z_um = HeightGrid::Zero(ny, nx);
  return hf;
}

}  // namespace

TEST_CASE("ArealMoments: tiles merged equal the whole", "[texture]") {
  ArealMoments whole, a, b;
  for (int k = 0; k < 1000; ++k) {
    const double z = std::sin(0.37 * k) * 3.0 + 0.1;
    whole.add(z);
    (k < 400 ? a : b).add(z);
  }
  a.merge(b);
  const AmplitudeParameters pw = amplitude_parameters(whole), pm = amplitude_parameters(a);
  REQUIRE(a.count == whole.count);
  REQUIRE_NEAR(pm.mean_abs_um, pw.mean_abs_um, 1e-12);
  REQUIRE_NEAR(pm.rms_um, pw.rms_um, 1e-12);
  REQUIRE_NEAR(pm.skewness, pw.skewness, 1e-12);
  REQUIRE_NEAR(pm.kurtosis, pw.kurtosis, 1e-12);
  REQUIRE(pm.total_um == pw.total_um);
}

TEST_CASE("areal_parameters: tilted sinusoidal surface (Todhunter et al. 2020)", "[texture]") {
  // z = A cos(2 pi x / lambda) + tilt; 10 whole periods along X, 1000 cells each. The cosine
  // is symmetric about the field's centre, so the least-squares plane takes none of it.
  Heightfield hf = grid(10000, 20, 1e-4);
  const double a = 1.5;
  for (int j = 0; j < hf.ny; ++j) {
    for (int i = 0; i < hf.nx; ++i) {
      const double x = hf.x_mm(i), y = hf.y_mm(j);
      hf.z_um(j, i) = static_cast<float>(a * std::cos(2 * kPi * x / 0.1) + 2.0 * x - 5.0 * y + 7.0);
    }
  }
  const Heightfield r = remove_plane(hf, fit_plane(hf));
  const ArealParameters p = areal_parameters(r);
  // float storage of heights up to ~10 um limits agreement to ~1e-6 relative.
  REQUIRE_NEAR(p.sa_um, 2 * a / kPi, 2e-5 * p.sa_um);
  REQUIRE_NEAR(p.sq_um, a / std::sqrt(2.0), 2e-5 * p.sq_um);
  REQUIRE_NEAR(p.sku, 1.5, 1e-4);
  REQUIRE_NEAR(p.ssk, 0.0, 1e-4);
  REQUIRE_NEAR(p.sz_um, 2 * a, 1e-4);
}

TEST_CASE("developed_area_ratio: a plane of slope g gives sqrt(1 + g^2) - 1", "[texture]") {
  Heightfield hf = grid(50, 40, 0.01);
  const double gx = 0.3, gy = -0.4;  // mm/mm; heights in um are 1000 x slope x position
  for (int j = 0; j < hf.ny; ++j) {
    for (int i = 0; i < hf.nx; ++i)
      hf.z_um(j, i) = static_cast<float>(1000.0 * (gx * hf.x_mm(i) + gy * hf.y_mm(j)));
  }
  std::int64_t squares = 0;
  REQUIRE_NEAR(developed_area_ratio(hf, squares), std::sqrt(1.0 + gx * gx + gy * gy) - 1.0, 1e-6);
  REQUIRE(squares == 49 * 39);
}

TEST_CASE("areal_parameters: NaN cells are left out of every statistic", "[texture]") {
  //  row 1:  NaN   1    1
  //  row 0:   -1   1   -1      (finite: -1, 1, -1, 1, 1 -> Sa = Sq = 1)
  Heightfield hf = grid(3, 2, 0.01);
  hf.z_um << -1, 1, -1, kUnreached, 1, 1;
  const ArealParameters p = areal_parameters(hf);
  REQUIRE(p.cells == 5);
  REQUIRE_NEAR(p.sa_um, 1.0, 1e-12);
  REQUIRE_NEAR(p.sq_um, 1.0, 1e-12);
  REQUIRE(p.squares == 1);  // only the right-hand square has four finite corners
}

TEST_CASE("fit_plane: recovers an exact plane, NaN cells skipped", "[texture]") {
  Heightfield hf = grid(30, 20, 0.05);
  hf.origin_x_mm = 3.0;
  for (int j = 0; j < hf.ny; ++j) {
    for (int i = 0; i < hf.nx; ++i)
      hf.z_um(j, i) = static_cast<float>(4.0 + 2.0 * hf.x_mm(i) - 3.0 * hf.y_mm(j));
  }
  hf.z_um(5, 5) = kUnreached;
  const Plane p = fit_plane(hf);
  REQUIRE_NEAR(p.gx_um_per_mm, 2.0, 1e-5);
  REQUIRE_NEAR(p.gy_um_per_mm, -3.0, 1e-5);
  REQUIRE_NEAR(p.at(3.0, 0.0), 10.0, 1e-4);
}

TEST_CASE("areal_parameters: of a floor and its plane equals that of remove_plane's residual",
          "[texture]") {
  // Derived: residual_row is remove_plane's arithmetic and the row blocks sum in the same order.
  Heightfield hf = grid(203, 150, 0.01);  // not a whole number of 64-row blocks
  for (int j = 0; j < hf.ny; ++j) {
    for (int i = 0; i < hf.nx; ++i) {
      hf.z_um(j, i) = static_cast<float>(std::sin(0.3 * i) * std::cos(0.2 * j) + 0.01 * i - 0.02 * j);
    }
  }
  hf.z_um(3, 4) = kUnreached;
  hf.z_um(64, 0) = kUnreached;  // on a block's first row
  const Plane plane = fit_plane(hf);
  const ArealParameters whole = areal_parameters(remove_plane(hf, plane));
  const ArealParameters rows = areal_parameters(hf, plane);
  CHECK(rows.sa_um == whole.sa_um);
  CHECK(rows.sq_um == whole.sq_um);
  CHECK(rows.sp_um == whole.sp_um);
  CHECK(rows.sv_um == whole.sv_um);
  CHECK(rows.ssk == whole.ssk);
  CHECK(rows.sku == whole.sku);
  CHECK(rows.sdr == whole.sdr);
  CHECK(rows.cells == whole.cells);
  CHECK(rows.squares == whole.squares);
  CHECK(whole.squares == 202 * 149 - 4 - 2);  // four squares touch (3, 4), two touch (64, 0)
}

TEST_CASE("developed_area_ratio: equals the per-square sum of its definition bit for bit",
          "[texture]") {
  // ISO 25178-2:2012 §4.3.2: Sdr = mean over the squares with four finite corners of
  // sqrt(1 + gx^2 + gy^2) - 1, the slopes from the two edges of each square. Summed here one
  // square at a time in row order (the function's paired lanes must give the same double;
  // derived). At most 64 rows: one row block, summed in this order.
  for (const int nx : {2, 3, 7, 64, 101}) {
    Heightfield hf = grid(nx, 37, 0.01);
    for (int j = 0; j < hf.ny; ++j) {
      for (int i = 0; i < hf.nx; ++i) {
        hf.z_um(j, i) = static_cast<float>(3.0 * std::sin(0.7 * i + 0.2 * j * j) + 0.01 * i * j);
      }
    }
    hf.z_um(5, nx / 2) = kUnreached;
    hf.z_um(20, nx - 1) = kUnreached;
    const double k = 1.0 / (1000.0 * 2.0 * hf.cell_mm);  // um -> mm over 2 cells' run
    double sum = 0.0;
    std::int64_t count = 0;
    for (int j = 0; j + 1 < hf.ny; ++j) {
      for (int i = 0; i + 1 < hf.nx; ++i) {
        const double z00 = hf.z_um(j, i), z10 = hf.z_um(j, i + 1);
        const double z01 = hf.z_um(j + 1, i), z11 = hf.z_um(j + 1, i + 1);
        const double gx = ((z10 - z00) + (z11 - z01)) * k;
        const double gy = ((z01 - z00) + (z11 - z10)) * k;
        const double g2 = gx * gx + gy * gy;
        if (std::isnan(g2)) continue;
        sum += g2 / (std::sqrt(1.0 + g2) + 1.0);  // = sqrt(1 + g2) - 1
        ++count;
      }
    }
    std::int64_t squares = 0;
    const double sdr = developed_area_ratio(hf, squares);
    CAPTURE(nx);
    REQUIRE(squares == count);
    REQUIRE(sdr == sum / static_cast<double>(count));
  }
}

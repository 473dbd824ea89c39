// Single-precision row-column FFT: the autocorrelation against the direct double sum, and the
// same bits for any thread count.
// Sources: Wiener-Khinchin theorem (the inverse transform of |F|^2 is the circular
// autocorrelation, times rows x cols in FFTW's unnormalised convention: FFTW 3 manual §4.8,
// "What FFTW Really Computes"); the direct sum is the definition (derived).
#include "texture/real_fft_2d.h"

#include <cmath>
#include <cstring>
#include <random>
#include <vector>

#include "test_support.h"
#include "texture/fit_plane.h"
#include "texture/lay_spectrum.h"
#include "texture/texture_direction.h"

using namespace cuspmap;

namespace {

// A random field of ny x nx in the top-left corner of a py x px zero-padded SpectrumField.
SpectrumField random_field(int py, int px, int ny, int nx, std::vector<double>& values) {
  std::mt19937 rng(7);
  std::uniform_real_distribution<float> u(-1.0f, 1.0f);
  SpectrumField f(py, px);
  values.assign(static_cast<size_t>(ny) * nx, 0.0);
  for (int j = 0; j < ny; ++j) {
    for (int i = 0; i < nx; ++i) {
      const float v = u(rng);
      f.row(j)[i] = v;
      values[static_cast<size_t>(j) * nx + i] = v;
    }
  }
  return f;
}

}  // namespace

TEST_CASE("autocorrelate_field: equals the direct circular sum on the lags asked for",
          "[texture]") {
  const int ny = 23, nx = 37, py = 36, px = 56, lag_rows = 11;
  std::vector<double> z;
  SpectrumField f = random_field(py, px, ny, nx, z);
  autocorrelate_field(f, ny, lag_rows, 1);
  for (int ty = -lag_rows; ty <= lag_rows; ++ty) {
    for (int tx = -(px - nx); tx <= px - nx; ++tx) {
      double direct = 0.0;  // sum_p a(p) a(p + t) with zero padding (no wrap at these lags)
      for (int j = 0; j < ny; ++j) {
        for (int i = 0; i < nx; ++i) {
          const int j2 = j + ty, i2 = i + tx;
          if (j2 < 0 || j2 >= ny || i2 < 0 || i2 >= nx) continue;
          direct += z[static_cast<size_t>(j) * nx + i] * z[static_cast<size_t>(j2) * nx + i2];
        }
      }
      const int r = ty < 0 ? ty + py : ty, c = tx < 0 ? tx + px : tx;
      CAPTURE(tx, ty);
      // Float transforms of ~2000 terms of size 1: round-off well under 1e-3 of the lag-0 sum
      // (about 280 here); derived from float epsilon x log2(N) x sqrt(N).
      REQUIRE(std::abs(f.row(r)[c] / (double{py} * px) - direct) < 2e-3);
    }
  }
}

TEST_CASE("autocorrelate_field: bit-identical for 1, 2 and 3 threads", "[texture]") {
  const int ny = 70, nx = 90, py = 105, px = 135;
  std::vector<double> z;
  SpectrumField a = random_field(py, px, ny, nx, z);
  SpectrumField b = random_field(py, px, ny, nx, z);
  SpectrumField c = random_field(py, px, ny, nx, z);
  autocorrelate_field(a, ny, ny / 2 + 1, 1);
  autocorrelate_field(b, ny, ny / 2 + 1, 2);
  autocorrelate_field(c, ny, ny / 2 + 1, 3);
  for (int j : {0, 1, ny / 2, py - ny / 2 - 1, py - 1}) {
    CAPTURE(j);
    REQUIRE(std::memcmp(a.row(j), b.row(j), sizeof(float) * px) == 0);
    REQUIRE(std::memcmp(a.row(j), c.row(j), sizeof(float) * px) == 0);
  }
}

namespace {

// A grating a i + b j with a tilt (c i + d j) and Gaussian noise of 0.2 um, on 0.01 mm cells.
Heightfield noisy_grating(int nx, int ny, unsigned seed, float a, float b, float c, float d) {
  Heightfield hf;
  hf.nx = nx;
  hf.ny = ny;
  hf.cell_mm = 0.01;
  hf.z_um.resize(hf.ny, hf.nx);
  std::mt19937 rng(seed);
  std::normal_distribution<float> g(0.0f, 1.0f);
  for (int j = 0; j < hf.ny; ++j) {
    for (int i = 0; i < hf.nx; ++i) {
      const auto fi = static_cast<float>(i), fj = static_cast<float>(j);
      hf.z_um(j, i) = std::sin(a * fi + b * fj) + c * fi + d * fj + 0.2f * g(rng);
    }
  }
  return hf;
}

}  // namespace

TEST_CASE("texture_direction: Sal, Str and lay bit-identical for any thread count", "[texture]") {
  Heightfield hf = noisy_grating(180, 130, 3, 0.3f, 0.0f, 0.0f, 0.0f);
  hf.z_um(5, 7) = kUnreached;  // the pair-count transform too
  const TextureDirection one = texture_direction(hf, 1), two = texture_direction(hf, 2);
  REQUIRE(one.sal_found);
  REQUIRE(std::memcmp(&one.sal_mm, &two.sal_mm, sizeof(double)) == 0);
  REQUIRE(std::memcmp(&one.str, &two.str, sizeof(double)) == 0);
  REQUIRE(std::memcmp(&one.lay_deg, &two.lay_deg, sizeof(double)) == 0);
  REQUIRE(std::memcmp(&one.lay_strength, &two.lay_strength, sizeof(double)) == 0);
}

TEST_CASE("texture_direction: of a floor and its plane, row by row, equals that of its residual",
          "[texture]") {
  // Derived: residual_row is remove_plane's arithmetic, so the transforms see the same floats;
  // the lay transform's memory reused by the padded one changes nothing (its stale rows are
  // cleared before the transform).
  // 700 x 520 cells: the lay's 8-byte field is large enough to be handed on.
  Heightfield hf = noisy_grating(700, 520, 5, 0.21f, 0.05f, 0.002f, -0.003f);
  hf.z_um(11, 13) = kUnreached;
  const Plane plane = fit_plane(hf);
  const TextureDirection whole = texture_direction(remove_plane(hf, plane), 2);
  LargeBytes spent;
  const LaySums lay = lay_spectrum(hf, 2, &plane, &spent);
  REQUIRE(spent != nullptr);
  const TextureDirection rows = texture_direction(hf, &plane, 2, &lay, std::move(spent));
  REQUIRE(whole.sal_found);
  REQUIRE(std::memcmp(&whole.sal_mm, &rows.sal_mm, sizeof(double)) == 0);
  REQUIRE(std::memcmp(&whole.str, &rows.str, sizeof(double)) == 0);
  REQUIRE(std::memcmp(&whole.lay_deg, &rows.lay_deg, sizeof(double)) == 0);
  REQUIRE(std::memcmp(&whole.lay_strength, &rows.lay_strength, sizeof(double)) == 0);
}

// Lay sums of the Hann-windowed spectrum against the direct double DFT, and the same bits for
// any thread count.
// Sources: the discrete Fourier transform's definition and FFTW's sign convention (FFTW 3
// manual §4.8, "What FFTW Really Computes"); Hann window w(n) = 0.5 - 0.5 cos(2 pi (n + 1/2) / N)
// as texture/lay_spectrum.h states it; cos 2phi = (kx^2 - ky^2) / |k|^2 (derived).
#include "texture/lay_spectrum.h"

#include <cmath>
#include <limits>
#include <numbers>
#include <random>
#include <utility>

#include "test_support.h"

using namespace cuspmap;

namespace {

Heightfield random_surface(int ny, int nx) {
  std::mt19937 rng(11);
  std::uniform_real_distribution<float> u(-2.0f, 2.0f);
  Heightfield hf;
  hf.nx = nx;
  hf.ny = ny;
  hf.cell_mm = 0.01;
  hf.z_um.resize(ny, nx);
  for (int j = 0; j < ny; ++j) {
    for (int i = 0; i < nx; ++i) hf.z_um(j, i) = u(rng) + 0.3f * static_cast<float>(i % 5);
  }
  hf.z_um(3, 4) = std::numeric_limits<float>::quiet_NaN();  // read as 0
  return hf;
}

// The sums by the direct DFT over the half spectrum u = 0 .. nx/2, every bin but k = 0, with the
// contract's weights: 2 for the bins standing for their mirror -k too (same power, same doubled
// angle), 1 for u = 0 and u = nx/2 (even nx); row v has ky = v or v - ny (v > ny/2).
LaySums direct_sums(const Heightfield& hf) {
  const int nx = hf.nx, ny = hf.ny;
  const double two_pi = 2.0 * std::numbers::pi;
  LaySums out;
  for (int v = 0; v < ny; ++v) {
    for (int u = 0; u <= nx / 2; ++u) {
      if (u == 0 && v == 0) continue;
      double re = 0.0, im = 0.0;
      for (int j = 0; j < ny; ++j) {
        const double wy = 0.5 - 0.5 * std::cos(two_pi * (j + 0.5) / ny);
        for (int i = 0; i < nx; ++i) {
          const double wx = 0.5 - 0.5 * std::cos(two_pi * (i + 0.5) / nx);
          const float z = hf.z_um(j, i);
          const double a = std::isnan(z) ? 0.0 : wx * wy * z;
          const double ang = -two_pi * (static_cast<double>(u) * i / nx +
                                        static_cast<double>(v) * j / ny);
          re += a * std::cos(ang);
          im += a * std::sin(ang);
        }
      }
      const double kx = u / (nx * hf.cell_mm);
      const double ky = (v <= ny / 2 ? v : v - ny) / (ny * hf.cell_mm);
      const double weight = (u == 0 || 2 * u == nx) ? 1.0 : 2.0;
      const double p = weight * (re * re + im * im), k2 = kx * kx + ky * ky;
      out.c += p * (kx * kx - ky * ky) / k2;
      out.s += p * 2.0 * kx * ky / k2;
      out.total += p;
    }
  }
  return out;
}

}  // namespace

TEST_CASE("lay_spectrum: equals the direct DFT sums (odd and even sizes)", "[texture]") {
  for (const auto& [ny, nx] : {std::pair{13, 20}, std::pair{16, 11}}) {
    CAPTURE(ny, nx);
    const Heightfield hf = random_surface(ny, nx);
    const LaySums fast = lay_spectrum(hf, 2), ref = direct_sums(hf);
    // Double-precision transforms of ~300 cells: agreement to ~1e-12 of the total power.
    const double tol = 1e-10 * ref.total;
    REQUIRE(std::abs(fast.total - ref.total) < tol);
    REQUIRE(std::abs(fast.c - ref.c) < tol);
    REQUIRE(std::abs(fast.s - ref.s) < tol);
  }
}

TEST_CASE("lay_spectrum: the same bits for 1, 2 and 3 threads", "[texture]") {
  const Heightfield hf = random_surface(70, 90);
  const LaySums one = lay_spectrum(hf, 1), two = lay_spectrum(hf, 2), three = lay_spectrum(hf, 3);
  REQUIRE(one.c == two.c);
  REQUIRE(one.s == two.s);
  REQUIRE(one.total == two.total);
  REQUIRE(one.c == three.c);
  REQUIRE(one.total == three.total);
}

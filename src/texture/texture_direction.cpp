// Areal autocorrelation (FFT, pair-count normalised) with Sal/Str decay search, and the lay
// direction from the Hann-windowed power spectrum.
// Inputs: residual heightfield; output: TextureDirection. Cost O(N log N).
// Method: ISO 25178-2:2012 §4.2; Wiener-Khinchin theorem; FFTW3 real transforms.
#include "texture/texture_direction.h"

#include <algorithm>
#include <cmath>
#include <memory>
#include <numbers>
#include <vector>

#include "texture/fft_autocorrelation.h"

namespace cuspmap {
namespace {

using ComplexBuf = std::unique_ptr<fftw_complex, FftwFree>;

// Smallest size >= n with no prime factor above 7 (FFTW is fastest on those).
int fft_size(int n) {
  for (int m = std::max(n, 1);; ++m) {
    int r = m;
    for (int p : {2, 3, 5, 7}) {
      while (r % p == 0) r /= p;
    }
    if (r == 1) return m;
  }
}

// Normalised ACF on lags |tx| < nx, |ty| < ny, stored as a (2ny-1) x (2nx-1) grid centred on 0.
struct Acf {
  int nx = 0, ny = 0;
  std::vector<double> v;
  double at(int tx, int ty) const {
    return v[static_cast<size_t>(ty + ny - 1) * (2 * nx - 1) + static_cast<size_t>(tx + nx - 1)];
  }
  // Bilinear value at a fractional lag (cells).
  double sample(double fx, double fy) const {
    const int ix = static_cast<int>(std::floor(fx)), iy = static_cast<int>(std::floor(fy));
    const double tx = fx - ix, ty = fy - iy;
    return (1 - ty) * ((1 - tx) * at(ix, iy) + tx * at(ix + 1, iy)) +
           ty * ((1 - tx) * at(ix, iy + 1) + tx * at(ix + 1, iy + 1));
  }
};

Acf areal_acf(const Heightfield& hf, bool& has_nan) {
  const int nx = hf.nx, ny = hf.ny;
  // Lags up to half the field are used; padding to n + n/2 + 1 keeps them free of wrap-around
  // (a circular lag t mixes in t - p, beyond the data when p >= n + |t|), at half the cost of 2n.
  const int px = fft_size(nx + nx / 2 + 1), py = fft_size(ny + ny / 2 + 1);
  const size_t total = static_cast<size_t>(px) * static_cast<size_t>(py);
  FftwRealBuffer z = fftw_real_buffer(total);
  has_nan = false;
  for (int j = 0; j < ny; ++j) {
    for (int i = 0; i < nx; ++i) {
      const float v = hf.z_um(j, i);
      if (std::isnan(v)) has_nan = true;
      z.get()[static_cast<size_t>(j) * px + i] = std::isnan(v) ? 0.0 : v;
    }
  }
  fft_autocorrelate(z.get(), py, px);
  FftwRealBuffer m;
  if (has_nan) {
    m = fftw_real_buffer(total);
    for (int j = 0; j < ny; ++j) {
      for (int i = 0; i < nx; ++i) {
        m.get()[static_cast<size_t>(j) * px + i] = std::isnan(hf.z_um(j, i)) ? 0.0 : 1.0;
      }
    }
    fft_autocorrelate(m.get(), py, px);
  }
  Acf acf;
  acf.nx = nx;
  acf.ny = ny;
  acf.v.assign(static_cast<size_t>(2 * nx - 1) * (2 * ny - 1), 0.0);
  // Pair counts below one half are round-off of an empty overlap (counts are integers).
  constexpr double kMinPairs = 0.5;
  auto mean_product = [&](int tx, int ty) {
    const size_t idx =
        static_cast<size_t>((ty + py) % py) * px + static_cast<size_t>((tx + px) % px);
    const double pairs =
        has_nan ? m.get()[idx] : static_cast<double>(nx - std::abs(tx)) * (ny - std::abs(ty));
    return pairs >= kMinPairs ? z.get()[idx] / pairs : 0.0;
  };
  const double r0 = mean_product(0, 0);
  if (!(r0 > 0.0)) return acf;
  // Only lags free of wrap-around are filled (the decay search reaches half the field + 1 cell).
  const int lim_x = std::min(nx - 1, px - nx), lim_y = std::min(ny - 1, py - ny);
  for (int ty = -lim_y; ty <= lim_y; ++ty) {
    for (int tx = -lim_x; tx <= lim_x; ++tx) {
      acf.v[static_cast<size_t>(ty + ny - 1) * (2 * nx - 1) + static_cast<size_t>(tx + nx - 1)] =
          mean_product(tx, ty) / r0;
    }
  }
  return acf;
}

// Lay from the Hann-windowed power spectrum: the doubled-angle mean of the wave-vector
// directions weighted by power is perpendicular to the grooves.
void lay_from_spectrum(const Heightfield& hf, TextureDirection& out) {
  const int nx = hf.nx, ny = hf.ny, bins = nx / 2 + 1;
  FftwRealBuffer z = fftw_real_buffer(static_cast<size_t>(nx) * static_cast<size_t>(ny));
  ComplexBuf spec(static_cast<fftw_complex*>(fftw_malloc(sizeof(fftw_complex) * ny * bins)));
  const double two_pi = 2.0 * std::numbers::pi;
  for (int j = 0; j < ny; ++j) {
    const double wy = 0.5 - 0.5 * std::cos(two_pi * (j + 0.5) / ny);
    for (int i = 0; i < nx; ++i) {
      const double wx = 0.5 - 0.5 * std::cos(two_pi * (i + 0.5) / nx);
      const float v = hf.z_um(j, i);
      z.get()[static_cast<size_t>(j) * nx + i] = std::isnan(v) ? 0.0 : wx * wy * v;
    }
  }
  fftw_plan plan = fftw_plan_dft_r2c_2d(ny, nx, z.get(), spec.get(), FFTW_ESTIMATE);
  fftw_execute(plan);
  fftw_destroy_plan(plan);
  double c = 0.0, s = 0.0, total = 0.0;
  for (int j = 0; j < ny; ++j) {
    const double ky = (j <= ny / 2 ? j : j - ny) / (ny * hf.cell_mm);
    for (int i = 0; i < bins; ++i) {
      if (i == 0 && j == 0) continue;
      const double kx = i / (nx * hf.cell_mm);
      const double re = spec.get()[static_cast<size_t>(j) * bins + i][0];
      const double im = spec.get()[static_cast<size_t>(j) * bins + i][1];
      // Columns 0 and nx/2 (even nx) hold both k and -k; the others stand for their mirror too.
      const double weight = (i == 0 || 2 * i == nx) ? 1.0 : 2.0;
      const double p = weight * (re * re + im * im);
      const double phi2 = 2.0 * std::atan2(ky, kx);
      c += p * std::cos(phi2);
      s += p * std::sin(phi2);
      total += p;
    }
  }
  if (!(total > 0.0)) return;
  out.lay_strength = std::hypot(c, s) / total;
  double lay = 0.5 * std::atan2(s, c) * 180.0 / std::numbers::pi + 90.0;
  lay = std::fmod(lay, 180.0);
  if (lay < 0.0) lay += 180.0;
  out.lay_deg = lay;
}

}  // namespace

TextureDirection texture_direction(const Heightfield& residual) {
  TextureDirection out;
  if (residual.nx < 2 || residual.ny < 2) return out;
  bool has_nan = false;
  const Acf acf = areal_acf(residual, has_nan);
  // Walk rays from the origin in steps of a quarter cell until the ACF falls to s; the reach is
  // half the field in each axis (beyond it too few pairs remain for a stable estimate).
  constexpr double kStepCells = 0.25;
  const double reach_x = 0.5 * (residual.nx - 1), reach_y = 0.5 * (residual.ny - 1);
  double shortest = 1e300, longest = 0.0;
  for (double a = 0.0; a < 180.0; a += kAcfAngleStepDeg) {
    const double c = std::cos(a * std::numbers::pi / 180.0),
                 s = std::sin(a * std::numbers::pi / 180.0);
    const double rx = std::abs(c) > 1e-12 ? reach_x / std::abs(c) : 1e300;
    const double ry = std::abs(s) > 1e-12 ? reach_y / std::abs(s) : 1e300;
    const double reach = std::min(rx, ry);
    double prev_r = 0.0, prev_v = 1.0, found = -1.0;
    for (double r = kStepCells; r <= reach; r += kStepCells) {
      const double v = acf.sample(r * c, r * s);
      if (v <= kAcfThreshold) {
        found = prev_r + (prev_v - kAcfThreshold) / (prev_v - v) * (r - prev_r);
        break;
      }
      prev_r = r;
      prev_v = v;
    }
    if (found < 0.0) {
      out.str_upper_bound = true;
      longest = std::max(longest, reach);
      continue;
    }
    out.sal_found = true;
    shortest = std::min(shortest, found);
    longest = std::max(longest, found);
  }
  if (out.sal_found) {
    out.sal_mm = shortest * residual.cell_mm;
    out.str = longest > 0.0 ? shortest / longest : 0.0;
  }
  lay_from_spectrum(residual, out);
  return out;
}

}  // namespace cuspmap

// Areal autocorrelation (FFT, pair-count normalised) with Sal/Str decay search, and the lay
// direction from the Hann-windowed power spectrum.
// Inputs: residual heightfield; output: TextureDirection. Cost O(N log N).
// Method: ISO 25178-2:2012 §4.2; Wiener-Khinchin theorem; ACF by FFTW3 single-precision real
// transforms on threads (texture/real_fft_2d.h, bit-identical for any thread count); lay in double
// on threads (texture/lay_spectrum.h).
#include "texture/texture_direction.h"

#include <algorithm>
#include <atomic>
#include <complex>
#include <cmath>
#include <memory>
#include <numbers>
#include <optional>
#include <vector>

#include "core/parallel_blocks.h"
#include "texture/fft_autocorrelation.h"
#include "texture/lay_spectrum.h"
#include "texture/real_fft_2d.h"

namespace cuspmap {
namespace {

// Smallest multiple of 8 >= n with no prime factor above 7. FFTW is fastest on 7-smooth
// sizes, and its real-to-complex rows on even ones: measured on 2 cores, an odd 1875 took 3.6
// ns per point against 0.9 for 1920, an odd 12005 4.6 against 1.5 for 12096
// (docs/performance.md, "Fourth pass").
int fft_size(int n) {
  constexpr int kMultiple = 8;
  for (int m = (std::max(n, 1) + kMultiple - 1) / kMultiple * kMultiple;; m += kMultiple) {
    int r = m;
    for (int p : {2, 3, 5, 7}) {
      while (r % p == 0) r /= p;
    }
    if (r == 1) return m;
  }
}

// Lags up to half the field are used; padding to n + n/2 + 1 keeps them free of wrap-around (a
// circular lag t mixes in t - p, beyond the data when p >= n + |t|), at half the cost of 2n.
int padded_size(int n) { return fft_size(n + n / 2 + 1); }

// Normalised ACF read straight from the transformed, padded field (no copy of the lag grid):
// lags |tx| <= lim_x, |ty| <= lim_y are free of wrap-around; others read as 0.
class Acf {
 public:
  // `release` (may be null) is emptied once the field holds its values: a caller that hands
  // over its residual does not hold it and the padded transform at once.
  Acf(const Heightfield& hf, const Plane* remove, int threads, Heightfield* release,
      LargeBytes spent);
  double at(int tx, int ty) const {
    if (std::abs(tx) > lim_x_ || std::abs(ty) > lim_y_ || !(r0_ > 0.0)) return 0.0;
    return mean_product(tx, ty) / r0_;
  }
  // Bilinear value at a fractional lag (cells).
  double sample(double fx, double fy) const {
    const int ix = static_cast<int>(std::floor(fx)), iy = static_cast<int>(std::floor(fy));
    const double tx = fx - ix, ty = fy - iy;
    return (1 - ty) * ((1 - tx) * at(ix, iy) + tx * at(ix + 1, iy)) +
           ty * ((1 - tx) * at(ix, iy + 1) + tx * at(ix + 1, iy + 1));
  }

 private:
  double mean_product(int tx, int ty) const {
    const int r = ty < 0 ? ty + py_ : ty, c = tx < 0 ? tx + px_ : tx;
    // Pair counts are integers: the mask's float transform is rounded back to one.
    const double pairs = mask_ ? std::round(mask_->row(r)[c] * scale_)
                               : static_cast<double>(nx_ - std::abs(tx)) * (ny_ - std::abs(ty));
    return pairs >= 1.0 ? z_.row(r)[c] * scale_ / pairs : 0.0;
  }
  int nx_, ny_, px_, py_, lim_x_, lim_y_;
  double scale_;  // 1 / (px py): the unnormalised transform pair's factor
  SpectrumField z_;
  std::unique_ptr<SpectrumField> mask_;
  double r0_ = 0.0;
};

Acf::Acf(const Heightfield& hf, const Plane* remove, int threads, Heightfield* release,
         LargeBytes spent)
    : nx_(hf.nx),
      ny_(hf.ny),
      px_(padded_size(hf.nx)),
      py_(padded_size(hf.ny)),
      lim_x_(std::min(hf.nx - 1, px_ - hf.nx)),
      lim_y_(std::min(hf.ny - 1, py_ - hf.ny)),
      scale_(1.0 / (static_cast<double>(px_) * py_)),
      z_(py_, px_, std::move(spent)) {
  // A fresh field is zero: only the data cells are written (no zero-fill pass). Rows of a
  // reused one are written in full, padding included.
  std::atomic<bool> has_nan{false};
  std::optional<ResidualRows> residual;
  if (remove != nullptr) residual.emplace(hf, *remove);
  parallel_blocks(ny_, threads, [&](int j) {
    float* row = z_.row(j);
    if (residual) {
      residual->row(j, row);
    } else {
      std::copy_n(&hf.z_um(j, 0), nx_, row);
    }
    bool nan = false;
    for (int i = 0; i < nx_; ++i) {
      const float v = row[i];
      nan |= std::isnan(v);
      row[i] = std::isnan(v) ? 0.0f : v;
    }
    if (j < z_.stale_rows()) std::fill(row + nx_, row + z_.row_floats(), 0.0f);
    if (nan) has_nan = true;
  });
  if (has_nan) {
    mask_ = std::make_unique<SpectrumField>(py_, px_);
    parallel_blocks(ny_, threads, [&](int j) {
      float* row = mask_->row(j);
      for (int i = 0; i < nx_; ++i) row[i] = std::isnan(hf.z_um(j, i)) ? 0.0f : 1.0f;
    });
  }
  if (release != nullptr) release->z_um = HeightGrid();
  // The padding rows are cleared only now: with the residual gone they add nothing to the peak.
  z_.clear_stale_rows(ny_, py_, threads);
  autocorrelate_field(z_, ny_, lim_y_, threads);
  if (mask_) autocorrelate_field(*mask_, ny_, lim_y_, threads);
  r0_ = mean_product(0, 0);
}

// Lay from the Hann-windowed power spectrum: the doubled-angle mean of the wave-vector
// directions weighted by power is perpendicular to the grooves.
// Kept in double precision: the lay angle steers the profile traces, and float round-off
// would tilt an exactly symmetric spectrum by ~1e-6 deg.
void lay_from_sums(const LaySums& sums, TextureDirection& out) {
  const double c = sums.c, s = sums.s, total = sums.total;
  if (!(total > 0.0)) return;
  out.lay_strength = std::hypot(c, s) / total;
  double lay = 0.5 * std::atan2(s, c) * 180.0 / std::numbers::pi + 90.0;
  lay = std::fmod(lay, 180.0);
  if (lay < 0.0) lay += 180.0;
  out.lay_deg = lay;
}

TextureDirection direction_of(const Heightfield& residual, const Plane* remove, int threads,
                              Heightfield* release, const LaySums* lay, LargeBytes spent) {
  TextureDirection out;
  if (residual.nx < 2 || residual.ny < 2) return out;
  // The lay first: its field is freed before the larger padded one is made.
  lay_from_sums(lay != nullptr ? *lay : lay_spectrum(residual, threads, remove, &spent), out);
  // Sizes are kept: `release` may empty the residual's heights below.
  const int nx = residual.nx, ny = residual.ny;
  const double cell_mm = residual.cell_mm;
  const Acf acf(residual, remove, threads, release, std::move(spent));
  // Walk rays from the origin in steps of a quarter cell until the ACF falls to s; the reach is
  // half the field in each axis (beyond it too few pairs remain for a stable estimate).
  constexpr double kStepCells = 0.25;
  const double reach_x = 0.5 * (nx - 1), reach_y = 0.5 * (ny - 1);
  const int rays = static_cast<int>(std::ceil(180.0 / kAcfAngleStepDeg - 1e-9));
  std::vector<double> found(static_cast<size_t>(rays), -1.0), reach(static_cast<size_t>(rays));
  parallel_blocks(rays, threads, [&](int k) {
    const double a = k * kAcfAngleStepDeg;
    const double c = std::cos(a * std::numbers::pi / 180.0),
                 s = std::sin(a * std::numbers::pi / 180.0);
    const double rx = std::abs(c) > 1e-12 ? reach_x / std::abs(c) : 1e300;
    const double ry = std::abs(s) > 1e-12 ? reach_y / std::abs(s) : 1e300;
    reach[static_cast<size_t>(k)] = std::min(rx, ry);
    double prev_r = 0.0, prev_v = 1.0;
    for (double r = kStepCells; r <= reach[static_cast<size_t>(k)]; r += kStepCells) {
      const double v = acf.sample(r * c, r * s);
      if (v <= kAcfThreshold) {
        found[static_cast<size_t>(k)] =
            prev_r + (prev_v - kAcfThreshold) / (prev_v - v) * (r - prev_r);
        return;
      }
      prev_r = r;
      prev_v = v;
    }
  });
  double shortest = 1e300, longest = 0.0;
  for (int k = 0; k < rays; ++k) {
    const double f = found[static_cast<size_t>(k)];
    if (f < 0.0) {
      out.str_upper_bound = true;
      longest = std::max(longest, reach[static_cast<size_t>(k)]);
      continue;
    }
    out.sal_found = true;
    shortest = std::min(shortest, f);
    longest = std::max(longest, f);
  }
  if (out.sal_found) {
    out.sal_mm = shortest * cell_mm;
    out.str = longest > 0.0 ? shortest / longest : 0.0;
  }
  return out;
}

}  // namespace

void warm_texture_direction_plans(int nx, int ny) {
  if (nx < 2 || ny < 2) return;
  warm_lay_spectrum_plans(nx, ny);
  warm_autocorrelation_plans(padded_size(ny), padded_size(nx));
}

TextureDirection texture_direction(const Heightfield& residual, int threads) {
  return direction_of(residual, nullptr, threads, nullptr, nullptr, {});
}

TextureDirection texture_direction(const Heightfield& hf, const Plane* remove, int threads,
                                   const LaySums* lay, LargeBytes spent, Heightfield* release) {
  return direction_of(hf, remove, threads, release, lay, std::move(spent));
}

}  // namespace cuspmap

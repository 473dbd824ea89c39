// Band means (or a quantile of each band) across a direction and the pass lay that maximises the
// means' share of the variance. Inputs: Heightfield (um, mm), direction deg; output: BandMeans /
// PassLay. Cost: see header.
// Method: projection along lines (Bracewell 1995, ch. 14); between-band share (Fisher 1925).
#include "infer/band_means.h"

#include <algorithm>
#include <cmath>
#include <numbers>
#include <utility>

namespace cuspmap {
namespace {

// Bands with fewer cells than this share of the fullest band are the corners of an oblique
// field: their means rest on few, short chords (derived: a square at 45 deg keeps its central
// ~70 % of the diagonal).
constexpr double kMinBandFill = 0.3;
// Fewest bands a profile needs (a period needs a few samples and repeats; derived).
constexpr int kMinBands = 8;
// Coarse search: samples per side of the thinned grid and its angle step; the share's peak is
// about (band width / field length) rad wide, ~0.4-1 deg at 150 samples (derived).
constexpr int kCoarseSamples = 150;
constexpr double kCoarseStepDeg = 0.5;
// Refinement: samples per side at full resolution (larger fields are thinned to this), the
// candidates refined, and two rounds of steps (0.1 then 0.01 deg: a band one cell wide at 600
// cells resolves ~0.1 deg; derived).
constexpr int kFineSamples = 600;
constexpr int kCandidates = 3;

// Bands on either side of the first cell, enough for any direction.
int half_bands(const Heightfield& hf, int stride) {
  const double reach = std::hypot(hf.nx, hf.ny) * hf.cell_mm;
  return static_cast<int>(std::ceil(reach / (stride * hf.cell_mm))) + 1;
}

// Visits every `stride`-th cell of every `stride`-th row with a height, with the index of its
// band (one band `stride` cells wide across `direction_deg`; 2 half_bands + 1 of them).
// Positions from the first cell: along the grid axes every cell then falls on a whole band
// (from the centre, an even grid puts them on half bands, split by rounding).
template <typename Visit>
void visit_bands(const Heightfield& hf, double direction_deg, int stride, Visit visit) {
  const double t = direction_deg * std::numbers::pi / 180.0;
  const double ax = -std::sin(t), ay = std::cos(t);  // unit vector across the direction
  const double w = stride * hf.cell_mm;
  const double xc = hf.x_mm(0), yc = hf.y_mm(0);
  const int half = half_bands(hf, stride);
  for (int j = 0; j < hf.ny; j += stride) {
    const double dy = ay * (hf.y_mm(j) - yc);
    for (int i = 0; i < hf.nx; i += stride) {
      const float z = hf.z_um(j, i);
      if (!std::isfinite(z)) continue;
      visit(static_cast<size_t>(half + std::lround((ax * (hf.x_mm(i) - xc) + dy) / w)), z);
    }
  }
}

// Bands holding kMinBandFill of the fullest band's cells, and the longest run of them.
struct FullBands {
  std::vector<bool> full;
  size_t lo = 0, len = 0;
};

FullBands full_bands(const std::vector<long>& count) {
  FullBands f;
  const long fullest = count.empty() ? 0 : *std::max_element(count.begin(), count.end());
  f.full.assign(count.size(), false);
  if (fullest == 0) return f;
  for (size_t k = 0; k < count.size(); ++k) {
    f.full[k] = count[k] > 0 && static_cast<double>(count[k]) >= kMinBandFill * fullest;
  }
  for (size_t k = 0; k < count.size();) {
    if (!f.full[k]) {
      ++k;
      continue;
    }
    size_t e = k;
    while (e < count.size() && f.full[e]) ++e;
    if (e - k > f.len) f.lo = k, f.len = e - k;
    k = e;
  }
  return f;
}

}  // namespace

double lay_wrap_deg(double deg) {
  double a = std::fmod(deg, 180.0);
  if (a < 0.0) a += 180.0;
  return a >= 180.0 ? 0.0 : a;  // -1e-15 wraps to 180.0 in double
}

double lay_gap_deg(double a_deg, double b_deg) {
  return std::abs(lay_wrap_deg(a_deg - b_deg + 90.0) - 90.0);
}

BandMeans band_means(const Heightfield& hf, double direction_deg, int stride) {
  BandMeans b;
  if (hf.nx <= 0 || hf.ny <= 0 || !(hf.cell_mm > 0.0)) return b;  // no cells (an empty fit)
  stride = std::max(stride, 1);
  const size_t bands = 2 * static_cast<size_t>(half_bands(hf, stride)) + 1;
  std::vector<double> sum(bands, 0.0), sq(bands, 0.0);
  std::vector<long> count(bands, 0);
  visit_bands(hf, direction_deg, stride, [&](size_t k, float z) {
    sum[k] += z;
    sq[k] += static_cast<double>(z) * z;
    ++count[k];
  });
  const FullBands f = full_bands(count);
  if (f.len == 0) return b;
  // Share over the qualifying bands: between-band sum of squares / total sum of squares.
  double n = 0.0, s = 0.0, ss = 0.0, between = 0.0;
  for (size_t k = 0; k < sum.size(); ++k) {
    if (!f.full[k]) continue;
    n += count[k];
    s += sum[k];
    ss += sq[k];
  }
  const double grand = s / n, total = ss - n * grand * grand;
  for (size_t k = 0; k < sum.size(); ++k) {
    if (!f.full[k]) continue;
    const double m = sum[k] / count[k] - grand;
    between += count[k] * m * m;
  }
  b.share = total > 0.0 ? std::clamp(between / total, 0.0, 1.0) : 0.0;
  // The profile: the longest run of qualifying bands.
  if (static_cast<int>(f.len) < kMinBands) return b;
  b.spacing_mm = stride * hf.cell_mm;
  for (size_t k = f.lo; k < f.lo + f.len; ++k) b.z_um.push_back(sum[k] / count[k]);
  return b;
}

BandMeans band_quantiles(const Heightfield& hf, double direction_deg, double quantile) {
  BandMeans b;
  if (hf.nx <= 0 || hf.ny <= 0 || !(hf.cell_mm > 0.0)) return b;
  const size_t bands = 2 * static_cast<size_t>(half_bands(hf, 1)) + 1;
  std::vector<std::vector<float>> cells(bands);
  visit_bands(hf, direction_deg, 1, [&](size_t k, float z) { cells[k].push_back(z); });
  std::vector<long> count(bands);
  for (size_t k = 0; k < bands; ++k) count[k] = static_cast<long>(cells[k].size());
  const FullBands f = full_bands(count);
  if (static_cast<int>(f.len) < kMinBands) return b;
  b.spacing_mm = hf.cell_mm;
  for (size_t k = f.lo; k < f.lo + f.len; ++k) {
    std::vector<float>& v = cells[k];
    const auto at = static_cast<std::ptrdiff_t>(std::lround(quantile * (v.size() - 1)));
    std::nth_element(v.begin(), v.begin() + at, v.end());
    b.z_um.push_back(v[static_cast<size_t>(at)]);
  }
  return b;
}

std::vector<PassLay> lay_peaks(const Heightfield& hf, int count) {
  const int side = std::max(hf.nx, hf.ny);
  const int coarse = std::max(1, side / kCoarseSamples);
  // Every direction; local maxima of the share are the candidates.
  const int steps = static_cast<int>(std::lround(180.0 / kCoarseStepDeg));
  std::vector<double> share(static_cast<size_t>(steps));
  for (int a = 0; a < steps; ++a) share[a] = band_means(hf, a * kCoarseStepDeg, coarse).share;
  std::vector<PassLay> peaks;
  for (int a = 0; a < steps; ++a) {
    const double l = share[(a + steps - 1) % steps], r = share[(a + 1) % steps];
    if (share[a] >= l && share[a] >= r) peaks.push_back({a * kCoarseStepDeg, share[a]});
  }
  std::sort(peaks.begin(), peaks.end(),
            [](const PassLay& p, const PassLay& q) { return p.share > q.share; });
  if (peaks.size() > static_cast<size_t>(std::max(count, 0))) peaks.resize(std::max(count, 0));
  return peaks;
}

PassLay refine_lay(const Heightfield& hf, double deg) {
  const int side = std::max(hf.nx, hf.ny);
  const int fine = std::max(1, (side + kFineSamples - 1) / kFineSamples);
  double at = deg, at_share = band_means(hf, at, fine).share;
  for (const double step : {0.1, 0.01}) {
    const double centre = at;
    for (int k = -10; k <= 10; ++k) {
      if (k == 0) continue;
      const double d = centre + k * step;
      const double s = band_means(hf, d, fine).share;
      if (s > at_share) at = d, at_share = s;
    }
  }
  return {lay_wrap_deg(at), std::max(at_share, 0.0)};
}

PassLay pass_lay(const Heightfield& hf, const std::vector<PassLay>& peaks,
                 std::optional<double> hint_deg) {
  std::vector<double> starts;
  for (size_t k = 0; k < peaks.size() && k < static_cast<size_t>(kCandidates); ++k) {
    starts.push_back(peaks[k].lay_deg);
  }
  if (hint_deg) starts.push_back(*hint_deg);
  PassLay best{0.0, -1.0};
  for (const double deg : starts) {
    const PassLay r = refine_lay(hf, deg);
    if (r.share > best.share) best = r;
  }
  best.share = std::max(best.share, 0.0);
  return best;
}

ProfileTrace smoothed_band_profile(const BandMeans& bands) {
  ProfileTrace profile;
  profile.spacing_mm = bands.spacing_mm;
  const int nb = static_cast<int>(bands.z_um.size());
  for (int i = 0; i + kBandSmoothCells <= nb; ++i) {
    double sum = 0.0;
    for (int k = 0; k < kBandSmoothCells; ++k) sum += bands.z_um[i + k];
    profile.z_um.push_back(sum / kBandSmoothCells);
  }
  return profile;
}

}  // namespace cuspmap

// The passes' lay among the rows of a tooth-mark lattice (see the header). Marks repeat every f
// along the feed and every (d, s) from pass to pass; along the passes the traces repeat at f
// and the band means at s, along any other row v at |v| >= s and f s / |v| <= f: only the
// passes repeat along shorter than across when s > f (derived; docs/diagnose.md).
#include "infer/lay_lattice.h"

#include <algorithm>
#include <cmath>
#include <vector>

#include "infer/repeat_period.h"
#include "infer/surface_estimates.h"
#include "texture/extract_profiles.h"

namespace cuspmap {
namespace {

// Traces along a candidate (a mean ACF of 64 lines shows the feed marks' repeat; the lay's
// own reading uses every line).
constexpr int kRowTraces = 64;
// Peaks closer than this to the best are its own shoulder (the share peak is ~1 deg wide on
// a 600-cell field; derived).
constexpr double kSamePeakDeg = 2.0;

}  // namespace

BandRepeat band_repeat(const BandMeans& bands) {
  BandRepeat r;
  const ProfileTrace profile = smoothed_band_profile(bands);
  r.samples = static_cast<int>(profile.z_um.size());
  r.acf = mean_autocorrelation({profile}, 3 * r.samples / 4);
  r.period = comb_period(r.acf, bands.spacing_mm, kBandSmoothCells, r.samples / kMinPeriodsInField);
  return r;
}

LayRepeats lay_repeats(const Heightfield& residual, double lay_deg) {
  LayRepeats r;
  const BandMeans bands = band_means(residual, lay_deg);
  if (!bands.z_um.empty()) {
    const BandRepeat across = band_repeat(bands);
    if (across.samples > 2 * kBandSmoothCells && across.period.found) {
      r.across_mm = across.period.period_mm;
    }
  }
  const std::vector<ProfileTrace> along = extract_profiles(residual, lay_deg, kRowTraces, 0.0);
  size_t longest = 0;
  for (const ProfileTrace& t : along) longest = std::max(longest, t.z_um.size());
  if (longest >= 16) {
    const RepeatPeriod p = repeat_period(
        mean_autocorrelation(along, static_cast<int>(longest / 2)), along.front().spacing_mm);
    if (p.found) r.along_mm = p.period_mm;
  }
  return r;
}

std::optional<PassLay> passes_among_rows(const Heightfield& residual, const PassLay& best,
                                         const std::vector<PassLay>& peaks) {
  if (lay_repeats(residual, best.lay_deg).passes_like()) return std::nullopt;
  for (const PassLay& peak : peaks) {
    if (lay_gap_deg(peak.lay_deg, best.lay_deg) < kSamePeakDeg) continue;
    if (peak.share < kMinRowShareRatio * best.share) break;  // strongest first
    const PassLay refined = refine_lay(residual, peak.lay_deg);
    if (refined.share < kMinRowShareRatio * best.share) continue;
    if (lay_repeats(residual, refined.lay_deg).passes_like()) return refined;
  }
  return std::nullopt;
}

}  // namespace cuspmap

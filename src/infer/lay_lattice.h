// The passes' lay among the rows of a tooth-mark lattice: on a dished flat floor the marks of
// successive passes line up along other directions too, and those rows can carry more of the
// band means' variance than the passes. Inputs: Heightfield um over mm cells (plane removed),
// share peaks deg; output: the passes' lay deg, or none. Method: derived in docs/diagnose.md
// "Lay among the marks' rows" (a 2-D lattice with basis (f, 0), (d, s); ACF repeats, Box &
// Jenkins ch. 2).
#pragma once

#include <optional>
#include <vector>

#include "core/heightfield.h"
#include "infer/band_means.h"
#include "infer/repeat_period.h"

namespace cuspmap {

/// A share peak must keep this share of the best peak's to be taken for the passes instead
/// (common practice, no source: the passes of seed 2030 tc4's floor keep 0.57 of a mark row's
/// share; a ball floor's rows off the lay keep under 0.02 of the passes').
inline constexpr double kMinRowShareRatio = 0.25;

/// The across-lay repeat of a band profile (band means or quantiles): the profile smoothed over
/// kBandSmoothCells, its mean ACF to 3/4 of its length (one clean profile keeps a quarter of its
/// pairs there), combed for periods up to 1 / kMinPeriodsInField of it (the stepover's reading).
struct BandRepeat {
  std::vector<double> acf;  ///< of the smoothed profile, lag in band spacings
  RepeatPeriod period;      ///< the comb's
  int samples = 0;          ///< length of the smoothed profile
};
BandRepeat band_repeat(const BandMeans& bands);

/// Repeats across and along one direction.
struct LayRepeats {
  double across_mm = 0.0;  ///< period of the smoothed band means (0 = none found)
  double along_mm = 0.0;   ///< first repeat of traces along the direction (0 = none found)
  /// The passes' signature: both found and the along repeat (the feed) the shorter.
  bool passes_like() const { return across_mm > 0.0 && along_mm > 0.0 && along_mm < across_mm; }
};

/// Across: comb period of the smoothed band means (as the stepover is read); along: first clear
/// repeat of the mean ACF of up to 64 traces along `lay_deg`.
LayRepeats lay_repeats(const Heightfield& residual, double lay_deg);

/// Share peaks passes_among_rows examines (lattice rows of low order; the passes were the
/// 3rd on seed 2030 tc4's floor).
inline constexpr int kRowPeaks = 8;

/// When `best` (the largest share) does not look like passes (LayRepeats::passes_like), the
/// strongest other of `peaks` (lay_peaks, strongest first) that does and keeps
/// kMinRowShareRatio of its share, refined; none when `best` looks like passes or no peak
/// qualifies.
std::optional<PassLay> passes_among_rows(const Heightfield& residual, const PassLay& best,
                                         const std::vector<PassLay>& peaks);

}  // namespace cuspmap

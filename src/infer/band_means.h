// The floor projected along a direction: the mean height of every band one cell wide across it
// (the across-lay profile of the passes with the feed marks averaged out; or each band's low
// quantile, the marks' bottoms), the share of the height variance those band means carry, and the
// direction that maximises it (the pass lay).
// Inputs: Heightfield um over mm cells (NaN = missing, plane removed); output: BandMeans, PassLay.
// Cost O(cells) per direction (a quantile: nth_element per band), O(cells * ~120) for the lay
// search (coarse grid, then refined).
// Method: projection along lines (Radon transform, Bracewell, Two-Dimensional Imaging, 1995,
// ch. 14) scored by the between-band share of the variance (one-way ANOVA, Fisher 1925).
#pragma once

#include <optional>
#include <vector>

#include "core/heightfield.h"
#include "texture/extract_profiles.h"

namespace cuspmap {

/// Smallest share of the height variance the band means must carry for a direction to count as
/// the pass lay (derived: independent noise gives bands/cells ~ 0.002-0.01 on a 64-600 cell field;
/// dished flat floors, whose tooth arcs dominate, give 0.07-0.3, ball floors ~1).
inline constexpr double kMinPassLayShare = 0.03;

/// A line direction in [0, 180) deg (a lay has no sense).
double lay_wrap_deg(double deg);

/// Angle between two line directions, deg in [0, 90].
double lay_gap_deg(double a_deg, double b_deg);

/// Band means across a direction.
struct BandMeans {
  std::vector<double> z_um;   ///< mean height of each band, in order across (+90 deg side last)
  double spacing_mm = 0.0;    ///< band width (the cell size times the stride)
  double share = 0.0;         ///< between-band variance / total variance of the cells used, 0..1
};

/// Projects `hf` along `direction_deg`: bands of `stride` cells across it, every `stride`-th
/// cell of each row and column used; bands holding fewer than 30 % of the fullest band's cells
/// (the corners of an oblique field) are left out and the profile is the longest run of the rest.
/// @param[in] hf             heights um (NaN = missing), best with its plane removed
/// @param[in] direction_deg  pass direction, deg from +X
/// @param[in] stride         sampling step in cells (>= 1)
/// @return empty z_um when fewer than 8 bands qualify
BandMeans band_means(const Heightfield& hf, double direction_deg, int stride = 1);

/// The same bands one cell wide, each given the `quantile` of its heights instead of their mean
/// (share left 0): a low quantile follows the bottoms of the feed marks, which lie on the
/// cutter's swept envelope whatever the spindle phase of each pass, where the mean also carries
/// how neighbouring passes' marks overlap (a phase that changes from pass to pass).
/// @param[in] quantile  0..1 (0 = the lowest height of each band)
/// @return empty z_um when fewer than 8 bands qualify
BandMeans band_quantiles(const Heightfield& hf, double direction_deg, double quantile);

/// The direction whose band means carry the largest share of the variance.
struct PassLay {
  double lay_deg = 0.0;  ///< [0, 180)
  double share = 0.0;    ///< BandMeans::share at that direction
};

/// Local maxima of the share over every direction on a thinned grid (0.5 deg steps), strongest
/// first, at most `count`.
std::vector<PassLay> lay_peaks(const Heightfield& hf, int count);

/// A direction refined to 0.01 deg at full resolution (0.1 then 0.01 deg steps around `deg`).
PassLay refine_lay(const Heightfield& hf, double deg);

/// The direction of largest share: the three strongest of `peaks` and `hint_deg` (e.g. the
/// spectral lay), each refined (refine_lay).
/// @param[in] hf        heights um (NaN = missing), plane removed
/// @param[in] peaks     lay_peaks of `hf`, strongest first
/// @param[in] hint_deg  an extra candidate direction, deg
PassLay pass_lay(const Heightfield& hf, const std::vector<PassLay>& peaks,
                 std::optional<double> hint_deg);

/// Band means are smoothed over this many cells before their period is sought (derived: the
/// box keeps 64 % of a fundamental 10 cells long, and removes the grid's aliasing of tooth arcs
/// a few cells apart; measured on 0.02 mm grids of 0.08 mm feed marks).
inline constexpr int kBandSmoothCells = 5;

/// The band means under a moving average of kBandSmoothCells (the tooth arcs sampled by the
/// grid leave cell-scale spikes in them whose ACF hides the passes' repeat), as one trace.
ProfileTrace smoothed_band_profile(const BandMeans& bands);

}  // namespace cuspmap

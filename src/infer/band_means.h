// The floor projected along a direction: the mean height of every band one cell wide across it
// (the across-lay profile of the passes with the feed marks averaged out), the share of the
// height variance those band means carry, and the direction that maximises it (the pass lay).
// Inputs: Heightfield um over mm cells (NaN = missing, plane removed); output: BandMeans, PassLay.
// Cost O(cells) per direction, O(cells * ~120) for the lay search (coarse grid, then refined).
// Method: projection along lines (Radon transform, Bracewell, Two-Dimensional Imaging, 1995,
// ch. 14) scored by the between-band share of the variance (one-way ANOVA, Fisher 1925).
#pragma once

#include <optional>
#include <vector>

#include "core/heightfield.h"

namespace cuspmap {

/// Smallest share of the height variance the band means must carry for a direction to count as
/// the pass lay (derived: independent noise gives bands/cells ~ 0.002-0.01 on a 64-600 cell field;
/// dished flat floors, whose tooth arcs dominate, give 0.07-0.3, ball floors ~1).
inline constexpr double kMinPassLayShare = 0.03;

/// A line direction in [0, 180) deg (a lay has no sense).
double lay_wrap_deg(double deg);

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

/// The direction whose band means carry the largest share of the variance.
struct PassLay {
  double lay_deg = 0.0;  ///< [0, 180)
  double share = 0.0;    ///< BandMeans::share at that direction
};

/// Searches every direction (1 deg on a thinned grid, then refined to 0.05 deg at full
/// resolution around the best candidates and around `hint_deg`, e.g. the spectral lay).
/// @param[in] hf        heights um (NaN = missing), plane removed
/// @param[in] hint_deg  an extra candidate direction, deg
PassLay pass_lay(const Heightfield& hf, std::optional<double> hint_deg);

}  // namespace cuspmap

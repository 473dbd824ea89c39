// The profile a stylus of tip radius r reports: the morphological closing of the profile by a
// disk (the tip) resting on it from above, which bridges valleys narrower than the tip.
// Inputs: heights um, spacing mm, tip radius um; output: closed heights um (>= input). Cost
// O(n * r / spacing). Method: ISO 16610-41:2015 (morphological profile filters: closing with a
// disk structuring element); ISO 3274:1996 §4.4 (nominal tip radii 2, 5, 10 um).
#pragma once

#include <span>
#include <vector>

namespace cuspmap {

/// The ISO 3274 nominal stylus tip radii, um (2, 5 and 10 um; ISO 3274:1996 §4.4.1).
inline constexpr double kNominalTipRadiiUm[] = {2.0, 5.0, 10.0};

/// Closes a profile with a disk of radius `tip_um`: dilation by the tip's lower half-circle
/// (the height of the tip's lowest point when it rests on the profile), then erosion by the same
/// element (the lower envelope of the tip at every resting position). The disk is placed only
/// where its offsets land on samples, so the first and last samples see a one-sided element.
/// @param[in] z_um     heights, equally spaced, finite (an empty profile returns empty)
/// @param[in] spacing_mm  sample spacing, > 0
/// @param[in] tip_um   tip radius, >= 0 (0 returns the profile unchanged)
/// @return closed heights, same length; every value >= the input's at that sample
std::vector<double> stylus_closing(std::span<const double> z_um, double spacing_mm, double tip_um);

}  // namespace cuspmap

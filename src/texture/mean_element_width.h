// Mean width of the profile elements (RSm, PSm, WSm) with the standard's height and width
// discrimination. Inputs: heights um about the mean line, spacing mm; output: width mm.
// Cost O(n + e log e) for e zero crossings.
// Method: ISO 4287:1997 §3.2.2 (profile element), §3.1.9 (height/width discrimination:
// defaults 10 % of Rz and 1 % of the sampling length), §4.3.1 (RSm).
#pragma once

#include <optional>
#include <span>

namespace cuspmap {

/// Height discrimination as a fraction of Rz (Pz, Wz): ISO 4287:1997 §3.1.9 default.
inline constexpr double kHeightDiscriminationOfRz = 0.10;
/// Width discrimination as a fraction of the sampling length: ISO 4287:1997 §3.1.9 default.
inline constexpr double kWidthDiscriminationOfSamplingLength = 0.01;

/// Mean width of the profile elements (a profile peak plus the adjacent valley, bounded by
/// crossings of the mean line z = 0). Peaks or valleys lower than `min_height_um` or narrower
/// than `min_width_mm` are merged into the neighbouring valley or peak (smallest first); the
/// partial parts before the first and after the last crossing are not elements.
/// @param[in] z_um          heights about the mean line, equally spaced, finite
/// @param[in] spacing_mm    sample spacing, > 0
/// @param[in] min_height_um height discrimination (>= 0)
/// @param[in] min_width_mm  width discrimination (>= 0)
/// @return the mean element width in mm, or nullopt when no complete element remains
std::optional<double> mean_element_width(std::span<const double> z_um, double spacing_mm,
                                         double min_height_um, double min_width_mm);

}  // namespace cuspmap

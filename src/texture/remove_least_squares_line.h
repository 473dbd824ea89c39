// Form removal for a profile: subtracts its least-squares straight line (the F-operator for a
// nominally straight profile). Inputs/outputs: heights um at equal spacing. Cost O(n).
// Method: ordinary least squares (ISO 4287:1997 §3.1.6 primary profile after form removal).
#pragma once

#include <span>

namespace cuspmap {

/// Subtracts the least-squares line through the samples (index as abscissa) in place.
/// @param[in,out] z_um equally spaced heights; 0 or 1 sample: the mean is removed
void remove_least_squares_line(std::span<double> z_um);

}  // namespace cuspmap

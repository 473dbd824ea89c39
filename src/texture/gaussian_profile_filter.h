// ISO 16610-21 Gaussian profile filter: the mean line of a sampled profile for a cut-off
// wavelength, with the kernel renormalised where it runs past the profile's ends.
// Inputs: heights um at equal spacing mm; output: mean line um. Cost O(n * cutoff / spacing).
// Method: ISO 16610-21:2011 weighting function s(x) = exp(-pi (x / (alpha lc))^2) / (alpha lc).
#pragma once

#include <span>
#include <vector>

namespace cuspmap {

/// alpha = sqrt(ln 2 / pi): makes the filter pass 50 % of a sine whose wavelength is the cut-off
/// (ISO 16610-21:2011 §4.2).
inline constexpr double kGaussianAlpha = 0.46971863934982566;

/// Kernel half-width in cut-offs. The weight beyond +-1 lc is exp(-pi / alpha^2) ~ 6.5e-7 of the
/// peak and the lost area 1e-7 of the total, far below any height resolution; wider kernels only
/// cost time.
inline constexpr double kGaussianTruncationCutoffs = 1.0;

/// The ISO 16610-21 weighting function s(x) = exp(-pi (x/(alpha lc))^2) / (alpha lc), in 1/mm.
/// @param[in] x_mm       distance from the kernel centre, mm
/// @param[in] cutoff_mm  cut-off wavelength lc (or lambda-s), mm, > 0
double gaussian_weight(double x_mm, double cutoff_mm);

/// Gaussian mean line of a profile: each output is the weighted mean of the samples within
/// +-kGaussianTruncationCutoffs * cutoff, weights normalised over the samples that exist (so a
/// point near an end averages only what was measured; callers drop cutoff/2 at each end).
/// @param[in] z_um       profile heights, equally spaced, finite
/// @param[in] spacing_mm sample spacing, > 0
/// @param[in] cutoff_mm  cut-off wavelength, > 0; a cut-off below one spacing returns z unchanged
/// @return mean line, same length as z
std::vector<double> gaussian_profile_filter(std::span<const double> z_um, double spacing_mm,
                                            double cutoff_mm);

/// Amplitude transmission of the continuous ISO 16610-21 filter's mean line for a sine of the
/// given wavelength: exp(-pi (alpha lc / lambda)^2). The roughness profile passes 1 minus this.
/// @param[in] wavelength_mm sine wavelength, > 0; @param[in] cutoff_mm cut-off, > 0
double gaussian_transmission(double wavelength_mm, double cutoff_mm);

}  // namespace cuspmap

// Periodic or not: the test that decides whether ISO 4288 picks the cut-off by RSm (periodic)
// or by Ra (non-periodic). Inputs: profile traces (um); output: verdict, ACF peak and period.
// Cost O(n log n) per trace tested (FFT).
// Method: normalised autocorrelation of the form-removed profile (Whitehouse, Handbook of Surface
// and Nanometrology, 2011, ch. 2: a periodic profile's ACF returns near 1 at each period); the
// threshold is common practice, no source.
#pragma once

#include <vector>

#include "texture/extract_profiles.h"

namespace cuspmap {

/// ACF peak at or above this marks a profile periodic (common practice, no source: a random
/// profile's ACF beyond its first zero stays well under 0.5; a sine with added noise of equal
/// rms still reaches 0.5).
inline constexpr double kPeriodicAcfThreshold = 0.5;

/// Traces the periodicity test looks at (evenly spread); they are alike on a machined floor.
inline constexpr int kPeriodicityTraces = 16;

/// Verdict of the autocorrelation test.
struct Periodicity {
  bool periodic = false;   ///< mean ACF peak >= kPeriodicAcfThreshold
  double acf_peak = 0.0;   ///< mean over traces of the highest ACF value past its first zero
  double period_mm = 0.0;  ///< mean lag of that peak (0 when no trace had one)
};

/// Tests each trace's ACF (unbiased estimate, lags up to half the trace): the highest value past
/// the first zero crossing is the peak; traces without a zero crossing score 0.
/// @param[in] traces finite traces; those under 8 samples are skipped
/// @return verdict; acf_peak 0 when no trace qualifies
Periodicity profile_periodicity(const std::vector<ProfileTrace>& traces);

}  // namespace cuspmap

// The repeat distance of a periodic texture along parallel traces (the stepover across the lay,
// the feed marks along it): mean autocorrelation of the traces, its first clear peak, refined
// over every repeat that fits in half the trace. Inputs: traces um at one spacing mm; output:
// RepeatPeriod mm. Cost O(traces * n * max_lag). Method: unbiased sample autocorrelation (Box &
// Jenkins, Time Series Analysis, ch. 2); parabolic peak interpolation; period = least-squares
// slope of the k-th peak's lag against k.
#pragma once

#include <vector>

#include "texture/extract_profiles.h"

namespace cuspmap {

/// A peak of the normalised autocorrelation below this is no repeat (common practice, no
/// source: white noise stays within +-2/sqrt(n) ~ 0.1 for n = 400 samples; 0.25 leaves a margin).
inline constexpr double kMinRepeatPeak = 0.25;

/// Mean autocorrelation of traces, normalised to 1 at lag 0: each trace detrended (least-squares
/// line), products summed over traces and divided by the number of pairs at each lag.
/// @param[in] traces   traces of one spacing (runs shorter than max_lag + 2 samples add only
///                     the lags they hold)
/// @param[in] max_lag  largest lag in samples (>= 1)
/// @return max_lag + 1 values (all 0 when the traces are flat)
std::vector<double> mean_autocorrelation(const std::vector<ProfileTrace>& traces, int max_lag);

/// A repeat found in an autocorrelation.
struct RepeatPeriod {
  bool found = false;           ///< a peak >= kMinRepeatPeak exists after the first dip below 0
  double period_mm = 0.0;       ///< refined repeat distance
  double sigma_mm = 0.0;        ///< standard error of the slope fit (0 with a single repeat)
  double first_peak = 0.0;      ///< autocorrelation at the first repeat, 0..1
  double strongest_mm = 0.0;    ///< lag of the highest peak (a multiple when repeats differ)
  double strongest_peak = 0.0;  ///< autocorrelation there
  int repeats = 0;              ///< peaks used in the refinement
};

/// Finds the first clear repeat of `acf` (spacing `spacing_mm`) and refines it.
/// @param[in] acf         normalised autocorrelation (acf[0] = 1)
/// @param[in] spacing_mm  lag step
/// @param[in] min_lag     lags below this (samples) are not peaks (e.g. noise wiggles)
RepeatPeriod repeat_period(const std::vector<double>& acf, double spacing_mm, int min_lag = 2);

/// The repeat of a single profile whose autocorrelation has many local peaks (band means of a
/// dished flat floor): the period p maximising the mean ACF over its multiples p, 2p, ...
/// (a comb; Box & Jenkins' sample ACF), replaced by a submultiple p/m that keeps most of that
/// score (a multiple of the period combs as well as the period), then refined as above.
/// @param[in] acf         normalised autocorrelation (acf[0] = 1), lags up to half the profile
/// @param[in] spacing_mm  lag step
/// @param[in] min_lag     shortest period considered, samples
/// @param[in] max_period  longest period considered, samples (at most half the table)
/// @return found = false when no comb scores kMinRepeatPeak or more
RepeatPeriod comb_period(const std::vector<double>& acf, double spacing_mm, int min_lag,
                         double max_period);

/// Mean of the autocorrelation at the multiples period, 2 period, ... within the table.
/// @param[in] period  samples (> 0)
double comb_score(const std::vector<double>& acf, double period);

/// The autocorrelation at a lag of `lag_mm` (linear between samples), 0 beyond the table.
double acf_at(const std::vector<double>& acf, double spacing_mm, double lag_mm);

}  // namespace cuspmap

// The shape of the cusp a pass leaves: traces across the lay folded onto one period (the
// stepover), averaged, and a parabola fitted to the valley; its curvature gives the effective
// cutting radius (a ball's radius, or the much larger radius of a tilted or dished flat rim).
// Inputs: across-lay traces um (spacing mm), period mm; output: CuspShape (mm, um).
// Cost O(samples). Method: phase folding (epoch folding of periodic signals); least-squares
// parabola z = c0 + c1 u + c2 u^2 through the low quantile of each phase bin, each at its own
// sample's phase; the radius is the circle's whose parabola at those phases has curvature c2
// (derived: 1 / 2 c2 alone reads a circle short by 0.214 (w / R)^2 R over +-w).
#pragma once

#include <vector>

#include "texture/extract_profiles.h"

namespace cuspmap {

/// The valley window fitted, as a fraction of the period either side of the lowest point: the
/// crests (sharp, and bridged by a stylus tip) stay outside it (derived: a ball cusp's crests
/// lie half a period from the valley).
inline constexpr double kValleyWindow = 0.3;

/// Quantile of the heights in a phase bin that the valley fit follows: the feed marks' bottoms
/// lie on the cutter's swept circle, their mean does not (10 %: low enough to follow the
/// bottoms, high enough that noise of rms sigma shifts every bin alike by ~1.3 sigma; derived).
inline constexpr double kValleyQuantile = 0.1;

/// The folded profile and its fit.
struct CuspShape {
  std::vector<double> mean_um;   ///< mean height per phase bin over one period, valley first
  double bin_mm = 0.0;           ///< phase bin width
  double cusp_um = 0.0;          ///< highest minus lowest bin of the mean profile
  double valley_phase_mm = 0.0;  ///< across position of a valley, mm from the field centre,
                                 ///< modulo the period
  double radius_mm = 0.0;        ///< effective cutting radius from the valley curvature
  double radius_sigma_mm = 0.0;  ///< its standard error from the fit (residual variance; a
                                 ///< trace adds its period's, trace_estimates)
  bool curved = false;           ///< the valley curves upwards (c2 > 0): radius_mm exists
  double period_mm = 0.0;        ///< period folded on (a trace: the valleys' repeat when
                                 ///< more precise than the autocorrelation's; infer/valley_period)
  double period_sigma_mm = 0.0;  ///< its standard error (0 when not estimated here)
};

/// Folds the traces on `period_mm` and fits the valley.
/// @param[in] traces     traces across the lay, positions start_mm + i * spacing from the centre
/// @param[in] period_mm  the across-lay period (> 2 samples)
/// @param[in] detrend    remove each trace's slope first (a raw measured trace; periodic_trend);
///                       false for traces of a field whose plane is already removed, where
///                       short runs between missing points would each be shifted differently
CuspShape cusp_shape(const std::vector<ProfileTrace>& traces, double period_mm, bool detrend);

}  // namespace cuspmap

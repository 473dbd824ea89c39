// Plain verdicts from the fitted machine errors, one line each, that a machinist acts on: how far
// and which way the spindle is out of tram (or the bound when the floor only bounds it), what the
// heel does, the tram that stops the marks, and what this floor cannot tell.
// Inputs: FittedErrors, FloorFit, SurfaceEstimates, the known cutter; output: FitVerdict.
// Method: first-order tilt geometry (DESIGN.md "Geometry"): a tilt across the feed leaves a step
// s tan(tilt) between passes; the heel lifts when 2 R tan(tilt) exceeds the marks' depth.
#pragma once

#include <string>
#include <vector>

#include "infer/fit_uncertainty.h"
#include "infer/pass_visibility.h"
#include "infer/surface_estimates.h"

namespace cuspmap {

/// Step between passes that does not show, um: the tram target aims under it (common practice,
/// no source: steps below 0.1 um are under what eye and fingernail find on a machined floor).
inline constexpr double kInvisibleStepUm = 0.1;

/// Relative width of the profiled tilt interval, (hi - lo) / value, above which the tilt is
/// reported as an interval: a tilt known to 10 % (issue 17's tolerance) spans 0.2 at 1 sigma
/// (derived), so wider than that the floor fixes only a combination of tilt and direction.
inline constexpr double kIntervalOnlyWidth = 0.2;

/// What the fit tells, in words and the numbers behind them.
struct FitVerdict {
  std::vector<std::string> lines;  ///< verdicts, one sentence each
  std::vector<std::string> cannot_tell;  ///< what this floor cannot tell and why
  bool heel_lifted = false;        ///< the marks run one way only (surface estimate)
  double heel_min_tilt_deg = 0.0;  ///< with a lifted heel: tilt along the feed at least this
  double tram_target_deg = 0.0;    ///< tilt across the feed that leaves kInvisibleStepUm
  double explained = 0.0;          ///< 1 - (residual rms / measured rms)^2 over the window
  bool weak = false;               ///< explained < kWellExplained: values are rough
  bool tilt_interval_only = false;  ///< the tilt is known only as tilt_interval_deg (the ridge)
  double ridge_tilt_deg = 0.0;     ///< atan(tan(tilt) / cos^2(direction from the lay)), the
                                   ///< combination the overlapping passes' cusps fix, deg
  /// Passes that do not stand out (infer/pass_visibility) at a repeat that may be the beat of
  /// neighbouring passes' tooth arcs (infer/arc_beat): stepover and tilt not read
  /// (withhold_arc_beat).
  bool arc_beat = false;
  double arc_beat_stepover_mm = 0.0;  ///< passes this far apart would beat at the read stepover
};

/// Words for the fit.
/// @param[in] f       fitted values with standard errors
/// @param[in] fit     the fit (cutter, lay)
/// @param[in] e       surface estimates (heel, marks along the lay)
/// @param[in] passes  the passes' visibility on the fit window (infer/pass_visibility; f already
///                    widened by it)
FitVerdict fit_verdict(const FittedErrors& f, const FloorFit& fit, const SurfaceEstimates& e,
                       const PassVisibility& passes);
/// As above with the visibility measured on `fit` here.
FitVerdict fit_verdict(const FittedErrors& f, const FloorFit& fit, const SurfaceEstimates& e);

/// Marks the stepover and the tilt not read (sigma and bound infinite, not resolved) when the
/// verdict found the stepover may be a beat of tooth arcs (v.arc_beat); else leaves f alone.
void withhold_arc_beat(const FitVerdict& v, FittedErrors& f);

}  // namespace cuspmap

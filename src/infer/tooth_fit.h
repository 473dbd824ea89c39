// Tooth-resolved second stage of the floor fit: radial runout (magnitude, and its phase modulo
// 360 / Z), end-face dish, and the tilt along the feed with its sign, from the feed marks of a
// flat or bull-nose floor. Inputs: measured Heightfield (um over mm cells), the envelope
// stage's lay, stepover, pass offset and tilt, the known teeth and feed per tooth; output:
// ToothFit with standard errors. Cost: ~10^2-10^3 one-pass sweeps of a <= 40 000-cell window.
// Method: least squares on the tooth-resolved sweep (Kline & DeVor 1983 runout model), one
// start shift per pass as nuisance, Levenberg-Marquardt; covariance sigma^2 (J^T J)^-1 scaled
// by m / m_eff (Bates & Watts 1988; Box & Jenkins §2.1.6).
#pragma once

#include <string>

#include "core/heightfield.h"
#include "infer/fit_uncertainty.h"
#include "infer/floor_fit.h"
#include "infer/tooth_marks.h"
#include "infer/tooth_pass_offset.h"
#include "path/path_spec.h"
#include "tool/cutter.h"

namespace cuspmap {

/// Cells of the tooth window (a one-pass sweep of 40 000 cells takes ~10-20 ms; derived budget
/// for a fit of a few hundred sweeps within seconds on 2 cores).
inline constexpr int kToothFitCells = 40000;
/// Revolutions along the lay the window spans at least (every tooth's mark three times).
inline constexpr double kToothFitRevolutions = 3.0;
/// The along-feed sign is known when the other sign's best cost exceeds the best by this many
/// residual variances (scaled by m / m_eff): 3 sigma of one parameter (Bates & Watts 1988 §6.1).
inline constexpr double kSignSigmas = 3.0;

/// The fit reproduces the tooth marks when its smoothed residual rms is under this fraction of
/// the smoothed measured marks' rms (plane removed both): above it the solver stopped in a wrong
/// basin and no runout, phase, dish or along-feed sign is reported (derived: a fit that
/// flattens the marks, as the old 0.05 deg for 1 deg of dish, has a ratio near 1; one that
/// explains under 3/4 of the marks' variance has them misplaced; the damaged round trip's fit
/// measured 0.18).
inline constexpr double kToothFitMaxResidualRatio = 0.5;

/// What the tooth stage knows.
struct ToothFitOptions {
  Cutter cutter;                 ///< shape, diameter, corner, teeth (Z >= 1); dish is fitted
  double feed_per_tooth_mm = 0;  ///< fz > 0
  SpindleDirection spindle = SpindleDirection::Cw;  ///< rotation sense
  RasterDirection direction = RasterDirection::OneWay;  ///< pass pattern
  int threads = 0;               ///< sweep threads (0 = all)
};

/// Where the envelope stage left the passes (start values).
struct ToothFitStart {
  double lay_deg = 0.0;          ///< pass direction, deg from +X
  double stepover_mm = 1.0;      ///< held fixed
  double pass_centre_mm = 0.0;   ///< a pass centre's position across the lay (x,y) . n, mm
  double tilt_along_deg = 0.0;   ///< magnitude (the envelope folds its sign), deg
  double tilt_across_deg = 0.0;  ///< + toward lay + 90 deg
  /// The envelope's own along-feed magnitude, deg (uncapped): a second estimator; the tooth
  /// stage's along magnitude takes their difference into its sigma. Negative: not known.
  double envelope_along_deg = -1.0;
};

/// The tooth stage's result.
struct ToothFit {
  bool ran = false;              ///< false: skipped, `skipped` says why
  std::string skipped;           ///< reason (one line) when not run
  int teeth = 0;                 ///< Z
  double feed_per_tooth_mm = 0;  ///< fz used
  FittedValue runout_um;         ///< e (or |e cos psi| when projection_only), um
  FittedValue runout_phase_deg;  ///< psi modulo runout_phase_period_deg (Z >= 3)
  double runout_phase_period_deg = 0.0;  ///< 360 / Z
  bool runout_projection_only = false;   ///< Z <= 2: only |e cos psi| shows
  FittedValue dish_deg;          ///< end-face dish of the flat part, deg
  FittedValue tilt_along_deg;    ///< signed: + = lowest point ahead on passes along +lay
  FittedValue tilt_across_deg;   ///< + toward lay + 90 deg
  bool along_sign_known = false; ///< the other sign fits worse by kSignSigmas
  double along_sign_cost_sigmas = 0.0;  ///< (cost of the other sign - best) / variance, scaled
  double runout_basin_sigmas = 0.0;  ///< (best cost of the runout scan's other phases - best) /
                                     ///< variance, scaled; inf when no other phase was solved
  double residual_rms_um = 0.0;  ///< measured - simulated over the window, plane removed
                                 ///< (unsmoothed: the rim's steps a cell off count in full)
  double measured_rms_um = 0.0;  ///< measured window about its plane
  double correlation_factor = 1.0;  ///< m / m_eff of the residual
  double smoothed_residual_ratio = 0.0;  ///< smoothed residual rms / smoothed measured rms
  bool runout_not_read = false;  ///< runout and phase not read: Z <= 2, an unbounded covariance
                                 ///< or another phase fits within kSignSigmas^2 variances
                                 ///< (values for reference only, docs/diagnose.md)
  bool marks_misfit = false;     ///< marks seen but smoothed_residual_ratio above
                                 ///< kToothFitMaxResidualRatio: runout, phase, dish and the
                                 ///< along-feed sign are then not resolved (no value given)
  ToothMarks marks;              ///< the window's feed marks before any sweep: when not seen
                                 ///< the stage stops there (no sweep; an undished, untilted
                                 ///< flat), dish bounded by the marks' detection limit
  MarksPassOffset marks_offset;  ///< the marks' own pass axis (infer/tooth_pass_offset)
  bool offset_from_marks = false;  ///< the start's pass centre is the marks' (the envelope's
                                   ///< lay more than 1/16 stepover off it)
  int samples = 0;               ///< finite samples in the window
  int passes = 0;                ///< passes that cut the window
  int sweeps = 0;                ///< one-pass sweeps run
};

/// The envelope stage's passes and tilt as the tooth stage's start (pass centre from the
/// envelope window's centre and offset).
ToothFitStart tooth_fit_start(const FloorFit& fit);

/// Runs the tooth stage (or says why not in `skipped`).
/// @param[in] hf  measured heights, um over mm cells (NaN = missing)
/// @param[in] s   envelope stage's pass geometry and tilt
/// @param[in] o   known cutter, teeth, feed per tooth
ToothFit fit_teeth(const Heightfield& hf, const ToothFitStart& s, const ToothFitOptions& o);

}  // namespace cuspmap

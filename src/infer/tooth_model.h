// Tooth-resolved forward model of the second fit stage: the floor each straight pass leaves on a
// full-resolution window, tooth by tooth, for trial runout, dish and along-feed tilt and a
// per-pass start shift (the spindle phase at a pass start, unknown on a measured floor).
// Inputs: the envelope fit's passes (lay, stepover, offset, across tilt), teeth, feed per tooth
// (mm); output: heights um per pass. Cost: one tooth-resolved sweep of one pass over the window.
// Method: the project's tooth-resolved sweep (sweep/simulate_floor, Kline & DeVor 1983 runout).
#pragma once

#include <Eigen/Core>
#include <vector>

#include "core/heightfield.h"
#include "path/path_spec.h"
#include "tool/cutter.h"

namespace cuspmap {

/// What stays fixed in the tooth-resolved fit.
struct ToothModel {
  Cutter cutter;                 ///< known shape, diameter, corner, teeth (Z)
  double lay_deg = 0.0;          ///< pass direction, deg from +X
  double stepover_mm = 1.0;      ///< from the envelope fit
  double offset_mm = 0.0;        ///< a pass centre's across-lay position from the window centre
  double feed_per_tooth_mm = 0.05;  ///< fz > 0
  SpindleDirection spindle = SpindleDirection::Cw;  ///< rotation sense (M3 = cw)
  Patch window;                  ///< sample grid at the measured cells
  int threads = 0;               ///< sweep threads (0 = all)
  /// Passes reaching the window, in order across the lay: index k (offset + k stepover) and
  /// sense (+1 along +lay, -1 against it).
  std::vector<int> pass_index;
  std::vector<int> pass_sense;

  /// Feed per revolution Z fz, mm: the along-lay period of a pass's marks with runout.
  double revolution_mm() const { return cutter.teeth * feed_per_tooth_mm; }
};

/// The global parameters of the tooth-resolved fit.
struct ToothParams {
  double runout_cos_um = 0.0;  ///< e cos(psi): runout along tooth 0 (psi = phase ahead of it), um
  double runout_sin_um = 0.0;  ///< e sin(psi), um
  double dish_deg = 0.0;       ///< end-face dish of the flat part, deg (>= 0 used)
  double tilt_along_deg = 0.0; ///< signed: + = lowest point ahead of passes along +lay
  double tilt_across_deg = 0.0;  ///< + toward lay + 90 deg
};

/// Lists the passes whose cutter can reach the window (k from the offset), senses alternating
/// for zigzag with `zigzag_parity` choosing which k runs along +lay (k even when 0).
void place_passes(ToothModel& model, RasterDirection direction, int zigzag_parity);

/// The cutter with the trial runout, dish and tilt.
Cutter tooth_cutter(const ToothModel& model, const ToothParams& g);

/// Floor one pass leaves over the window, um (NaN where it does not reach). The pass starts
/// `shift_mm` (0 .. Z fz) before its usual start with tooth 0 at spindle angle 0: a shift of s
/// moves the pass's marks s along its feed, the nuisance the spindle phase is.
/// @param[in] pass  index into model.pass_index
Heightfield simulate_tooth_pass(const ToothModel& model, const Cutter& cutter, int pass,
                                double shift_mm);

/// Cell-wise minimum of per-pass floors (NaN = not reached), the floor of all passes together
/// (the sweep's lower envelope over moves).
void min_into(const Heightfield& pass_floor, Heightfield& floor);

}  // namespace cuspmap

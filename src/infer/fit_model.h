// Forward model of the inverse simulation: the floor a raster of straight passes leaves on a
// (decimated) window of a measured floor, for trial machine errors. Inputs: known cutter, lay,
// pass direction, window grid (mm); parameters: tilt along/across the feed (deg), stepover (mm),
// pass offset (mm). Output: heights um at the window's sample points. Cost: one sweep.
// Method: the project's own sweep (sweep/simulate_floor: exact envelope of the revolving cutter,
// or tooth by tooth) used as a black box, DESIGN.md "Geometry".
#pragma once

#include <Eigen/Core>

#include "core/heightfield.h"
#include "path/path_spec.h"
#include "sweep/simulate_floor.h"
#include "tool/cutter.h"

namespace cuspmap {

/// Index of each fitted parameter in the parameter vector.
enum FitParam : int {
  kTiltAlongDeg = 0,   ///< tilt component along the feed (+ = lowest point ahead of passes
                       ///< running along +lay), deg
  kTiltAcrossDeg = 1,  ///< tilt component across the feed (+ = toward lay + 90 deg), deg
  kStepoverMm = 2,     ///< distance between passes, mm
  kOffsetMm = 3,       ///< across-lay position of a pass centre from the window centre, mm
  kFitParams = 4,      ///< number of parameters
};

/// What stays fixed while the parameters vary.
struct FitModel {
  Cutter cutter;                ///< known shape, diameter, corner, dish, teeth, runout
  double lay_deg = 0.0;         ///< pass direction, deg from +X
  RasterDirection direction = RasterDirection::OneWay;  ///< one-way or zigzag
  CutSpec cut;                  ///< rpm and feed (tooth-resolved model only)
  bool tooth_marks = false;     ///< tooth-resolved (true) or revolving envelope (false)
  Patch window;                 ///< sample grid: cell centres at the measured sample points
  int threads = 0;              ///< sweep threads (0 = all)
};

/// The cutter of the model with the trial tilt applied (magnitude and direction from the two
/// components; first-order tilt model, |tilt| clamped to kMaxTiltDeg).
Cutter fitted_cutter(const FitModel& model, const Eigen::VectorXd& p);

/// Passes along the lay at offset + k * stepover across it, covering the window plus the tool
/// radius, each long enough to enter and leave the window fully; zigzag alternates the sense.
/// @param[in] model  lay, direction, window, cutter radius
/// @param[in] p      parameters (kFitParams), stepover > 0
Toolpath fit_passes(const FitModel& model, const Eigen::VectorXd& p);

/// The model's floor as a profile across the lay: straight passes longer than the window leave a
/// floor constant along them (derived: the revolving envelope of a line move), so one strip one
/// cell wide across the passes holds it at every window sample (not for tooth_marks models).
struct FitProfile {
  Heightfield strip;       ///< 1 x n cells along Y (passes along +X), um (NaN where no pass)
  double v0_mm = 0.0;      ///< across-lay coordinate of the strip's first cell centre, mm
  /// Height at across-lay coordinate v (mm; as across_lay_mm), linearly interpolated; NaN
  /// where no pass reached.
  double at(double v_mm) const;
};

/// Strip cells per window sample: linear interpolation between strip cells then errs by at most
/// (slope jump at a crest) x cell / 4, under 0.005 um at the round trips' 3 um/mm slope jumps
/// and 0.06 mm samples (derived).
inline constexpr int kProfileCellsPerSample = 8;

/// Across-lay coordinate of a point, mm, from the window centre fit_passes places passes about
/// (pass k's centre at offset + k stepover).
double across_lay_mm(const FitModel& model, double x_mm, double y_mm);

/// The floor across the lay for |v| <= v_max_mm, one sweep of a strip of cells of
/// window.cell_mm / kProfileCellsPerSample. @param[in] p parameters (kFitParams)
FitProfile simulate_fit_profile(const FitModel& model, const Eigen::VectorXd& p, double v_max_mm);

/// Floor of the model over the window, um (NaN where no pass reached).
Heightfield simulate_fit_window(const FitModel& model, const Eigen::VectorXd& p);

}  // namespace cuspmap

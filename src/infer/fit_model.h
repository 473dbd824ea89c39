// Forward model of the inverse simulation: the floor a raster of straight passes leaves on a
// (decimated) window of a measured floor, for trial machine errors. Inputs: known cutter, lay,
// pass direction, window grid (mm); parameters: tilt along/across the feed (deg), stepover (mm),
// pass offset (mm). Output: heights um at the window's sample points. Cost: one sweep.
// Method: the project's own sweep (sweep/simulate_floor: exact envelope of the revolving cutter,
// or tooth by tooth) used as a black box, DESIGN.md "Geometry".
#pragma once

#include <Eigen/Core>
#include <array>
#include <vector>

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
  /// Stylus tip radius the floor was measured with, mm (0: none): its closing fills the low
  /// side of a rim's step over up to this width (FitProfile::band_mm).
  double stylus_tip_mm = 0.0;
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
/// floor constant along them (derived: the revolving envelope of a line move), and the floor is
/// the lowest of the passes' own profiles (the union of their swept volumes), each the same
/// profile P(w) of one pass, w from its centre (the swept volume of a line move does not depend
/// on its sense, so zigzag passes leave it too; derived). One sweep of a strip one cell wide
/// across a single pass holds P; a sample's height is min over the passes reaching it of P
/// interpolated linearly between strip cells. The crossings of neighbouring passes (the cusps'
/// crests) and the steps where a pass's reach ends (a tilted flat's rim, |w| = cutter radius)
/// then fall where they are, not smeared over a strip cell as when the lower envelope itself is
/// interpolated (not for tooth_marks models).
struct FitProfile {
  Heightfield strip;         ///< one pass's profile: 1 x n cells along Y, um (NaN out of reach)
  double v0_mm = 0.0;        ///< w of the strip's first cell centre, mm
  double reach_mm = 0.0;     ///< the pass's profile ends at |w| = reach (the cutter's radius)
  double offset_mm = 0.0;    ///< pass k's centre at offset + k stepover across the lay
  double stepover_mm = 0.0;  ///< distance between passes
  /// Half-width about a pass's reach within which at() reports both sides of its step: a
  /// strip cell, or the stylus tip's radius when larger (FitModel::stylus_tip_mm).
  double band_mm = 0.0;
  double reach_phase_mm = 0.0;  ///< the reach modulo the stepover
  double per_stepover = 0.0;    ///< 1 / stepover, 1/mm (at() multiplies: 2 of 7 quotients)
  double node_mm = 0.0;         ///< spacing of `lowest`'s nodes (stepover / (nodes - 1))
  /// The two lowest passes (index relative to the period's) at nodes spread evenly over one
  /// period from the offset, at most a strip cell apart: at() weighs only these at the nodes
  /// either side of v (and a pass ending within a cell), not every pass in reach (40 for a
  /// 12 mm ball at 0.3 mm stepover). Exact where no pass is lowest only between two nodes
  /// (a feature under a strip cell wide; derived).
  std::vector<std::array<long, 2>> lowest;
  /// One pass's height at w mm from its centre: linear between strip cells, extended linearly
  /// from the last two cells up to the reach; NaN beyond it.
  double pass_at(double w_mm) const;
  /// Height at across-lay coordinate v (mm; as across_lay_mm): the lowest pass there; NaN where
  /// no pass reached. Where v lies within band_mm of a pass's reach and that pass's end
  /// steps the floor, `other` (when given) receives the floor's height on the step's other side
  /// (NaN elsewhere): a point sample that near a step lies on either side as far as the fit's
  /// parameters tell (FitResidual::raw matches it to the nearer).
  double at(double v_mm, double* other = nullptr) const;
};

/// Strip cells per window sample: linear interpolation of a pass's smooth profile between strip
/// cells errs by its curvature x cell^2 / 8, and near the reach of a tilted flat (P ~ sqrt of
/// the distance to it) by under tan(tilt) sqrt(2 R cell) / 4 (derived).
inline constexpr int kProfileCellsPerSample = 8;

/// Across-lay coordinate of a point, mm, from the window centre fit_passes places passes about
/// (pass k's centre at offset + k stepover).
double across_lay_mm(const FitModel& model, double x_mm, double y_mm);

/// One pass's profile across the lay for |w| <= the cutter's radius, one sweep of a strip of
/// cells of window.cell_mm / kProfileCellsPerSample; the passes at p's offset and stepover.
/// @param[in] p parameters (kFitParams)
FitProfile simulate_fit_profile(const FitModel& model, const Eigen::VectorXd& p);

/// Floor of the model over the window, um (NaN where no pass reached).
Heightfield simulate_fit_window(const FitModel& model, const Eigen::VectorXd& p);

}  // namespace cuspmap

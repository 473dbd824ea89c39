// Inverse simulation of a raster-finished floor: the machine and tool errors (tilt along and
// across the feed, stepover, pass offset) and the part's setup plane that make the sweep's floor
// match the measured one in least squares. Inputs: measured Heightfield (um over mm cells, NaN =
// missing), surface-only estimates (start values), FloorFitOptions (known cutter); output:
// FloorFit with the covariance at the optimum. Cost: 200 start strips + 4 short solver runs +
// polishing + the direction profile, ~1000-1500 strip sweeps (fit_model: one across-lay profile,
// ~0.1 ms each) read at <= 160 x 160 window samples, ~0.5-1.5 s CPU.
// Method: Levenberg-Marquardt (Moré 1978, MINPACK, as ported in Eigen's unsupported module) on
// the residual with the plane projected out (variable projection, Golub & Pereyra 1973).
#pragma once

#include <Eigen/Core>
#include <string>
#include <utility>
#include <vector>

#include "core/heightfield.h"
#include "infer/fit_model.h"
#include "infer/surface_estimates.h"

namespace cuspmap {

/// Most samples per side of the fit window (160^2 = 25600 residuals keep one sweep at a few ms
/// and the whole fit within a second; derived from the sweep's cost per cell).
inline constexpr int kMaxFitSamples = 160;
/// Most stepovers the window spans across the lay (more passes add no information on errors
/// that repeat every pass; derived).
inline constexpr double kMaxFitPeriods = 16.0;

/// What the user knows.
struct FloorFitOptions {
  Cutter cutter;  ///< shape, diameter, corner radius, dish; tilt and runout are ignored (fitted)
  RasterDirection direction = RasterDirection::OneWay;  ///< pass direction pattern
  int threads = 0;                                      ///< sweep threads (0 = all)
  double stylus_tip_um = 0.0;  ///< tip radius of the measurement, um (0: none; FitModel)
};

/// The fit at its optimum.
struct FloorFit {
  Eigen::VectorXd params;        ///< kFitParams values (FitParam order), along-tilt folded >= 0
  Eigen::MatrixXd covariance;    ///< kFitParams^2; rows/cols of fixed parameters are zero
  std::vector<bool> free;        ///< which parameters were fitted (tilt is fixed for a ball)
  Plane setup_plane;             ///< plane of measured minus simulated (the part's setup tilt)
  double plane_sigma_gx_um_per_mm = 0.0;  ///< standard error of its X slope
  double plane_sigma_gy_um_per_mm = 0.0;  ///< standard error of its Y slope
  double residual_rms_um = 0.0;  ///< rms of measured - simulated - plane over the window
  double measured_rms_um = 0.0;  ///< rms of the measured window about its own plane
  double sample_mm = 0.0;        ///< sample spacing of the window (stride x cell)
  int samples = 0;               ///< finite residuals
  int evaluations = 0;           ///< sweeps run (start search + solver)
  int solver_status = 0;         ///< Eigen LevenbergMarquardt status code
  double correlation_factor = 1.0;  ///< m / m_eff of the residuals (variances scaled by it)
  double tilt_profile_sigma_deg = 0.0;       ///< tilt sigma from the direction profile
  double direction_profile_sigma_deg = 0.0;  ///< direction sigma from the same profile
  double stepover_profile_sigma_mm = 0.0;    ///< stepover sigma from its cost profile (mm)
  std::pair<double, double> tilt_interval_deg{0.0, 0.0};  ///< tilts within 3 sigma (profile)
  FitModel model;                ///< the forward model (window grid, lay, cutter)
  Heightfield measured;          ///< window, measured minus the fitted plane, um
  Heightfield simulated;         ///< window, best-fit sweep, um (mean matched to measured)
  Heightfield residual;          ///< measured minus simulated, um (NaN where missing)
};

/// Fits the floor.
/// @param[in] hf  measured heights, um over mm cells (NaN = missing)
/// @param[in] e   surface-only estimates: lay, stepover (start values)
/// @param[in] o   the known cutter and pass pattern
/// @return the optimum, its covariance and the window pictures' fields
FloorFit fit_floor(const Heightfield& hf, const SurfaceEstimates& e, const FloorFitOptions& o);

}  // namespace cuspmap

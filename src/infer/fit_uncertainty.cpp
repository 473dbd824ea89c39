// Fitted values with standard errors: covariance of the fit propagated to tilt magnitude and
// direction by first-order (linearised) propagation.
// Inputs: FloorFit; output: FittedErrors. Cost O(1).
// Method: GUM (JCGM 100:2008) §5.1.2 law of propagation of uncertainty.
#include "infer/fit_uncertainty.h"

#include <cmath>
#include <limits>
#include <numbers>

namespace cuspmap {
namespace {

constexpr double kRadToDeg = 180.0 / std::numbers::pi;

double wrap360(double deg) {
  const double a = std::fmod(deg, 360.0);
  return a < 0.0 ? a + 360.0 : a;
}

}  // namespace

FittedValue fitted_value(double v, double var, bool fitted) {
  FittedValue f;
  f.value = v;
  f.fitted = fitted;
  f.sigma = std::isfinite(var) && var > 0.0 ? std::sqrt(var)
            : std::isfinite(var)            ? 0.0
                                            : std::numeric_limits<double>::infinity();
  f.resolved = fitted && std::abs(v) > kResolvedSigmas * f.sigma;
  f.bound = std::abs(v) + kBoundSigmas * f.sigma;
  return f;
}

FittedErrors fitted_errors(const FloorFit& fit) {
  FittedErrors e;
  const Eigen::VectorXd& p = fit.params;
  const bool tilt_fitted = fit.free[kTiltAlongDeg];
  // A weak fit's residual is mostly what the model lacks (tooth marks, runout), the same in every
  // pass, so no residual statistic sees the bias it puts on the along-feed tilt, which changes
  // the floor by only tan(tilt) (a - sqrt(a^2 - s^2 / 4)) (a = rim radius; derived, first-order
  // tilt): an along tilt whose whole effect is under the residual's rms cannot be told from it,
  // and that tilt is its sigma. A strong fit (noise-like residual) keeps its own covariance.
  double var_along = fit.covariance(0, 0);
  if (tilt_fitted && fit.measured_rms_um > 0.0) {
    const double ratio = fit.residual_rms_um / fit.measured_rms_um;
    const double a = fit.model.cutter.radius_mm();
    const double s = p[kStepoverMm];
    const double depth_mm = s < 2.0 * a ? a - std::sqrt(a * a - 0.25 * s * s) : a;
    if (1.0 - ratio * ratio < kWellExplained && depth_mm > 0.0) {
      const double sigma = std::atan(fit.residual_rms_um / 1000.0 / depth_mm) * kRadToDeg;
      var_along = std::max(var_along, sigma * sigma);
    }
  }
  Eigen::MatrixXd c = fit.covariance;
  if (var_along > c(0, 0) && c(0, 0) > 0.0 && std::isfinite(c(0, 0))) {
    // Keep the correlations: scale row and column 0.
    const double k = std::sqrt(var_along / c(0, 0));
    c.row(0) *= k;
    c.col(0) *= k;
  }
  e.tilt_along_deg = fitted_value(p[kTiltAlongDeg], c(0, 0), tilt_fitted);
  e.tilt_across_deg = fitted_value(p[kTiltAcrossDeg], c(1, 1), tilt_fitted);
  e.stepover_mm = fitted_value(p[kStepoverMm], c(2, 2), true);
  e.offset_mm = fitted_value(p[kOffsetMm], c(3, 3), true);
  e.setup_gx_um_per_mm = fitted_value(fit.setup_plane.gx_um_per_mm,
                                  fit.plane_sigma_gx_um_per_mm * fit.plane_sigma_gx_um_per_mm, true);
  e.setup_gy_um_per_mm = fitted_value(fit.setup_plane.gy_um_per_mm,
                                  fit.plane_sigma_gy_um_per_mm * fit.plane_sigma_gy_um_per_mm, true);

  // Magnitude and direction: gradients of hypot(a, b) and atan2(b, a) (GUM §5.1.2).
  const double a = p[kTiltAlongDeg], b = p[kTiltAcrossDeg];
  const double t = std::hypot(a, b);
  double var_t = std::numeric_limits<double>::infinity(), var_dir = var_t;
  if (t > 0.0 && std::isfinite(c(0, 0)) && std::isfinite(c(1, 1))) {
    const Eigen::Vector2d gt(a / t, b / t), gd(-b / (t * t), a / (t * t));
    const Eigen::Matrix2d cc = c.topLeftCorner<2, 2>();
    var_t = gt.dot(cc * gt);
    var_dir = gd.dot(cc * gd) * kRadToDeg * kRadToDeg;
  }
  // The linearised variance misses the ridge of equal cusp curvature where passes overlap: the
  // profile over the direction (floor_fit) widens both when it is wider.
  var_t = std::max(var_t, fit.tilt_profile_sigma_deg * fit.tilt_profile_sigma_deg);
  var_dir = std::max(var_dir, fit.direction_profile_sigma_deg * fit.direction_profile_sigma_deg);
  e.tilt_deg = fitted_value(t, tilt_fitted ? var_t : 0.0, tilt_fitted);
  const double dir = std::atan2(b, a) * kRadToDeg;
  e.tilt_toward_deg = fitted_value(wrap360(fit.model.lay_deg + dir), var_dir, tilt_fitted);
  e.tilt_toward_deg.resolved = e.tilt_deg.resolved;
  e.tilt_toward_alt_deg = wrap360(fit.model.lay_deg + std::atan2(b, -a) * kRadToDeg);
  e.along_sign_known = false;
  return e;
}

}  // namespace cuspmap

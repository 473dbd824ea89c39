// A shop's correction from kinematic (predicted) roughness to what its profilometer measures:
// measured = floor + scale x predicted, fitted by ordinary least squares with the parameters'
// standard errors; both in um. Inputs: pairs (predicted_um, measured_um). Cost O(rows).
// Method: linear regression and its covariance s^2 (X'X)^-1 (Draper & Smith, Applied Regression
// Analysis, 3rd ed., 1998, ch. 1-2; Montgomery & Runger, Applied Statistics, ch. 11).
#pragma once

#include <string>
#include <vector>

namespace cuspmap {

/// One past job: what the model predicted and what the shop's instrument measured.
struct CalibrationPoint {
  double predicted_um = 0.0;  ///< kinematic Ra the model predicts, um (>= 0)
  double measured_um = 0.0;   ///< Ra the profilometer measured, um (> 0)
};

/// Which parameters the data supported.
enum class CalibrationModel {
  FloorAndScale,  ///< measured = floor + scale x predicted (both fitted)
  FloorOnly,      ///< measured = floor + predicted (scale fixed at 1: too few rows or too
                  ///< narrow a spread of predictions to tell a floor from a scale)
};

/// The fitted correction with its uncertainty.
struct ShopCalibration {
  CalibrationModel model = CalibrationModel::FloorOnly;  ///< parameters fitted
  double floor_um = 0.0;          ///< additive process floor, um
  double floor_sd_um = 0.0;       ///< its standard error, um
  double scale = 1.0;             ///< multiplier on the kinematic value (1 when not fitted)
  double scale_sd = 0.0;          ///< its standard error (0 when not fitted)
  double cov_floor_scale_um = 0.0;  ///< covariance of floor and scale, um (0 when not fitted)
  int rows = 0;                   ///< points used
  double rms_before_um = 0.0;     ///< RMS of measured - predicted, um
  double rms_after_um = 0.0;      ///< RMS of measured - calibrated, um
  std::string why;                ///< why FloorOnly was chosen (empty for FloorAndScale)
};

/// A calibrated value and its standard uncertainty (from the parameters' covariance).
struct CalibratedValue {
  double value_um = 0.0;  ///< floor + scale x predicted, um
  double sd_um = 0.0;     ///< sqrt(var(floor) + p^2 var(scale) + 2 p cov), um
};

/// Smallest spread of the predictions, (max - min) / max, that lets a floor and a scale be told
/// apart: below it the two trade off along the data (a line through a tight cluster pivots
/// freely), so only the floor is fitted. 0.25 = predictions spanning at least 4:3.
inline constexpr double kMinPredictionSpread = 0.25;

/// Fits the correction. Uses FloorAndScale when there are >= 3 points, the predictions spread by
/// at least kMinPredictionSpread and the fitted scale is > 0; otherwise FloorOnly with the reason
/// in `why`. Standard errors use the residual variance with n - p degrees of freedom.
/// @param[in] points  >= 2 pairs, all finite (callers check; asserted)
ShopCalibration fit_shop_calibration(const std::vector<CalibrationPoint>& points);

/// Applies a calibration to one kinematic value.
/// @param[in] predicted_um  kinematic Ra, um
CalibratedValue apply_shop_calibration(const ShopCalibration& cal, double predicted_um);

/// "floor+scale" or "floor" (the shop profile's `model` value).
const char* calibration_model_name(CalibrationModel model);

}  // namespace cuspmap

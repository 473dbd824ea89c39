// Least-squares fit of measured = floor + scale x predicted (um) and its standard errors.
// Method: ordinary least squares with covariance s^2 (X'X)^-1 (Draper & Smith 1998, ch. 1-2).
#include "finish/shop_calibration.h"

#include <algorithm>
#include <cassert>
#include <cmath>

namespace cuspmap {
namespace {

double rms(const std::vector<double>& r) {
  double s = 0.0;
  for (double v : r) s += v * v;
  return r.empty() ? 0.0 : std::sqrt(s / static_cast<double>(r.size()));
}

std::vector<double> residuals(const std::vector<CalibrationPoint>& points, double floor_um,
                              double scale) {
  std::vector<double> r;
  r.reserve(points.size());
  for (const CalibrationPoint& p : points) r.push_back(p.measured_um - floor_um - scale * p.predicted_um);
  return r;
}

// Scale fixed at 1: floor = mean(measured - predicted), standard error s / sqrt(n).
ShopCalibration fit_floor_only(const std::vector<CalibrationPoint>& points, std::string why) {
  ShopCalibration c;
  c.model = CalibrationModel::FloorOnly;
  c.why = std::move(why);
  const double n = static_cast<double>(points.size());
  double sum = 0.0;
  for (const CalibrationPoint& p : points) sum += p.measured_um - p.predicted_um;
  c.floor_um = sum / n;
  const std::vector<double> r = residuals(points, c.floor_um, 1.0);
  double ss = 0.0;
  for (double v : r) ss += v * v;
  c.floor_sd_um = std::sqrt(ss / (n - 1.0) / n);
  c.rms_after_um = rms(r);
  return c;
}

}  // namespace

ShopCalibration fit_shop_calibration(const std::vector<CalibrationPoint>& points) {
  assert(points.size() >= 2 && "callers refuse fewer than two rows");
  const std::size_t n = points.size();
  double lo = points[0].predicted_um, hi = lo;
  for (const CalibrationPoint& p : points) {
    assert(std::isfinite(p.predicted_um) && std::isfinite(p.measured_um) && "finite input");
    lo = std::min(lo, p.predicted_um);
    hi = std::max(hi, p.predicted_um);
  }
  ShopCalibration c;
  const double spread = hi > 0.0 ? (hi - lo) / hi : 0.0;
  if (n < 3) {
    c = fit_floor_only(points, "2 rows fit one parameter only; give 3 or more to fit a scale too");
  } else if (spread < kMinPredictionSpread) {
    c = fit_floor_only(points, "the predictions span too little (" +
                                   std::to_string(static_cast<int>(std::lround(spread * 100))) +
                                   " %, need 25 %) to tell a floor from a scale");
  } else {
    // Centred sums keep the normal equations well conditioned.
    double mx = 0.0, my = 0.0;
    for (const CalibrationPoint& p : points) {
      mx += p.predicted_um;
      my += p.measured_um;
    }
    mx /= static_cast<double>(n);
    my /= static_cast<double>(n);
    double sxx = 0.0, sxy = 0.0;
    for (const CalibrationPoint& p : points) {
      sxx += (p.predicted_um - mx) * (p.predicted_um - mx);
      sxy += (p.predicted_um - mx) * (p.measured_um - my);
    }
    const double scale = sxy / sxx;
    if (!(scale > 0.0)) {
      c = fit_floor_only(points, "the fitted scale was not positive (measured Ra does not rise "
                                 "with the predicted): only the floor is kept");
    } else {
      c.model = CalibrationModel::FloorAndScale;
      c.scale = scale;
      c.floor_um = my - scale * mx;
      const std::vector<double> r = residuals(points, c.floor_um, c.scale);
      double ss = 0.0;
      for (double v : r) ss += v * v;
      const double s2 = ss / static_cast<double>(n - 2);
      // (X'X)^-1 for X = [1 x]: var(b) = s2/sxx, var(a) = s2 (1/n + mx^2/sxx), cov = -mx s2/sxx.
      c.scale_sd = std::sqrt(s2 / sxx);
      c.floor_sd_um = std::sqrt(s2 * (1.0 / static_cast<double>(n) + mx * mx / sxx));
      c.cov_floor_scale_um = -mx * s2 / sxx;
      c.rms_after_um = rms(r);
    }
  }
  c.rows = static_cast<int>(n);
  c.rms_before_um = rms(residuals(points, 0.0, 1.0));
  return c;
}

CalibratedValue apply_shop_calibration(const ShopCalibration& cal, double predicted_um) {
  const double p = predicted_um;
  const double var = cal.floor_sd_um * cal.floor_sd_um + p * p * cal.scale_sd * cal.scale_sd +
                     2.0 * p * cal.cov_floor_scale_um;
  return {cal.floor_um + cal.scale * p, std::sqrt(std::max(var, 0.0))};
}

const char* calibration_model_name(CalibrationModel model) {
  return model == CalibrationModel::FloorAndScale ? "floor+scale" : "floor";
}

}  // namespace cuspmap

// SVG chart of a shop calibration: measured Ra against the kinematic prediction (before) and
// against the calibrated value (after), with the 1:1 line and the fitted line. Pure encoder.
// Inputs: points (um), the fit, display unit (um or uin). Cost O(points).
// Method: SVG 1.1 (W3C, 2011); 1-2-5 ticks (report/nice_ticks, Heckbert 1990).
#pragma once

#include <string>
#include <vector>

#include "core/units.h"
#include "finish/shop_calibration.h"

namespace cuspmap {

/// Picture settings.
struct CalibrationSvgOptions {
  int width_px = 640;                        ///< picture width
  int height_px = 520;                       ///< picture height
  LengthUnit unit = LengthUnit::Millimetre;  ///< axis unit: um, or uin for inches
  std::string title = "Measured against predicted Ra";  ///< heading
};

/// The chart: hollow circles = kinematic prediction (before), filled = calibrated (after);
/// a dashed 1:1 line where the two would agree with the instrument, the fitted line solid.
std::string encode_calibration_svg(const std::vector<CalibrationPoint>& points,
                                   const ShopCalibration& cal, const CalibrationSvgOptions& o);

}  // namespace cuspmap

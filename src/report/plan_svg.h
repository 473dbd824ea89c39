// Encodes a stepover plan as an SVG chart: cost against stepover (log axis) per tool, with the
// machine and bench components and their total, options that miss the spec hollow, the best one
// ringed. Pure: returns the document text; the caller writes it. Cost O(options).
// Method: SVG 1.1 (W3C Recommendation, 2011), polylines on linear/log axes with 1-2-5 ticks.
#pragma once

#include <string>

#include "finish/price_option.h"

namespace cuspmap {

/// How to draw the chart.
struct PlanSvgOptions {
  int width_px = 880;                                     ///< document width
  int height_px = 520;                                    ///< document height
  std::string title = "Finishing cost against stepover";  ///< heading
  bool inch = false;                                      ///< stepover axis in inches (else mm)
  /// The cost axis ends at this multiple of the largest per-tool minimum total (or at the
  /// highest cost, if lower), so a few very expensive options do not flatten every tool's valley.
  double clip_factor = 5.0;
};

/// The chart. Deterministic text (numbers via std::to_chars), UTF-8, no external resources.
/// @param[in] plan     options (may be empty: the chart says so) and best index
/// @param[in] options  size, title, units
std::string encode_plan_svg(const PlanResult& plan, const PlanSvgOptions& options);

}  // namespace cuspmap

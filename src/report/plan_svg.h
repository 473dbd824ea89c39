// Encodes a stepover plan as an SVG chart: cost against stepover (log axis) per tool, with the
// machine and bench components and their total, options that miss the spec hollow, the best one
// ringed. Pure: returns the document text; the caller writes it. Cost O(options).
// Method: SVG 1.1 (W3C Recommendation, 2011), polylines on linear/log axes with 1-2-5 ticks.
#pragma once

#include <string>

#include "finish/price_option.h"

namespace cuspmap {

/// Width the chart budgets for one character, in em (x font size): wide enough for the usual
/// sans-serif faces (DejaVu Sans averages ~0.6 em over digits and lowercase), so that text laid
/// out by it stays inside the picture whichever face the viewer uses. Derived from the faces'
/// advance widths; a budget, not a measurement.
inline constexpr double kPlanSvgCharEm = 0.64;

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

/// The chart. Every text lies inside the picture at the kPlanSvgCharEm budget (legend and labels
/// wrap at spaces); each tool's total line ends at a label with its name (pushed apart so that
/// no two overlap); successive tools' lines are drawn 3 px apart so that equal costs do not hide
/// one another. Deterministic text (numbers via std::to_chars), UTF-8, no external resources.
/// @param[in] plan     options (may be empty: the chart says so) and best index
/// @param[in] options  size, title, units
std::string encode_plan_svg(const PlanResult& plan, const PlanSvgOptions& options);

}  // namespace cuspmap

// Whether a plan's cheapest option sits at an end of the stepovers tried for its tool, and the
// next range to try beyond that end (the optimum may lie outside the range tried).
// Inputs: PlanResult (options of one tool in ascending stepover), diameter mm; output: advice.
// Method: geometric continuation of the tried range by the same factor (common practice, no
// source), capped at the diameter (wider passes leave uncut strips).
#pragma once

#include <optional>
#include <vector>

#include "finish/price_option.h"

namespace cuspmap {

/// Advice when the best option is the smallest or largest stepover tried for its tool.
struct RangeEdge {
  bool at_smallest = false;               ///< true: the best is the smallest stepover tried
  std::vector<double> next_stepovers_mm;  ///< a range beyond that end, ascending; empty when the
                                          ///< end is the diameter (nothing wider to try)
};

/// Stepovers suggested beyond an end of the range.
inline constexpr int kNextRangeCount = 5;

/// @param[in] plan         priced options and the best one
/// @return empty when there is no best option or it lies strictly inside its tool's range.
std::optional<RangeEdge> plan_range_edge(const PlanResult& plan);

}  // namespace cuspmap

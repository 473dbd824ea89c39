// Range-edge check of a plan's best option and the continuation of the range beyond that end.
// Inputs: PlanResult; output: RangeEdge (mm). Cost O(options).
// Method: geometric continuation by the ratio of the tried range's neighbouring stepovers.
#include "finish/plan_range_edge.h"

#include <algorithm>
#include <cmath>

namespace cuspmap {
namespace {

// Ratio between suggested stepovers when the tool was tried at one stepover only: doubling
// (halving) brackets a cost minimum quickly (common practice, no source).
constexpr double kSingleStepoverRatio = 2.0;
// Stepovers within this fraction of the diameter count as the diameter itself.
constexpr double kDiameterRelTol = 1e-9;

}  // namespace

std::optional<RangeEdge> plan_range_edge(const PlanResult& plan) {
  if (!plan.best) return std::nullopt;
  const PlanOption& best = plan.options[*plan.best];
  std::vector<double> tried;
  for (const PlanOption& o : plan.options) {
    if (o.tool == best.tool) tried.push_back(o.stepover_mm);
  }
  std::sort(tried.begin(), tried.end());
  const bool smallest = best.stepover_mm <= tried.front();
  const bool largest = best.stepover_mm >= tried.back();
  if (!smallest && !largest) return std::nullopt;
  RangeEdge edge;
  // One stepover tried is both ends: the finer side is the one a finish target can force.
  edge.at_smallest = smallest;
  const double ratio = tried.size() > 1
                           ? std::max(std::pow(tried.back() / tried.front(),
                                               1.0 / static_cast<double>(tried.size() - 1)),
                                      1.0 + 1e-6)
                           : kSingleStepoverRatio;
  const double diameter = best.cutter.diameter_mm;
  if (edge.at_smallest) {
    for (int k = kNextRangeCount; k >= 1; --k) {
      edge.next_stepovers_mm.push_back(best.stepover_mm / std::pow(ratio, k));
    }
    return edge;
  }
  for (int k = 1; k <= kNextRangeCount; ++k) {
    const double s = best.stepover_mm * std::pow(ratio, k);
    if (s >= diameter * (1.0 - kDiameterRelTol)) {
      if (best.stepover_mm < diameter * (1.0 - kDiameterRelTol)) {
        edge.next_stepovers_mm.push_back(diameter);
      }
      break;
    }
    edge.next_stepovers_mm.push_back(s);
  }
  return edge;
}

}  // namespace cuspmap

// Derivative-free polish of a fit: compass (coordinate pattern) search on a cost, each
// coordinate tried +- its step, steps halved when no move lowers the cost. Inputs: cost
// function of a parameter vector, start, initial and final steps (the parameters' units);
// output: the lowest point found. Cost: ~2 n evaluations per halving.
// Method: Kolda, Lewis & Torczon, "Optimization by direct search", SIAM Review 45, 2003 (§3).
#pragma once

#include <Eigen/Core>
#include <functional>

namespace cuspmap {

/// Most cost evaluations one search may use (a 4-parameter search from 1/64 of its initial
/// steps down to the final ones takes ~100; derived).
inline constexpr int kMaxCompassEvaluations = 400;

/// Minimises cost by compass search from x.
/// @param[in]     cost        cost of a parameter vector (finite)
/// @param[in,out] x           start; on return the lowest point found
/// @param[in]     step        initial step per parameter (> 0, units of the parameter)
/// @param[in]     final_step  the search ends when every step is below this (> 0)
/// @param[in,out] evaluations incremented by the evaluations run
/// @return the cost at x
double compass_search(const std::function<double(const Eigen::VectorXd&)>& cost,
                      Eigen::VectorXd& x, const Eigen::VectorXd& step,
                      const Eigen::VectorXd& final_step, int& evaluations);

}  // namespace cuspmap

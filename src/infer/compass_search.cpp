// Compass search: each coordinate tried +- its step, moves kept while they lower the cost, steps
// halved when none does. Inputs: cost function, start, steps; output: lowest point found.
// Method: Kolda, Lewis & Torczon, SIAM Review 45 (2003), §3 (compass search, step halving).
#include "infer/compass_search.h"

namespace cuspmap {

double compass_search(const std::function<double(const Eigen::VectorXd&)>& cost,
                      Eigen::VectorXd& x, const Eigen::VectorXd& step,
                      const Eigen::VectorXd& final_step, int& evaluations) {
  double best = cost(x);
  ++evaluations;
  Eigen::VectorXd h = step;
  int used = 1;
  while (used < kMaxCompassEvaluations && (h.array() >= final_step.array()).any()) {
    bool moved = false;
    for (Eigen::Index k = 0; k < x.size() && used < kMaxCompassEvaluations; ++k) {
      if (h[k] < final_step[k]) continue;
      for (const double sign : {1.0, -1.0}) {
        Eigen::VectorXd t = x;
        t[k] += sign * h[k];
        const double c = cost(t);
        ++used;
        ++evaluations;
        if (c < best) {
          best = c;
          x = t;
          moved = true;
          break;
        }
      }
    }
    // No coordinate moved: the optimum lies within the steps (Kolda et al. 2003, Theorem 3.3).
    if (!moved) h *= 0.5;
  }
  return best;
}

}  // namespace cuspmap

#include "infer/compass_search.h"

#include <catch2/catch.hpp>
#include <cmath>

namespace cuspmap {

TEST_CASE("compass_search: finds the minimum of a quadratic bowl", "[infer]") {
  // (x0 - 1.3)^2 + 4 (x1 - 0.45)^2: minimum 0 at (1.3, 0.45) (derived). (A valley oblique to
  // the axes with a 100:1 curvature ratio is left 0.014 short within kMaxCompassEvaluations:
  // compass search zigzags there, which is why LM runs first in fit_floor.)
  const auto cost = [](const Eigen::VectorXd& x) {
    const double a = x[0] - 1.3, b = x[1] - 0.45;
    return a * a + 4.0 * b * b;
  };
  Eigen::VectorXd x(2), step(2), final_step(2);
  x << 0.0, 0.0;
  step << 0.5, 0.5;
  final_step << 1e-7, 1e-7;
  int evaluations = 0;
  const double c = compass_search(cost, x, step, final_step, evaluations);
  // Within a few final steps of the minimum (Kolda, Lewis & Torczon 2003, Theorem 3.3: the
  // step bounds the distance to a stationary point of a smooth cost; derived for this one).
  CHECK(c < 1e-9);
  CHECK(std::abs(x[0] - 1.3) < 1e-5);
  CHECK(std::abs(x[1] - 0.45) < 1e-5);
  CHECK(evaluations <= kMaxCompassEvaluations);
}

}  // namespace cuspmap

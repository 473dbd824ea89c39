// Residual functors of the floor fit (see fit_residual.h): the shared helpers.
// Inputs: residual vectors um; outputs: Jacobian columns, rms. Cost O(samples).
// Method: one-sided finite differences (see kTiltStepDeg in fit_residual.h).
#include "infer/fit_residual.h"

namespace cuspmap {

Eigen::VectorXd shorter_difference(const Eigen::VectorXd& f0, const Eigen::VectorXd& f_plus,
                                   const Eigen::VectorXd& f_minus, double h) {
  Eigen::VectorXd forward = (f_plus - f0) / h, backward = (f0 - f_minus) / h;
  return forward.squaredNorm() <= backward.squaredNorm() ? forward : backward;
}

double residual_rms(const Eigen::VectorXd& v) {
  return v.size() ? std::sqrt(v.squaredNorm() / static_cast<double>(v.size())) : 0.0;
}

}  // namespace cuspmap

// Statistics of the fit's residual that set its variance: the integrated autocorrelation time
// along the window's axes (m / m_eff) and the variance seen through the lines along the lay.
// Inputs: residuals um at a window's finite samples (grid indices or across-lay positions mm);
// output: dimensionless factor, um^2. Cost O(samples x lags).
// Method: Box & Jenkins, Time Series Analysis, §2.1.6; Geyer 1992 initial positive sequence.
#pragma once

#include <Eigen/Core>
#include <vector>

namespace cuspmap {

/// Lags summed for the residual's autocorrelation time (a pass is at most ~10-20 samples wide in
/// the window: beyond it the repeat is the model's, not the noise's; derived).
inline constexpr int kMaxCorrelationLags = 20;

/// m / m_eff of residuals on an nx x ny grid: the product over the two axes of 1 + 2 sum rho(k)
/// over the initial positive run of lags (at most kMaxCorrelationLags); 1 for white noise.
/// @param[in] nx, ny  grid size
/// @param[in] index   finite sample -> cell index (row-major)
/// @param[in] r       residual per finite sample, um
double correlation_factor(int nx, int ny, const std::vector<int>& index,
                          const Eigen::VectorXd& r);

/// Per-sample variance seen through the lines along the lay: sum n_b rb^2 / (lines - params -
/// 3) times the lines' autocorrelation time across the lay, um^2 (sigma^2 for noise).
/// @param[in] v_mm    across-lay position per finite sample, mm
/// @param[in] bin_mm  line width across the lay, mm (> 0)
/// @param[in] r       residual per finite sample, um
/// @param[in] params  free parameters (besides the 3 of the plane)
/// @return 0 when there are no samples
double line_mean_variance(const std::vector<double>& v_mm, double bin_mm,
                          const Eigen::VectorXd& r, int params);

}  // namespace cuspmap

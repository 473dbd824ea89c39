// Correlation factor m / m_eff of fit residuals on a grid: the product over the two grid axes of
// the integrated autocorrelation time 1 + 2 sum rho(k), summed over the initial positive run of
// lags. Inputs: grid size, finite sample -> cell index, residuals; output: factor >= 1.
// Method: Box & Jenkins, Time Series Analysis, §2.1.6; Geyer 1992 (initial positive sequence).
#pragma once

#include <Eigen/Core>
#include <vector>

namespace cuspmap {

/// @param[in] nx, ny    grid columns and rows
/// @param[in] index     cell index (row-major) of each residual
/// @param[in] r         residuals, one per index entry
/// @param[in] max_lags  most lags summed per axis
/// @return 1 for white noise, larger when neighbouring residuals are alike
double residual_correlation(int nx, int ny, const std::vector<int>& index, const Eigen::VectorXd& r,
                            int max_lags);

}  // namespace cuspmap

// The repeat of a trace from the positions of its valleys: each valley's vertex from a
// least-squares parabola about its lowest sample, the period the least-squares slope of the
// vertices against their index. Inputs: runs um at one spacing mm, a first period mm and a
// valley phase; output: ValleyPeriod mm. Cost O(samples). Method: linear regression of event
// times on their count (the O - C method of periodic timing; Sterken, ASP Conf. Ser. 335, 2005);
// the trend from the vertices' heights (pooled within-run regression, analysis of covariance).
#pragma once

#include <vector>

#include "texture/extract_profiles.h"

namespace cuspmap {

/// The period from the valleys, with its standard error.
struct ValleyPeriod {
  bool found = false;      ///< at least kMinValleys valleys were located
  double period_mm = 0.0;  ///< slope of vertex position on valley index
  double sigma_mm = 0.0;   ///< its standard error (residual scatter of the vertices)
  int valleys = 0;         ///< vertices in the regression
  /// Slope of the vertices' heights on their positions, um/mm (pooled within runs): the trace's
  /// trend, which the cusps do not tilt (every valley bottom is the same circle; derived).
  double slope_um_per_mm = 0.0;
  bool slope_found = false;  ///< at least kMinValleys vertices in runs holding two or more
};

/// Fewest valleys the regression takes (a slope and a scatter need three; derived).
inline constexpr int kMinValleys = 3;

/// Locates the valley near valley_mm + k period in every run (lowest sample within a quarter
/// period, then a parabola over +-window period about it) and regresses the vertices.
/// @param[in] runs        traces, positions start_mm + i * spacing_mm
/// @param[in] period_mm   first estimate of the period (autocorrelation)
/// @param[in] valley_mm   position of one valley modulo the period (the fold's lowest bin)
/// @param[in] window      half-width of each valley's parabola, as a fraction of the period
ValleyPeriod valley_period(const std::vector<ProfileTrace>& runs, double period_mm,
                           double valley_mm, double window);

}  // namespace cuspmap

// Profile likelihoods of the floor fit (Bates & Watts 1988 §6.1): the cost re-minimised with
// the tilt direction held at a fan of directions, and with the stepover moved by a ladder of
// relative steps; the largest moves within kProfileSigmas^2 residual variances bound the values.
// Inputs: FitResidual at the optimum (deg, mm); outputs: sigmas and intervals in FloorFit.
#pragma once

#include "infer/fit_residual.h"
#include "infer/floor_fit.h"

namespace cuspmap {

/// The cost rise that bounds a profile interval: kProfileSigmas^2 residual variances (3 sigma of
/// one parameter, Bates & Watts 1988 §6.1 likelihood intervals).
inline constexpr double kProfileSigmas = 3.0;

/// Sets fit.tilt_profile_sigma_deg, direction_profile_sigma_deg and tilt_interval_deg from the
/// profile over the tilt direction; adds its sweeps to fit.evaluations. var: the residual
/// variance (with the correlation factor: floor_fit's covariance), the cost limit's unit.
void profile_direction(const FitResidual& res, double best_cost, double var, FloorFit& fit);

/// One sigma of the stepover from the profile of the cost over it (var: the residual variance).
double stepover_profile_sigma_mm(const FitResidual& res, double best_cost, double var,
                                 int& evaluations);

}  // namespace cuspmap

// Profile search along the runout's phase of the tooth-resolved stage: the runout vector is
// turned about its magnitude and held while the rest of the state is solved again (its profile
// cost), stepping while the profile falls. Inputs: ToothProblem at a stop, teeth Z, fz (mm);
// output: the profile's points (deg, um^2), the problem left at the best one.
// Method: profile likelihood (Bates & Watts 1988 §6.1); compass search (Kolda et al. 2003).
#pragma once

#include <vector>

#include "infer/tooth_fit_problem.h"

namespace cuspmap {

/// Points of the phase profile: phase (deg, unwrapped about the start) and profile cost (um^2).
struct PhaseProfile {
  std::vector<double> psi_deg, cost;
  int best = 0;  ///< index of the lowest cost (0: the stop the search began from)
};

/// From the problem's stop (runout free, Z >= 3): profile costs at +-step, the search moving to
/// any lower one and repeating, then at half the step; the problem is left at the best point's
/// state. Returns every point evaluated (the start's own cost first).
PhaseProfile search_phase(ToothProblem& p, int teeth, double fz_mm);

/// Variance of the phase (deg^2) from the profile's curvature about its best point: the cost
/// rises by one residual variance `var` (um^2) at one standard error (Bates & Watts 1988 §6.1,
/// a parabola through the best point and its nearest neighbours on each side). Infinite when a
/// side is missing or the profile is not convex there.
double phase_profile_variance(const PhaseProfile& profile, double var);

}  // namespace cuspmap

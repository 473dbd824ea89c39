// Runout scan of the tooth-resolved stage: a grid over the runout vector (magnitude, phase over
// 360 / Z) from the runout-free fit, each pass's tooth label chosen at every grid point, the
// best points kept as the solver's starts. Inputs: ToothProblem at the runout-free optimum,
// teeth Z, feed per tooth (mm); output: start states with their costs (um^2).
// Method: Kline & DeVor 1983 (tooth k cuts at R + e cos(psi - 2 pi k / Z)); grid search.
#pragma once

#include <vector>

#include "infer/tooth_fit_problem.h"

namespace cuspmap {

/// One grid point of the scan after its labels were chosen.
struct RunoutStart {
  double cost = 0.0;  ///< |r|^2 at the point, um^2
  ToothState state;   ///< runout set, each pass's label chosen
};

/// Each active pass's tooth label (its shift + k fz, 0 < k < Z) tried with the others held;
/// keeps each improvement (one coordinate-wise round). With runout the passes must agree on
/// which tooth is tooth 0; without it the labels are alike.
void search_labels(ToothProblem& p, int teeth, double fz_mm);

/// Grid over the runout vector around the problem's state (its runout is replaced): phases
/// over 360 / Z (Z <= 2: the part along the teeth only), magnitudes as fractions of fz; at each
/// point the labels are searched. Returns the `keep` best points, best first, points of the
/// same phase within one grid step of a better one left out. The problem is left at the
/// runout-free state it came with.
std::vector<RunoutStart> scan_runout(ToothProblem& p, int teeth, double fz_mm, int keep);

}  // namespace cuspmap

// ISO 4288 cut-off selection for a set of profile traces: periodic profiles by RSm, others by
// Ra, iterated until the measured value falls in the row of the cut-off it was measured with.
// Inputs: traces (um, mm); output: the cut-off, its evaluation and notes. Cost: a few
// evaluate_profiles calls.
// Method: ISO 4288:1996 §7.2 (procedure for non-periodic and periodic profiles), Tables 1 and 3.
#pragma once

#include <string>
#include <vector>

#include "texture/evaluate_profiles.h"
#include "texture/profile_periodicity.h"

namespace cuspmap {

/// Re-measurements the ISO 4288 loop makes before it stops (5 table rows: a settled choice
/// needs at most 4 moves).
inline constexpr int kMaxCutoffIterations = 6;

/// The chosen cut-off, how it was chosen, and the evaluation at it.
struct CutoffSelection {
  ProfileEvaluation evaluation;       ///< parameters at the chosen cut-off
  Periodicity periodicity;            ///< the autocorrelation test's verdict
  std::string rule;                   ///< "RSm (periodic)", "Ra (non-periodic)" or "fixed"
  int measurements = 0;               ///< evaluations made
  std::vector<std::string> warnings;  ///< one line each: out-of-table values, short traces ...
};

/// Picks the cut-off by ISO 4288 (or takes `fixed_cutoff_mm` when > 0) and evaluates the traces.
/// Start: RSm (periodic) or Ra (non-periodic) of the form-removed traces; then measure at the
/// table's cut-off and move to the row the measured value falls in, until it stays. A cut-off
/// longer than half the longest trace is replaced by the longest standard one that fits (with a
/// warning). lambda-s follows the cut-off (ISO 3274) unless `fixed_lambda_s_um` >= 0.
/// @param[in] traces            finite traces (same spacing)
/// @param[in] fixed_cutoff_mm   > 0 to skip the rule
/// @param[in] fixed_lambda_s_um >= 0 to override ISO 3274's pairing (0 = no lambda-s filter)
/// @throws InputError when the longest trace is shorter than two of the smallest cut-off
///         (0.16 mm), or than two fixed cut-offs
CutoffSelection select_cutoff(const std::vector<ProfileTrace>& traces, double fixed_cutoff_mm,
                              double fixed_lambda_s_um);

}  // namespace cuspmap

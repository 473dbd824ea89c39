// Chooses among simulated finishing options for a target Ra: the quickest option that meets the
// target, with ties broken by the shallower marks (less to sand); a reason for each verdict.
// Inputs: Ra, Sz (um) and cycle time (s) per option, target Ra (um).
// Method: spec first, then machine time, then bench work (DESIGN.md "Finish decisions").
#pragma once

#include <optional>
#include <string>
#include <vector>

namespace cuspmap {

/// What is known of one option.
struct StrategyScore {
  std::string name;          ///< label shown to the user
  double ra_um = 0.0;        ///< predicted Ra across the lay, um
  double sz_um = 0.0;        ///< predicted Sz (depth to sand before the marks vanish), um
  double cycle_time_s = 0.0; ///< machine time for the pass, s
};

/// The choice and why.
struct StrategyChoice {
  std::optional<size_t> best;     ///< index of the chosen option; empty when none meets the target
  std::optional<size_t> closest;  ///< lowest-Ra option (the fallback when none meets it)
  std::vector<bool> meets;        ///< per option: Ra <= target
  std::string reason;             ///< one or two sentences for the summary
};

/// @param[in] options       at least one
/// @param[in] target_ra_um  > 0
StrategyChoice choose_strategy(const std::vector<StrategyScore>& options, double target_ra_um);

}  // namespace cuspmap

// One basis for the profile parameters of several simulated floors, so that they can be ranked:
// one cut-off (the longest of the rows' own ISO 4288 choices, or a fixed one) and one trace
// direction rule; rows evaluated at another cut-off are re-evaluated on their own traces.
// Inputs: JobRuns with their texture reports, the shared TextureOptions; output: ProfileBasis.
// Method: ISO 4288:1996 §7.2 (cut-off by RSm/Ra) applied to the roughest row; ISO 4287:1997.
#pragma once

#include <string>
#include <vector>

#include "job/run_job.h"
#include "texture/texture_report.h"

namespace cuspmap {

/// The basis the compared profile parameters (Ra, Rz) share, or why they do not share one.
struct ProfileBasis {
  double cutoff_mm = 0.0;      ///< lambda-c of every row when `common_cutoff`, mm
  std::string cutoff_rule;     ///< how it was chosen, one line
  bool common_cutoff = true;   ///< every row evaluated at cutoff_mm
  bool common_direction = true;  ///< every row traced by the same rule (none fell back to X)
  std::vector<std::string> reasons;  ///< why the profile columns are not ranked, one line each
  std::vector<std::string> notes;    ///< rows re-evaluated at the common cut-off, one line each
  /// Profile values may be ranked (starred) against each other.
  bool rankable() const { return common_cutoff && common_direction; }
};

/// Puts the profile side of every run on one basis. With a fixed cut-off (options.cutoff_mm >
/// 0) every row already shares it. Otherwise the common cut-off is the longest of the rows' own
/// ISO 4288 choices (the coarsest texture's: a shorter one would filter that row's marks away)
/// and every row chosen at another is re-evaluated at it, on traces along its own direction.
/// A streamed row (its floor was never held) or a row too short for the common cut-off keeps its
/// own and the basis is not common. Rows traced "across the lay" where one had no dominant lay
/// (traced along X) do not share a direction rule. Areal parameters are untouched (the options
/// give every row the same areal filters).
/// @param[in,out] runs     the runs (non-null, at least one); profile reports replaced in place
/// @param[in]     options  the texture options every run was measured with
/// @param[in]     names    one label per run for the reasons (e.g. "row 2")
ProfileBasis common_profile_basis(const std::vector<JobRun*>& runs, const TextureOptions& options,
                                  const std::vector<std::string>& names);

}  // namespace cuspmap

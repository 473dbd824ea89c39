// Evaluates profile traces at one cut-off: form removal, lambda-s and lambda-c Gaussian filters,
// end handling, then R, P and W parameters averaged over the traces.
// Inputs: traces (um, mm), cut-off mm, lambda-s um; output: ProfileEvaluation.
// Cost O(traces * n * lc / spacing).
// Method: ISO 3274:1996 (primary profile), ISO 16610-21:2011 (Gaussian filter), ISO 4288:1996
// §4.4 and Annex (evaluation length of 5 sampling lengths, run-up and run-out of lc/2 each).
#pragma once

#include <optional>
#include <vector>

#include "texture/extract_profiles.h"
#include "texture/profile_parameters.h"

namespace cuspmap {

/// R, P and W parameters of a set of traces at one cut-off, averaged over the traces.
struct ProfileEvaluation {
  ProfileParameters roughness;  ///< R: primary minus the lambda-c mean line, n sampling lengths
  ProfileParameters primary;    ///< P: lambda-s filtered, form removed, over the evaluation length
  ProfileParameters waviness;   ///< W: the lambda-c mean line, form removed, evaluation length
  double cutoff_mm = 0.0;       ///< lambda-c used
  double lambda_s_um = 0.0;     ///< lambda-s used
  int sampling_lengths = 0;     ///< sampling lengths per trace (1..5)
  double evaluation_length_mm = 0.0;  ///< sampling_lengths * cutoff
  int traces = 0;                     ///< traces evaluated (those long enough)
};

/// Evaluates the traces. The number of sampling lengths n is the most (up to 5) that the longest
/// trace holds after lc/2 run-up and run-out; traces shorter than (n + 1) lc are skipped. Each
/// trace: least-squares line removed, lambda-s filter -> primary; lambda-c filter -> mean line
/// (waviness); primary - mean line -> roughness; the centred n lc of it is evaluated.
/// Means: Rsk/Rku over traces with a defined shape, RSm over traces with elements.
/// @param[in] traces      finite traces, all with the same spacing
/// @param[in] cutoff_mm   lambda-c, mm, > 0
/// @param[in] lambda_s_um lambda-s, um, >= 0 (0: no short-wave filter)
/// @return nullopt when no trace reaches two cut-offs (one sampling length plus run-up/out)
std::optional<ProfileEvaluation> evaluate_profiles(const std::vector<ProfileTrace>& traces,
                                                   double cutoff_mm, double lambda_s_um);

/// Sampling lengths that fit a trace of `samples` samples at `spacing_mm` for `cutoff_mm`,
/// after lc/2 run-up and run-out: min(5, floor(samples / k) - 1), k = round(lc / spacing).
/// @return 0 when not even one fits
int sampling_lengths_that_fit(size_t samples, double spacing_mm, double cutoff_mm);

}  // namespace cuspmap

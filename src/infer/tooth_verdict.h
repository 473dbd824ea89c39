// Verdict sentences of the tooth-resolved stage that a machinist acts on: runout with its
// phase (or the projection two teeth show), the dish, the sign of the tilt along the feed, and
// what the floor cannot tell; and how they join the envelope stage's verdict. The stage is
// experimental (docs/diagnose.md): its sign does not yet change the envelope's direction.
// Inputs: ToothFit; output: sentences.
// Method: runout as a centre offset (Kline & DeVor 1983): one tooth cuts up to e further out.
#pragma once

#include <string>
#include <vector>

#include "infer/fit_uncertainty.h"
#include "infer/fit_verdict.h"
#include "infer/tooth_fit.h"

namespace cuspmap {

/// Runout under which the verdict does not ask for the holder to be checked, um (common
/// practice, no source: a few um of runout is usual for a collet holder).
inline constexpr double kRunoutCheckUm = 5.0;

/// Sentences of the tooth stage (empty lines and one cannot_tell when it was skipped).
struct ToothVerdict {
  std::vector<std::string> lines;        ///< verdicts, one sentence each
  std::vector<std::string> cannot_tell;  ///< what the floor cannot tell and why
};

/// Words for the tooth stage.
ToothVerdict tooth_verdict(const ToothFit& t);

/// Joins the tooth stage's sentences to the envelope's, dropping its "not fitted" lines on
/// dish and runout when the tooth stage ran.
void merge_tooth_verdict(const ToothFit& t, const ToothVerdict& tv, FitVerdict& v);

}  // namespace cuspmap

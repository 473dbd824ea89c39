// Whether a tooth window shows feed marks at all: the variance of the window's heights that
// repeats with the feed per revolution, against the variance left about it. Inputs: ToothWindow
// (um over mm cells), lay (deg), feed per revolution Z fz (mm); output: ToothMarks. Cost
// O(window cells), no sweep. Method: one-way analysis of variance of the synchronous average
// (Fisher's F test; samples grouped by line along the lay and by phase within a revolution).
#pragma once

#include "infer/tooth_window.h"

namespace cuspmap {

/// Standard errors of the variance ratio above 1 that count as marks (common practice, no
/// source: 3 sigma detection, as kResolvedSigmas).
inline constexpr double kMarkSigmas = 3.0;

/// The window's feed-mark statistics.
struct ToothMarks {
  double variance_ratio = 0.0;   ///< mean square between phase bins / within them (F)
  double critical_ratio = 1.0;   ///< 1 + kMarkSigmas x the ratio's standard error under noise
  double marks_rms_um = 0.0;     ///< rms of the part that repeats each revolution, um
  double noise_rms_um = 0.0;     ///< rms about the synchronous average, um
  double detection_rms_um = 0.0; ///< least marks rms the window would show, um
  bool seen = false;             ///< variance_ratio > critical_ratio
};

/// Marks statistics of the window with its plane removed.
/// @param[in] w              measured window (finite samples, plane basis)
/// @param[in] lay_deg        pass direction, deg from +X
/// @param[in] revolution_mm  feed per revolution Z fz (> 0), the marks' period along the lay
ToothMarks tooth_marks(const ToothWindow& w, double lay_deg, double revolution_mm);

}  // namespace cuspmap

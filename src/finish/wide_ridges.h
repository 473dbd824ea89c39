// Whether a periodic mark pattern is spaced wider than ISO 4288's periodic cut-off table reaches
// (RSm > 4 mm): a roughness measurement then treats the ridges as waviness, so a small Ra can
// hide a cusp tens of micrometres high (a bull-nose stepped just past its flat width).
// Inputs: mark spacing mm; output: bool and the caution line. Cost O(1).
// Method: ISO 4288:1996 Table 3 (largest RSm row 1.3-4 mm -> 8 mm cut-off), texture/iso4288_cutoff.
#pragma once

#include <string>

namespace cuspmap {

/// Peak-to-valley over Ra above which the marks are narrow ridges on a flat floor rather than an
/// evenly curved cusp profile (circle arcs, ellipses and saw-teeth all give ~4: 3.9 for the
/// parabola, 4 for the saw-tooth; derived). Twice that marks ridges Ra understates.
inline constexpr double kRidgeRzOverRa = 8.0;

/// True when marks `spacing_mm` apart (RSm of the cusp profile = the stepover) lie beyond the
/// largest RSm row of ISO 4288:1996 Table 3 and stand as narrow ridges (cusp > kRidgeRzOverRa Ra):
/// a small Ra then hides a high cusp.
/// @param[in] spacing_mm  > 0
/// @param[in] cusp_um     peak-to-valley of the marks, um
/// @param[in] ra_um       Ra of the same profile, um
bool ridges_hidden_by_ra(double spacing_mm, double cusp_um, double ra_um);

/// The caution for such ridges, with the cusp height and spacing as the caller shows them
/// ("31.9 um (1256 uin)", "8.6 mm").
std::string wide_ridges_caution(const std::string& cusp_text, const std::string& spacing_text);

}  // namespace cuspmap

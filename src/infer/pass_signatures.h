// Pass-to-pass signatures of a raster floor: how well each pass's band of along-lay traces
// matches the next pass (one stepover over), the one after (two stepovers), and its own mirror
// image along the lay. Alternate passes that differ mean zigzag; a band that is its own mirror
// carries marks crossing both ways (the heel recuts behind the leading edge).
// Inputs: along-lay traces um (offset across, mm), stepover and valley phase mm, largest
// along-lay shift mm; output: PassSignatures (correlations -1..1). Cost O(traces * n * shifts).
// Method: normalised cross-correlation maximised over the along-lay shift (the spindle phase at
// which a pass starts is unknown), pooled over the traces of one band (Bracewell, The Fourier
// Transform and its Applications, ch. 6).
#pragma once

#include <vector>

#include "texture/extract_profiles.h"

namespace cuspmap {

/// Correlations of pass bands; each is the mean over bands that have a partner.
struct PassSignatures {
  double next_pass = 0.0;     ///< band against the band one stepover over
  double second_pass = 0.0;   ///< band against the band two stepovers over
  double mirror = 0.0;        ///< band against itself mirrored along the lay
  double along_rms_um = 0.0;  ///< rms height along the lay (each trace's line removed): the marks
  int bands = 0;              ///< bands compared (one stepover apart)
};

/// Computes the signatures.
/// @param[in] along        traces along the lay, one cell apart across (extract_profiles)
/// @param[in] stepover_mm  across-lay period
/// @param[in] valley_mm    across position of a pass centre (the cusp valley), mm from the centre
/// @param[in] max_shift_mm largest along-lay shift tried (e.g. one revolution's feed)
/// @param[in] threads      workers for the bands (0 = all; the result does not depend on it)
PassSignatures pass_signatures(const std::vector<ProfileTrace>& along, double stepover_mm,
                               double valley_mm, double max_shift_mm, int threads = 1);

}  // namespace cuspmap

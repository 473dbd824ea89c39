// Whether the passes' own profile stands out in the lines along the lay: the envelope model is
// constant along the lay, so the fit sees the floor only through each line's mean; where those
// means carry more than the model explains (tooth marks' beat, a heel floor's faint passes)
// the stepover is set by that structure and is known only to the field's period resolution.
// Inputs: FloorFit (window, best-fit envelope, residual, lay); output: PassVisibility (um, mm).
// Method: band means (Radon projection, infer/band_means); Fourier resolution 1/L (derived).
#pragma once

#include <numbers>
#include <string>

#include "infer/fit_uncertainty.h"
#include "infer/floor_fit.h"

namespace cuspmap {

/// Peak-to-valley of a sinusoidal mark from its rms: 2 sqrt(2) (derived); the depth the fit's
/// verdicts give a residual rms as marks.
inline constexpr double kPeakToValleyPerRms = 2.0 * std::numbers::sqrt2;

/// The passes' profile against what the lines along the lay carry beyond it.
struct PassVisibility {
  double model_rms_um = 0.0;     ///< rms of the best-fit envelope's line means (the passes)
  double line_residual_rms_um = 0.0;  ///< rms of the residual's line means (what it lacks)
  double span_mm = 0.0;          ///< the window's extent across the lay (L)
  double rim_sagitta_mm = 0.0;   ///< a - sqrt(a^2 - s^2/4): a tilt t leaves tan(t) x this of
                                 ///< cusp (a the flat part's radius; DESIGN.md first-order tilt)
  bool visible = true;           ///< model_rms_um >= line_residual_rms_um
};

/// Measures the passes' visibility on the fit's window.
PassVisibility pass_visibility(const FloorFit& fit);

/// Where the passes do not stand out: the stepover's sigma is at least s^2 / L (one cycle of
/// ambiguity over the window: frequencies closer than 1 / L are not told apart, derived), the
/// pass offset's at least s / sqrt(12) (anywhere within a stepover, derived); the
/// tilt's and its components' at least the larger of the tilts whose step s tan(t) and whose
/// cusp tan(t) (a - sqrt(a^2 - s^2/4)) equal the lines' residual as a peak-to-valley (2 sqrt 2
/// x its rms, a sinusoid's); resolved flags and bounds follow.
void widen_for_faint_passes(const PassVisibility& p, FittedErrors& f);

/// The verdict's sentence for faint passes (empty when they are visible).
std::string faint_passes_sentence(const PassVisibility& p, const FittedErrors& f);

}  // namespace cuspmap

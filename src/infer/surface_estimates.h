// What a raster-finished floor tells about how it was cut, read from the surface alone: lay,
// stepover (across-lay period), cusp shape and effective cutting radius, feed marks and the
// once-per-revolution period (along-lay repeats), pass-to-pass signatures (zigzag, heel recut)
// and the setup plane. Inputs: Heightfield um over mm cells (measured or simulated, NaN =
// missing), SurfaceOptions; output: SurfaceEstimates with standard errors where a fit gives one.
// Cost O(cells * (lags + shifts)). Method: docs/diagnose.md (autocorrelation periods, phase
// folding, pooled cross-correlation); ISO 25178-2 lay from the power spectrum.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "core/heightfield.h"
#include "infer/band_means.h"
#include "infer/cusp_shape.h"
#include "infer/pass_signatures.h"
#include "infer/repeat_period.h"
#include "texture/fit_plane.h"

namespace cuspmap {

/// Fewest finite cells diagnose reads (64 x 64: a stepover needs ~10 cells and 4 repeats, and
/// the feed marks as many along the lay; derived bound).
inline constexpr long kMinDiagnoseCells = 64 * 64;
/// Fewest across-lay periods in a trace for the stepover (the autocorrelation must show the
/// repeat twice within half the trace; derived bound).
inline constexpr double kMinPeriodsInField = 4.0;
/// Pass correlations below this cannot tell passes apart from noise (common practice, no
/// source: the cross-correlation of two independent 300-sample noise traces stays below 0.2).
inline constexpr double kMinPassCorrelation = 0.4;

/// What the user knows about the surface.
struct SurfaceOptions {
  std::optional<double> lay_deg;  ///< known pass direction, deg from +X (else detected)
  std::optional<int> teeth;       ///< flutes, to turn a revolution period into feed per tooth
  int threads = 1;                ///< workers for the pass signatures (0 = all; same result)
};

/// Along-lay marks (feed per tooth, runout).
struct FeedMarks {
  bool found = false;              ///< a repeat along the lay exists
  double period_mm = 0.0;          ///< first repeat along the lay (tooth marks)
  double period_sigma_mm = 0.0;    ///< its standard error
  double revolution_mm = 0.0;      ///< once-per-revolution repeat (0 = none stands out)
  int marks_per_revolution = 0;    ///< revolution_mm / period_mm rounded (0 = none)
  double feed_per_tooth_mm = 0.0;  ///< revolution / teeth when teeth known, else period_mm
};

/// Surface-only estimates.
struct SurfaceEstimates {
  Plane setup_plane;                   ///< least-squares plane of the raw heights (setup tilt)
  double setup_tilt_deg = 0.0;         ///< angle of that plane to the machine XY plane
  double setup_tilt_toward_deg = 0.0;  ///< direction of its steepest descent, deg from +X
  double lay_deg = 0.0;                ///< pass direction (the lay), deg from +X, [0, 180)
  double lay_strength = 0.0;           ///< 0..1, from the power spectrum (1 with --lay)
  bool lay_given = false;              ///< lay from SurfaceOptions
  double lay_pass_share = 0.0;         ///< share of the variance the band means along the
                                       ///< lay carry (band_means: the passes' profile)
  RepeatPeriod stepover;               ///< across-lay period (stepover) and its standard error
  double stepover_prior_sigma_mm = 0.0;  ///< the sigma the envelope fit weighs this stepover
                                         ///< with as a prior (narrower than the reported one)
  CuspShape cusp;                      ///< folded cusp, effective radius
  double valley_mm = 0.0;              ///< across position of a cusp valley from the field centre
  FeedMarks feed;                      ///< along-lay repeats
  PassSignatures passes;               ///< pass-to-pass correlations
  std::string direction;           ///< "zigzag", "alike" (one-way, or zigzag that does not show)
                                   ///< or "undetermined"
  std::string heel;                ///< "recuts", "lifted" or "undetermined"
  std::vector<std::string> notes;  ///< what could not be told and why, one line each
};

/// Reads the surface.
/// @param[in] hf       heights um, cell mm; NaN cells are missing points
/// @param[in] options  known lay and teeth
/// @throws InputError (one line) for too few finite cells, no dominant lay (without a known
///         lay), no across-lay repeat, or a field shorter than kMinPeriodsInField periods
SurfaceEstimates surface_estimates(const Heightfield& hf, const SurfaceOptions& options);

}  // namespace cuspmap

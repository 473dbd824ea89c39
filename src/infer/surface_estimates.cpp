// Surface-only estimates: plane, lay, across-lay period, cusp fold, along-lay repeats and pass
// signatures, with one-line refusals for what the field cannot show.
// Inputs: Heightfield, SurfaceOptions; output: SurfaceEstimates. Cost: see the header.
// Method: docs/diagnose.md "From the surface alone".
#include "infer/surface_estimates.h"

#include <algorithm>
#include <cmath>
#include <numbers>
#include <vector>

#include "core/input_error.h"
#include "core/units.h"
#include "infer/band_means.h"
#include "infer/lay_lattice.h"
#include "texture/extract_profiles.h"
#include "texture/texture_direction.h"
#include "texture/texture_report.h"

namespace cuspmap {
namespace {

// Traces averaged across the lay for the period and the fold (every line: the fold's phase
// bins each want many samples).
constexpr int kAcrossTraces = 256;
// Alternate passes differ when their correlation beats the neighbour's by this much (common
// practice, no source: twice the scatter of the band correlations of a one-way floor).
constexpr double kAlternationMargin = 0.15;
// A band that matches its own mirror this well (relative to the best pass match) carries marks
// crossing both ways; below the lower ratio it carries one family only (common practice, no
// source: front-only rim arcs mirror at ~0.5, crossing arcs at ~1).
constexpr double kMirrorRecut = 0.85;
constexpr double kMirrorLifted = 0.65;
// Pass matches at least this good support a zigzag / one-way verdict (common practice, no
// source: noise-free simulated ball floors match at 0.98-1.0, dished flat floors at 0.5-0.7).
constexpr double kClearPassMatch = 0.8;
// More marks per revolution than this is no runout signature but a long-lag fluctuation (end
// mills for finishing have at most 8 flutes: common practice, no source).
constexpr int kMaxMarksPerRevolution = 8;
// A revolution repeat stands out when its peak beats the first (tooth) peak by this much.
constexpr double kRevolutionMargin = 0.1;
// Band means must carry this share of the variance for the pass comparison to tell zigzag
// from one-way (common practice, no source: ball floors give 0.96-1, dished flat floors
// 0.1-0.35, where one-way floors were read as zigzag).
constexpr double kMinShareForDirection = 0.5;
// The traces' period is a multiple of the band means' when their ratio is within this of a
// whole number, relative to the ratio (derived: two 1 % estimates); it needs this share of
// the band means' comb score to replace theirs (derived: a false 1/m of the period keeps
// ~1/m; see repeat_period).
constexpr double kMultipleSlack = 0.05;
constexpr double kMinTraceSupport = 0.5;
// The smoothed band means' ACF peaks can lean by up to half a cell (bands rounded to whole
// cells, the box, a saw-tooth profile): the period's standard error is at least this over the
// repeats (derived; measured 0.16 cell over 3 repeats on a tilted flat's 60-cell period).
constexpr double kBandPeakBiasSamples = 0.5;
// The reported stepover's floor is wider: on short random round trips (4-6 periods, noise, 2-3 %
// missing) the band means' period leaned by up to 1.1 samples over the repeats per 3 sigma
// (measured, docs/diagnose.md second campaign: rs1 0.7 %, rs5 0.6 %, rs10 0.2 % at 3-6.7 of
// the 0.5-sample sigmas). The fit's prior keeps the 0.5-sample sigma it was validated with.
constexpr double kReportedPeakBiasSamples = 1.5;
// The bands' quantile that follows the feed marks' bottoms (the swept envelope), and the margin
// by which its profile's comb score must beat the band means' to replace their period (measured
// on the 66 campaign floors, docs/diagnose.md: on floors without marks the quantile's score beat
// theirs by at most 0.001, on tooth floors left alone by up to 0.098, on the floors it corrects
// by 0.106-1.13. The 1 % quantile read seed 2028 rs5 and seed 2031 tc3 0.35 % and 0.36 % off,
// the 2 % one 0.78 % and 0.75 %, the 5 % one 3.0 % and 0.15 %).
constexpr double kEnvelopeQuantile = 0.01;
constexpr double kEnvelopeCombMargin = 0.1;
// Heights within this of their plane everywhere: a floor with nothing to read (float um
// rounding of a level floor; derived).
constexpr float kFlatFloorUm = 1e-4f;
// The spectral and band-mean lays agree within this (the band-mean peak is ~1 deg wide on a
// 600-cell field; derived).
constexpr double kLayAgreementDeg = 2.0;

// Peak-to-valley of a sinusoid over its rms (derived): the marks' depth from their rms.
constexpr double kSinePeakToValleyPerRms = 2.0 * std::numbers::sqrt2;
// A normal deviate's sd over its median absolute deviation (Hampel 1974, the MAD's consistency
// constant 1 / 0.6745).
constexpr double kMadToSigma = 1.4826;

// Measurement noise and marks of a floor without a readable lay, um: the noise from the
// differences of neighbouring cells (each carries 2 sigma^2 of independent noise and next to
// none of mm-scale marks; their median absolute deviation about their median, which skips the
// plane's constant slope and the odd step: Hampel 1974), the marks from the variance left above
// it, as a sinusoid's peak-to-valley (derived).
struct NoiseAndMarks {
  double noise_um = 0.0;
  double marks_um = 0.0;
};

NoiseAndMarks noise_and_marks(const Heightfield& residual) {
  std::vector<double> d;
  double sum2 = 0.0;
  std::int64_t n = 0;
  for (int b = 0; b < residual.ny; ++b) {
    for (int a = 0; a < residual.nx; ++a) {
      const float z = residual.z_um(b, a);
      if (!std::isfinite(z)) continue;
      sum2 += static_cast<double>(z) * z;
      ++n;
      const float right = a + 1 < residual.nx ? residual.z_um(b, a + 1) : NAN;
      const float up = b + 1 < residual.ny ? residual.z_um(b + 1, a) : NAN;
      if (std::isfinite(right)) d.push_back(right - z);
      if (std::isfinite(up)) d.push_back(up - z);
    }
  }
  NoiseAndMarks m;
  if (d.empty() || n == 0) return m;
  const auto median = [](std::vector<double>& v) {
    std::nth_element(v.begin(), v.begin() + static_cast<std::ptrdiff_t>(v.size() / 2), v.end());
    return v[v.size() / 2];
  };
  const double mid = median(d);
  for (double& x : d) x = std::abs(x - mid);
  m.noise_um = kMadToSigma * median(d) / std::numbers::sqrt2;
  const double left = sum2 / static_cast<double>(n) - m.noise_um * m.noise_um;
  m.marks_um = kSinePeakToValleyPerRms * std::sqrt(std::max(0.0, left));
  return m;
}

// Three significant figures for a message (DESIGN.md: human output).
double three_digits(double v) {
  if (!(v > 0.0)) return v;
  const double scale = std::pow(10.0, std::floor(std::log10(v)) - 2.0);
  return std::round(v / scale) * scale;
}

FeedMarks feed_marks(const std::vector<ProfileTrace>& along, const SurfaceOptions& o) {
  FeedMarks f;
  size_t longest = 0;
  for (const ProfileTrace& t : along) longest = std::max(longest, t.z_um.size());
  if (longest < 16) return f;
  const double dx = along.front().spacing_mm;
  const std::vector<double> acf = mean_autocorrelation(along, static_cast<int>(longest / 2));
  const RepeatPeriod r = repeat_period(acf, dx);
  if (!r.found) return f;
  f.found = true;
  f.period_mm = r.period_mm;
  f.period_sigma_mm = r.sigma_mm;
  if (r.strongest_peak > r.first_peak + kRevolutionMargin && r.strongest_mm > 1.5 * r.period_mm &&
      r.strongest_mm < (kMaxMarksPerRevolution + 0.5) * r.period_mm) {
    f.marks_per_revolution = static_cast<int>(std::lround(r.strongest_mm / r.period_mm));
    f.revolution_mm = f.marks_per_revolution * r.period_mm;
  } else if (o.teeth && *o.teeth > 1) {
    // Runout can leave the teeth's own marks below the repeat threshold: the first clear repeat
    // is then the revolution, and a local maximum of the ACF at 1/teeth of it shows the teeth.
    const double lag = r.period_mm / *o.teeth;
    const int i = static_cast<int>(std::lround(lag / dx));
    if (i >= 2 && i + 1 < static_cast<int>(acf.size()) && acf[i] > 0.0 &&
        acf[i] >= acf[i - 1] && acf[i] >= acf[i + 1]) {
      f.revolution_mm = r.period_mm;
      f.marks_per_revolution = *o.teeth;
      f.period_mm = lag;
      f.period_sigma_mm = r.sigma_mm / *o.teeth;
    }
  }
  f.feed_per_tooth_mm = f.period_mm;
  if (o.teeth && f.revolution_mm > 0.0) f.feed_per_tooth_mm = f.revolution_mm / *o.teeth;
  return f;
}

// The comb score of `acf` (band means' autocorrelation) at a period found, else 0.
double comb_score_at(const std::vector<double>& acf, const RepeatPeriod& p, const BandMeans& b) {
  return p.found ? comb_score(acf, p.period_mm / b.spacing_mm) : 0.0;
}

// The across-lay period of the bands' low quantile (band_quantiles) when its comb beats
// `mean_score`, the band means' comb score at their period, by kEnvelopeCombMargin.
std::optional<RepeatPeriod> envelope_period(const Heightfield& residual, double lay_deg,
                                            double mean_score) {
  const BandMeans low = band_quantiles(residual, lay_deg, kEnvelopeQuantile);
  if (low.z_um.empty()) return std::nullopt;
  const BandRepeat r = band_repeat(low);
  if (!r.period.found || comb_score_at(r.acf, r.period, low) < mean_score + kEnvelopeCombMargin) {
    return std::nullopt;
  }
  return r.period;
}

}  // namespace

SurfaceEstimates surface_estimates(const Heightfield& hf, const SurfaceOptions& options) {
  SurfaceEstimates e;
  const std::int64_t finite = reached_cells(hf);
  if (finite < kMinDiagnoseCells) {
    throw InputError("too few cells to diagnose: " + std::to_string(finite) +
                     " with a height, at least " + std::to_string(kMinDiagnoseCells) +
                     " (64 x 64) are needed");
  }
  e.setup_plane = fit_plane(hf);
  const double gx = e.setup_plane.gx_um_per_mm / kUmPerMm,
               gy = e.setup_plane.gy_um_per_mm / kUmPerMm;
  e.setup_tilt_deg = std::atan(std::hypot(gx, gy)) * 180.0 / std::numbers::pi;
  e.setup_tilt_toward_deg = std::atan2(-gy, -gx) * 180.0 / std::numbers::pi;
  const Heightfield residual = remove_plane(hf, e.setup_plane);

  if (residual.z_um.unaryExpr([](float z) { return std::isfinite(z) ? std::abs(z) : 0.0f; })
          .maxCoeff() <= kFlatFloorUm) {
    throw InputError("the floor shows no texture: every height lies on one plane (within " +
                     format_number(kFlatFloorUm) + " um), nothing to read");
  }
  if (options.lay_deg) {
    e.lay_deg = lay_wrap_deg(*options.lay_deg);
    e.lay_strength = 1.0;
    e.lay_given = true;
  } else {
    // The passes' direction is where the band means carry most of the variance; the spectrum's
    // mean direction is only a candidate: on a flat end mill's floor the tooth arcs dominate it.
    const TextureDirection dir = texture_direction(residual);
    e.lay_strength = dir.lay_strength;
    const std::vector<PassLay> peaks = lay_peaks(residual, kRowPeaks);
    const PassLay pl = pass_lay(residual, peaks, lay_wrap_deg(dir.lay_deg));
    if (pl.share < kMinPassLayShare) {
      // Say whether the marks are below the noise (nothing to read) or the floor's texture
      // has no direction (issue 17: a 4.4 mm flat at 0.0073 deg under 0.035 um noise).
      const NoiseAndMarks nm = noise_and_marks(residual);
      throw InputError("no dominant lay: band means along no direction carry " +
                       format_number(100.0 * kMinPassLayShare) + " % of the height variance (best " +
                       format_number(100.0 * pl.share) + " % at " + format_number(pl.lay_deg) +
                       " deg); the marks are ~" + format_number(three_digits(nm.marks_um)) +
                       " um deep (2 sqrt 2 x the rms above the noise) against " +
                       format_number(three_digits(nm.noise_um)) + " um rms cell-to-cell noise" +
                       (nm.marks_um < nm.noise_um ? ": under the noise" : "") +
                       "; pass --lay if the pass direction is known");
    }
    e.lay_deg = pl.lay_deg;
    // The largest share can fall on a row of the tooth marks' lattice instead of the passes.
    if (const std::optional<PassLay> rows = passes_among_rows(residual, pl, peaks)) {
      e.notes.push_back("the largest band-mean share (" + format_number(pl.lay_deg) +
                        " deg) lies along a row of the feed marks, not the passes (the marks "
                        "repeat along it no shorter than across it): the passes' " +
                        format_number(rows->lay_deg) + " deg is used");
      e.lay_deg = rows->lay_deg;
    }
    if (lay_gap_deg(dir.lay_deg, e.lay_deg) > kLayAgreementDeg &&
        dir.lay_strength >= kMinLayStrength) {
      e.notes.push_back("the spectrum's lay (" + format_number(lay_wrap_deg(dir.lay_deg)) +
                        " deg, the tooth arcs) differs from the passes' (" +
                        format_number(e.lay_deg) + " deg): the passes' is used");
    }
  }

  // Across the lay: the stepover from the band means (the feed marks averaged out along the
  // lay, so a zigzag's alternate passes look alike), else from the mean ACF of the traces.
  const BandMeans bands = band_means(residual, e.lay_deg);
  e.lay_pass_share = bands.share;
  const std::vector<ProfileTrace> across =
      extract_profiles(residual, e.lay_deg + 90.0, kAcrossTraces, 0.0);
  size_t longest = 0;
  for (const ProfileTrace& t : across) longest = std::max(longest, t.z_um.size());
  const double dx = hf.cell_mm;
  double span_mm = static_cast<double>(longest) * dx;
  if (!bands.z_um.empty()) {
    const int nb = static_cast<int>(bands.z_um.size());
    // Lags to 3/4 of the profile: the extra repeats sharpen the slope fit. Periods beyond
    // n / kMinPeriodsInField are refused below anyway: not searched (a zigzag's two-pass repeat
    // would otherwise comb better than its stepover on a short field).
    const BandRepeat band_rep = band_repeat(bands);
    const std::vector<double>& band_acf = band_rep.acf;
    e.stepover = band_rep.period;
    // The traces' first clear repeat, when it is no multiple of the band means' period and the
    // band means support it (their comb keeps half the best score there), is taken instead: a
    // comb can lock onto a fraction like 2/3 of the period when the profile's repeats differ.
    const RepeatPeriod traces =
        repeat_period(mean_autocorrelation(across, static_cast<int>(longest / 2)), dx);
    if (e.stepover.found && traces.found) {
      const double ratio = traces.period_mm / e.stepover.period_mm;
      const double support = comb_score(band_acf, traces.period_mm / bands.spacing_mm);
      const double best = comb_score(band_acf, e.stepover.period_mm / bands.spacing_mm);
      // The slack grows with the ratio: the traces' repeat at k periods carries k times the
      // absolute error of one (a bull-nose zigzag's noisy triple, 2.457 mm for 3 x 0.833 = 2.499
      // under 0.02 um noise, ratio 2.948, replaced the band means' 0.833; derived).
      if (std::abs(ratio - std::round(ratio)) > kMultipleSlack * std::max(1.0, ratio) &&
          support >= kMinTraceSupport * best) {
        e.stepover = traces;
      }
    }
    // The bands' low quantile follows the feed marks' bottoms, the swept envelope, whatever
    // each pass's spindle phase; the means also carry how neighbouring passes' marks overlap,
    // which changes from pass to pass. Where that profile repeats clearly better, it is read.
    const std::optional<RepeatPeriod> low =
        envelope_period(residual, e.lay_deg, comb_score_at(band_acf, e.stepover, bands));
    if (low) {
      e.notes.push_back(
          "the band means' repeat across the lay (" +
          (e.stepover.found ? format_number(three_digits(e.stepover.period_mm)) + " mm"
                            : std::string("none")) +
          ") is less clear than that of the marks' bottoms (the lowest " +
          format_number(100.0 * kEnvelopeQuantile) + " % of each band): " +
          format_number(three_digits(low->period_mm)) + " mm is used");
      e.stepover = *low;
    }
    const double per_sample_mm = bands.spacing_mm / std::max(1, e.stepover.repeats);
    e.stepover_prior_sigma_mm =
        std::max(e.stepover.sigma_mm, kBandPeakBiasSamples * per_sample_mm);
    e.stepover.sigma_mm = std::max(e.stepover.sigma_mm, kReportedPeakBiasSamples * per_sample_mm);
    span_mm = nb * bands.spacing_mm;
  }
  // Without a repeat in the band means, the traces' mean ACF (its first clear repeat).
  if (!e.stepover.found) {
    e.stepover = repeat_period(mean_autocorrelation(across, static_cast<int>(longest / 2)), dx);
    e.stepover_prior_sigma_mm = e.stepover.sigma_mm;
  }
  if (!e.stepover.found) {
    throw InputError("no across-lay period: traces across the lay (" + format_number(span_mm) +
                     " mm) show no repeat within half their length; the field must span at "
                     "least 4 passes whose marks stand above the feed marks and the noise");
  }
  if (e.stepover.period_mm * kMinPeriodsInField > span_mm) {
    throw InputError(
        "field too small for the across-lay period " + format_number(e.stepover.period_mm) +
        " mm: traces across the lay are " + format_number(span_mm) + " mm, at least " +
        format_number(kMinPeriodsInField * e.stepover.period_mm) + " mm (4 periods) are needed");
  }
  e.cusp = cusp_shape(across, e.stepover.period_mm, false);
  e.valley_mm = e.cusp.valley_phase_mm;
  if (!e.cusp.curved) {
    e.notes.push_back("the cusp valley does not curve upwards: no effective radius");
  }

  // Along the lay: feed marks and pass signatures (every line across, for whole bands).
  const std::vector<ProfileTrace> along = extract_profiles(residual, e.lay_deg, 1 << 20, 0.0);
  e.feed = feed_marks(along, options);
  if (!e.feed.found) {
    e.notes.push_back("no repeat along the lay: no feed marks to read (feed per tooth unknown)");
  } else if (!options.teeth || (*options.teeth > 1 &&
                                  e.feed.marks_per_revolution != *options.teeth)) {
    // Under runout one tooth's marks can cover the others': the repeat is then a revolution,
    // Z fz, and the ACF shows nothing at fz (measured on simulated runout floors, docs). Only a
    // revolution of exactly the given teeth's marks settles it.
    e.notes.push_back("the along-lay repeat (" + format_number(three_digits(e.feed.period_mm)) +
                      " mm) is taken for the feed per tooth; where runout lets one tooth's marks "
                      "cover the others' it is a whole revolution (teeth x feed per tooth), which "
                      "the surface cannot tell apart: give --feed-per-tooth or --job to be sure");
  }
  double max_shift = e.feed.revolution_mm > 0.0 ? e.feed.revolution_mm : e.feed.period_mm;
  if (max_shift <= 0.0) max_shift = 0.25 * span_mm;
  e.passes = pass_signatures(along, e.stepover.period_mm, e.valley_mm, max_shift, options.threads);
  const double ref = std::max(e.passes.next_pass, e.passes.second_pass);
  e.direction = "undetermined";
  e.heel = "undetermined";
  if (!e.feed.found || ref < kMinPassCorrelation) {
    e.notes.push_back(
        "marks along the lay are too faint against noise to compare passes: zigzag vs one-way "
        "and heel recut undetermined");
    return e;
  }
  // A verdict on the pass direction needs passes that match well (kClearPassMatch); between
  // that and kMinPassCorrelation the marks are too blurred to say.
  const double diff = e.passes.second_pass - e.passes.next_pass;
  if (e.lay_pass_share < kMinShareForDirection) {
    // Where the feed marks carry most of the variance, overlapping passes each add their own
    // spindle phase to a band: neighbouring bands can differ (or alternate) on a one-way floor.
    e.notes.push_back(
        "the feed marks outweigh the pass profile (band means carry " +
        format_number(100.0 * e.lay_pass_share) +
        " % of the variance): each pass's spindle phase changes the marks, so zigzag vs one-way "
        "is undetermined");
  } else if (e.passes.second_pass >= kClearPassMatch && diff >= kAlternationMargin) {
    e.direction = "zigzag";
  } else if (e.passes.next_pass >= kClearPassMatch && std::abs(diff) < kAlternationMargin) {
    e.direction = "alike";
    e.notes.push_back(
        "neighbouring passes look alike: one-way, or zigzag on a floor whose marks do not show "
        "the pass direction");
  } else {
    e.notes.push_back("passes match too loosely to tell zigzag from one-way");
  }
  if (e.passes.mirror >= kMirrorRecut * ref) {
    e.heel = "recuts";
  } else if (e.passes.mirror <= kMirrorLifted * ref) {
    e.heel = "lifted";
  }
  return e;
}

}  // namespace cuspmap

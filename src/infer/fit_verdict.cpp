// Verdict sentences from the fitted errors: tilt with its sigma or its bound, the heel, the tram
// target, the parameters the floor cannot show.
// Inputs: FittedErrors, FloorFit, SurfaceEstimates; output: FitVerdict. Cost O(1).
// Method: DESIGN.md "Geometry" (first-order tilt); mark depth from the rms of a sinusoid.
#include "infer/fit_verdict.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <numbers>
#include <string>

#include "core/display_quantity.h"
#include "core/units.h"
#include "infer/arc_beat.h"

namespace cuspmap {
namespace {

constexpr double kDegToRad = std::numbers::pi / 180.0;

// Human output at 3 significant figures (DESIGN.md); nothing below 1e-9 is shown.
std::string n3(double v) { return display_number(v, 1e-9); }

// "+X", "-Y" or "123 deg from +X" for a direction in deg.
std::string direction_words(double deg) {
  const double a = std::fmod(std::fmod(deg, 360.0) + 360.0, 360.0);
  const char* axes[] = {"+X", "+Y", "-X", "-Y"};
  for (int k = 0; k < 4; ++k) {
    const double d = std::abs(a - 90.0 * k);
    if (std::min(d, 360.0 - d) < 5.0) return axes[k];
  }
  return n3(a) + " deg from +X";
}

// What the revolving-envelope model never fits.
void add_not_fitted(const Cutter& c, FitVerdict& v) {
  if (c.shape != CutterShape::Ball) {
    v.cannot_tell.push_back(
        "dish angle: not fitted; the revolving cutter's floor is set by the rim, not the dish");
  }
  v.cannot_tell.push_back(
      "runout and its phase: not fitted (the revolving-envelope model has no teeth); a "
      "once-per-revolution repeat above is the surface's sign of runout");
}

}  // namespace

FitVerdict fit_verdict(const FittedErrors& f, const FloorFit& fit, const SurfaceEstimates& e) {
  return fit_verdict(f, fit, e, pass_visibility(fit));
}

FitVerdict fit_verdict(const FittedErrors& f, const FloorFit& fit, const SurfaceEstimates& e,
                       const PassVisibility& passes) {
  FitVerdict v;
  const Cutter& c = fit.model.cutter;
  const double diameter = c.diameter_mm;
  const double stepover = f.stepover_mm.value;
  v.tram_target_deg = std::atan(kInvisibleStepUm / (stepover * kUmPerMm)) / kDegToRad;
  if (fit.measured_rms_um > 0.0) {
    const double ratio = fit.residual_rms_um / fit.measured_rms_um;
    v.explained = std::max(0.0, 1.0 - ratio * ratio);
  }
  v.weak = v.explained < kWellExplained;
  if (v.weak) {
    v.lines.push_back("the model explains only " + n3(100.0 * v.explained) +
                      " % of this floor's variance: the marks are faint against noise or carry "
                      "what the model lacks (see fit.png); other tilts may fit nearly as well, "
                      "treat the values below as rough and their +- as too small");
  }
  // Passes that do not stand out at a repeat short enough to be the beat of neighbouring
  // passes' tooth arcs (seed 2028's heel floor: 0.175 mm read for 0.841 under 0.46 um feed
  // marks) read nothing. (Weakness alone is no sign: the random tooth round trip seed 2030 tc3
  // read its true 0.503 mm, under sqrt(a f) = 0.572, with 6 % explained and visible passes.)
  const ArcBeat beat = arc_beat(stepover, e.feed.found ? e.feed.period_mm : 0.0, c);
  if (!passes.visible && beat.possible) {
    v.arc_beat = true;
    v.arc_beat_stepover_mm = beat.partner_stepover_mm;
    v.cannot_tell.push_back(
        "stepover and spindle tilt: the across-lay repeat (" + n3(stepover) +
        " mm) is shorter than sqrt(rim radius x feed mark spacing) = " + n3(beat.limit_mm) +
        " mm and may be the beat of neighbouring passes' tooth arcs, as from passes about " +
        n3(beat.partner_stepover_mm) +
        " mm apart (rim radius x mark spacing / repeat, derived): the passes' own marks do not "
        "stand out from the feed marks on this floor; take the stepover from the program, and "
        "the tram from an indicator or a floor whose passes show");
    add_not_fitted(c, v);
    return v;
  }
  if (!passes.visible) v.lines.push_back(faint_passes_sentence(passes, f));
  v.lines.push_back("stepover " + n3(stepover) + " mm (+-" + n3(f.stepover_mm.sigma) +
                    "), passes along " + n3(fit.model.lay_deg) + " deg from +X");
  if (!f.tilt_deg.fitted) {
    v.cannot_tell.push_back(
        "spindle tilt: a ball end mill leaves the same floor at any small tilt (only its contact "
        "point moves): tram cannot be read from this floor");
  } else if (!f.tilt_deg.resolved) {
    v.lines.push_back("no spindle tilt shows: tilt under " + n3(f.tilt_deg.bound) +
                      " deg (2 sigma) on this " + n3(diameter) + " mm tool");
  } else {
    std::string s = "spindle tilted " + n3(f.tilt_deg.value) + " deg (+-" +
                    n3(f.tilt_deg.sigma) + "): end face lowest toward " +
                    direction_words(f.tilt_toward_deg.value) + " (+-" +
                    n3(f.tilt_toward_deg.sigma) + " deg)";
    if (!f.along_sign_known && f.tilt_along_deg.resolved) {
      s += " or toward " + direction_words(f.tilt_toward_alt_deg) +
           " (the swept floor is the same with the lowest point ahead of or behind the cut)";
    }
    v.lines.push_back(s);
  }
  // Where passes overlap past the rim's lowest point the cusps fix only tan(tilt) /
  // cos^2(direction from the lay) (floor_fit's profile over the direction): say the interval and
  // the combination plainly rather than a tilt that looks measured.
  const auto [t_lo, t_hi] = fit.tilt_interval_deg;
  // (An unresolved tilt is reported by its bound above; the interval would read as a finding.)
  if (f.tilt_deg.resolved && f.tilt_deg.value > 0.0 &&
      t_hi - t_lo > kIntervalOnlyWidth * f.tilt_deg.value) {
    const double dir = std::atan2(f.tilt_across_deg.value, f.tilt_along_deg.value);
    v.tilt_interval_only = true;
    v.ridge_tilt_deg =
        std::atan(std::tan(f.tilt_deg.value * kDegToRad) / (std::cos(dir) * std::cos(dir))) /
        kDegToRad;
    v.lines.push_back(
        "the tilt is known only as an interval: " + n3(t_lo) + " to " + n3(t_hi) +
        " deg (3 sigma; best fit " + n3(f.tilt_deg.value) +
        " deg); the passes overlap past the end face's lowest point, so this floor fixes only "
        "tan(tilt) / cos^2(direction from the passes), equal to the tan of " +
        n3(v.ridge_tilt_deg) + " deg, not the tilt and its direction apart");
  }
  if (f.tilt_deg.fitted && f.tilt_across_deg.resolved) {
    const double step_um = stepover * kUmPerMm * std::tan(std::abs(f.tilt_across_deg.value) * kDegToRad);
    v.lines.push_back("across the feed " + n3(std::abs(f.tilt_across_deg.value)) + " deg (+-" +
                      n3(f.tilt_across_deg.sigma) + ") leaves a step of " + n3(step_um) +
                      " um between passes; tram to within " + n3(v.tram_target_deg) +
                      " deg across the feed on this " + n3(diameter) +
                      " mm tool to keep it under " + n3(kInvisibleStepUm) + " um");
  }
  // The heel: marks one way only mean the trailing rim clears the floor. Its lift 2 R tan(a)
  // then exceeds the depth of the marks, which bounds the tilt along the feed from below; above
  // that bound the floor barely changes with the tilt (the rim's cusp is tan(a) times a few um).
  v.heel_lifted = e.heel == "lifted";
  if (f.tilt_deg.fitted && v.heel_lifted) {
    const double depth_um = kPeakToValleyPerRms * e.passes.along_rms_um;
    v.heel_min_tilt_deg = std::atan(depth_um / (diameter * kUmPerMm)) / kDegToRad;
    std::string s = "the heel is lifted on every pass (marks run one way only): the end face is "
                    "lower at one edge along the feed by at least " +
                    n3(v.heel_min_tilt_deg) + " deg";
    s += f.tilt_along_deg.resolved
             ? "; the fit puts it at " + n3(f.tilt_along_deg.value) + " deg (+-" +
                   n3(f.tilt_along_deg.sigma) + ")"
             : "; beyond that this floor only bounds it: at most " +
                   n3(std::max(f.tilt_along_deg.bound, v.heel_min_tilt_deg)) + " deg";
    v.lines.push_back(s);
  } else if (f.tilt_deg.fitted && e.heel == "recuts") {
    v.lines.push_back(
        "the heel recuts (marks cross both ways): tilt along the feed is under the lift that "
        "clears the marks");
  } else if (f.tilt_deg.fitted && !f.tilt_along_deg.resolved) {
    v.lines.push_back("tilt along the feed does not show on this floor: at most " +
                      n3(f.tilt_along_deg.bound) + " deg (2 sigma)");
  }
  add_not_fitted(c, v);
  return v;
}

void withhold_arc_beat(const FitVerdict& v, FittedErrors& f) {
  if (!v.arc_beat) return;
  for (FittedValue* x : {&f.tilt_deg, &f.tilt_toward_deg, &f.tilt_along_deg, &f.tilt_across_deg,
                         &f.stepover_mm, &f.offset_mm}) {
    x->resolved = false;
    x->sigma = std::numeric_limits<double>::infinity();
    x->bound = std::numeric_limits<double>::infinity();
  }
}

}  // namespace cuspmap

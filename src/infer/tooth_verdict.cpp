// Tooth-stage sentences: runout (and phase modulo 360 / Z), dish, along-feed sign, cannot-tell.
// Inputs: ToothFit; output: ToothVerdict; FittedErrors/FitVerdict updated. Cost O(1).
// Method: Kline & DeVor 1983 runout: the tooth it favours cuts e further out, the opposite e
// less, so one mark per revolution is deeper.
#include "infer/tooth_verdict.h"

#include <algorithm>
#include <cmath>
#include <utility>

#include "core/display_quantity.h"

namespace cuspmap {
namespace {

std::string n3(double v) { return display_number(v, 1e-9); }
std::string pm(const FittedValue& v) { return n3(v.value) + " (+-" + n3(v.sigma) + ")"; }

}  // namespace

ToothVerdict tooth_verdict(const ToothFit& t) {
  ToothVerdict v;
  if (!t.ran) {
    v.cannot_tell.push_back("runout, its phase and the dish: tooth-resolved stage not run (" +
                            t.skipped + ")");
    return v;
  }
  if (t.marks_misfit) {
    v.cannot_tell.push_back(
        "runout, its phase, the dish and the sign of the tilt along the feed: the tooth-resolved "
        "fit did not reproduce the floor's tooth marks (smoothed residual " +
        n3(t.smoothed_residual_ratio) + " of the marks' rms), so no value is given");
    return v;
  }
  const std::string per_rev =
      "every " + n3(t.teeth * t.feed_per_tooth_mm) + " mm along the feed";
  if (!t.dish_deg.resolved && !t.runout_um.resolved) {
    std::string s =
        "runout and dish: the floor shows no tooth marks the fit can read (an undished, "
        "untilted flat leaves none), so the runout cannot be read from it";
    if (std::isfinite(t.runout_um.bound)) s += "; runout under " + n3(t.runout_um.bound) + " um";
    v.cannot_tell.push_back(s);
    return v;
  }
  v.lines.push_back(
      "tooth-resolved stage (experimental, not yet reliable on measured floors: "
      "docs/diagnose.md): treat the runout, dish and along-feed sign below as leads to check");
  if (t.runout_not_read) {
    v.cannot_tell.push_back(
        t.runout_projection_only
            ? "runout: with " + std::to_string(t.teeth) +
                  " teeth the floor shows only the part along the teeth and the fit does not "
                  "read it reliably (docs/diagnose.md); check the runout with a dial indicator "
                  "(spindle stopped and locked out)"
            : "runout and its phase: the tooth-resolved fit cannot tell them (another phase "
              "fits within " +
                  n3(t.runout_basin_sigmas) +
                  " residual variances, or the sigmas are unbounded: docs/diagnose.md); check "
                  "the runout with a dial indicator (spindle stopped and locked out)");
  } else if (t.runout_um.resolved) {
    const std::string what =
        t.runout_projection_only
            ? "runout at least " + pm(t.runout_um) + " um (the part along the teeth)"
            : "runout " + pm(t.runout_um) + " um, " + pm(t.runout_phase_deg) +
                  " deg ahead of a tooth";
    const std::string act =
        t.runout_um.value >= kRunoutCheckUm
            ? ": indicate the holder, collet and shank with a dial indicator (spindle stopped "
              "and locked out) and reseat or replace what runs out; "
            : ": within what a collet holder usually runs; ";
    v.lines.push_back(what + act + "it leaves one deeper mark per revolution (" + per_rev +
                      ") and loads one tooth more, which wears first");
  } else {
    v.lines.push_back("runout under " + n3(t.runout_um.bound) + " um (not resolved: " +
                      pm(t.runout_um) + "): the teeth cut alike on this floor");
  }
  if (!t.runout_not_read) {  // when not read, the runout's line above says all there is
    if (t.runout_projection_only) {
      v.cannot_tell.push_back(
          "the runout's direction: with " + std::to_string(t.teeth) +
          " teeth the floor shows only the part along the teeth, |e cos(phase)|; the runout "
          "itself is at least that");
    } else {
      v.cannot_tell.push_back("which tooth is tooth 0: the runout phase is known modulo " +
                              n3(t.runout_phase_period_deg) +
                              " deg (the spindle phase of each pass is unknown)");
    }
  }
  if (t.dish_deg.resolved) {
    v.lines.push_back("end-face dish " + pm(t.dish_deg) +
                      " deg: the rim cuts and each tooth leaves an arc; between arcs the floor "
                      "rises by about (feed per tooth / 2) x tan(dish)");
  } else {
    v.lines.push_back("end-face dish under " + n3(t.dish_deg.bound) + " deg (not resolved)");
  }
  if (t.along_sign_known) {
    v.lines.push_back(std::string("the tooth arcs put the end face's lowest point ") +
                      (t.tilt_along_deg.value >= 0.0 ? "ahead of" : "behind") +
                      " the cut on passes along the lay (tilt along the feed " +
                      pm(t.tilt_along_deg) + " deg; the other sign fits worse by " +
                      n3(t.along_sign_cost_sigmas) + " residual variances)");
  } else {
    v.cannot_tell.push_back("the sign of the tilt along the feed: the tooth arcs fit both ways "
                            "about as well");
  }
  return v;
}

void merge_tooth_verdict(const ToothFit& t, const ToothVerdict& tv, FitVerdict& v) {
  if (t.ran) {
    std::erase_if(v.cannot_tell, [](const std::string& s) {
      return s.starts_with("dish angle: not fitted") || s.starts_with("runout and its phase");
    });
  }
  v.lines.insert(v.lines.end(), tv.lines.begin(), tv.lines.end());
  v.cannot_tell.insert(v.cannot_tell.end(), tv.cannot_tell.begin(), tv.cannot_tell.end());
}

}  // namespace cuspmap

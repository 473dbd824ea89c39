// Passes' profile against the residual's line means on the fit window (see the header).
// Inputs: FloorFit; output: PassVisibility; widened FittedErrors. Cost O(window samples).
// Method: band means one sample wide along the fitted lay (infer/band_means); the period's
// resolution over L is s^2 / L (Fourier: 1 / L in frequency, derived); a step s tan(a).
#include "infer/pass_visibility.h"

#include <algorithm>
#include <cmath>
#include <numbers>
#include <tuple>
#include <utility>
#include <vector>

#include "core/display_quantity.h"
#include "core/units.h"
#include "infer/band_means.h"

namespace cuspmap {
namespace {

constexpr double kDegToRad = std::numbers::pi / 180.0;

// Rms of the band means about their mean, and their extent (mm); {0, 0} when none qualify.
std::pair<double, double> line_means_rms(const Heightfield& hf, double lay_deg) {
  const BandMeans b = band_means(hf, lay_deg);
  if (b.z_um.empty()) return {0.0, 0.0};
  double mean = 0.0;
  for (double z : b.z_um) mean += z;
  mean /= static_cast<double>(b.z_um.size());
  double ss = 0.0;
  for (double z : b.z_um) ss += (z - mean) * (z - mean);
  return {std::sqrt(ss / static_cast<double>(b.z_um.size())),
          static_cast<double>(b.z_um.size()) * b.spacing_mm};
}

// The value with its sigma raised to at least `floor` (resolved and bound follow).
void widen(FittedValue& x, double floor) {
  if (!x.fitted || !(x.sigma < floor)) return;
  x = fitted_value(x.value, floor * floor, true);
}

}  // namespace

PassVisibility pass_visibility(const FloorFit& fit) {
  PassVisibility p;
  const double lay = fit.model.lay_deg;
  std::tie(p.model_rms_um, p.span_mm) = line_means_rms(fit.simulated, lay);
  p.line_residual_rms_um = line_means_rms(fit.residual, lay).first;
  p.visible = p.model_rms_um >= p.line_residual_rms_um;
  const double a = fit.model.cutter.flat_radius_mm();
  const double half = 0.5 * fit.params(kStepoverMm);
  p.rim_sagitta_mm = half < a ? a - std::sqrt(a * a - half * half) : a;
  return p;
}

void widen_for_faint_passes(const PassVisibility& p, FittedErrors& f) {
  if (p.visible || !(p.span_mm > 0.0)) return;
  const double s = f.stepover_mm.value;
  widen(f.stepover_mm, s * s / p.span_mm);
  // Where the passes lie across the lay is then anywhere within a stepover: sd s / sqrt(12)
  // (uniform, derived; seed 2030 tc6's envelope offset was 0.29 stepover off at 5.4 sigma).
  widen(f.offset_mm, s / std::sqrt(12.0));
  // A tilt across the feed shows as a step s tan(t) between passes, one along it as a cusp
  // tan(t) x the rim's sagitta (DESIGN.md first-order tilt): under the lines' residual (as a
  // peak-to-valley) neither is seen. (Seed 2030 tc4, 8.3 mm flat at 1.264 mm, 0.0573 deg in the
  // ridge regime under runout arcs: 0.001 +- 0.014 deg, a bound of 0.029 under the truth.)
  // Where passes overlap past the rim's lowest point a tilt in any direction shows only as such
  // a cusp (floor_fit's ridge regime, tan(t) / cos^2(direction from the lay) of it), so the
  // cusp's floor bounds every component (tc4's across-feed 0.0233 deg: bound 0.0068 by its
  // step alone).
  const double marks_um = kPeakToValleyPerRms * p.line_residual_rms_um;
  const double step_floor_deg = std::atan(marks_um / (s * kUmPerMm)) / kDegToRad;
  const double cusp_floor_deg =
      p.rim_sagitta_mm > 0.0 ? std::atan(marks_um / (p.rim_sagitta_mm * kUmPerMm)) / kDegToRad
                             : 0.0;
  const double tilt_floor_deg = std::max(step_floor_deg, cusp_floor_deg);
  for (FittedValue* x : {&f.tilt_deg, &f.tilt_along_deg, &f.tilt_across_deg}) {
    widen(*x, tilt_floor_deg);
  }
}

std::string faint_passes_sentence(const PassVisibility& p, const FittedErrors& f) {
  if (p.visible) return {};
  auto n3 = [](double v) { return display_number(v, 1e-9); };
  return "the passes' own profile (" + n3(p.model_rms_um) +
         " um rms) is under what the lines along the lay carry beyond it (" +
         n3(p.line_residual_rms_um) +
         " um rms: feed marks' beat, faint passes): the stepover is known only to +-" +
         n3(f.stepover_mm.sigma) + " mm (one cycle over the " + n3(p.span_mm) +
         " mm window), the passes' offset to a stepover, and the tilt only above the step or rim "
         "cusp it would leave (+-" +
         n3(f.tilt_deg.sigma) + " deg)";
}

}  // namespace cuspmap

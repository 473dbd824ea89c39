// Cusp of a tilted end mill across straight passes: section by chord minimum, valley by scan and
// golden section, crest by bisection on the crossing of neighbouring sections, exact statistics.
// Inputs: Cutter (mm, deg; tilt direction from the feed), stepover mm; output: CuspResult (um).
// Method: first-order tilt (DESIGN.md "Geometry"); derived ellipse geometry in scallop_tilted.h.
#include "cusp/scallop_tilted.h"

#include <algorithm>
#include <cassert>
#include <cmath>
#include <limits>
#include <numbers>
#include <utility>
#include <vector>

#include "core/units.h"
#include "tool/chord_min.h"
#include "tool/golden_section_min.h"
#include "tool/revolved_profile.h"

namespace cuspmap {
namespace {

constexpr double kInf = std::numeric_limits<double>::infinity();
// Samples of the section across [-R, R] that bracket its lowest point before golden section
// refines it: the section is unimodal (convex for ball and undished bull-nose, the rim ellipse
// for dished faces), so the bracket of the lowest sample holds the minimum.
constexpr int kValleySamples = 256;
// Golden-section steps on that bracket: 0.618^120 ~ 1e-25 of R, far below double rounding.
constexpr int kGoldenSteps = 120;
// Bisection on the crossing stops at this fraction of the stepover (scallop_plane's tolerance):
// a crossing on a vertical tangent (the ellipse's end) then errs by ~sqrt(1e-15) of t R, far
// below a nanometre.
constexpr double kCrossingRelTol = 1e-15;
// Two sides of the crossing that differ by more than this fraction of R meet in a wall (a
// saw-tooth across the feed); 1e-12 R is far above rounding.
constexpr double kWallRelTol = 1e-12;
// Step of the central difference for the section's curvature at its lowest point, fraction of R:
// the truncation error is ~(1e-4)^2 relative, rounding ~1e-16 / 1e-8 of the curvature.
constexpr double kCurvatureStepRel = 1e-4;

// The section of one pass of the tilted cutter: S(y) = min over the chord at lateral offset y of
// p(|v|) - tan(tau) v.n, with n at phi from the feed: the chord's linear term tan(tau) cos(phi) x
// and the lateral term tan(tau) sin(phi) y.
class TiltedSection {
 public:
  explicit TiltedSection(const Cutter& cutter)
      : profile_(revolved_profile(cutter, 0.0)), big_r_(cutter.radius_mm()) {
    const double tau = cutter.tilt_deg * std::numbers::pi / 180.0;
    const double phi = cutter.tilt_toward_deg * std::numbers::pi / 180.0;
    along_ = std::tan(tau) * std::cos(phi);
    across_ = std::tan(tau) * std::sin(phi);
  }

  double operator()(double y) const {
    if (!(std::abs(y) <= big_r_)) return kInf;
    return chord_min(profile_, y, along_, -big_r_, big_r_, false).value_mm - across_ * y;
  }

  double big_r() const { return big_r_; }

 private:
  RevolvedProfile profile_;
  double big_r_ = 0.0;
  double along_ = 0.0, across_ = 0.0;
};

// Lateral offset of the section's lowest point.
double valley_offset(const TiltedSection& section) {
  const double big_r = section.big_r();
  const double step = 2.0 * big_r / kValleySamples;
  int best = 0;
  double best_value = kInf;
  for (int k = 0; k <= kValleySamples; ++k) {
    const double v = section(-big_r + k * step);
    if (v < best_value) {
      best_value = v;
      best = k;
    }
  }
  const double a = std::max(-big_r, -big_r + (best - 1) * step);
  const double b = std::min(big_r, -big_r + (best + 1) * step);
  double lowest = 0.0;
  const double y = golden_section_min(section, a, b, kGoldenSteps, lowest);
  return section(y) <= best_value ? y : -big_r + best * step;
}

}  // namespace

double tilted_section_mm(const Cutter& cutter, double y_mm) { return TiltedSection(cutter)(y_mm); }

CuspResult scallop_tilted(const Cutter& cutter, double stepover_mm) {
  assert(stepover_mm > 0.0 && cutter.tilt_deg != 0.0 && "tilted cusp domain");
  const TiltedSection section(cutter);
  const double s = stepover_mm, big_r = section.big_r();
  CuspResult r;
  r.stepover_mm = s;
  r.chord_mm = s;
  if (s >= 2.0 * big_r) {
    r.limit = CuspLimit::PassesDoNotOverlap;
    // Beyond D uncut strips stand between the passes; at D the rims just touch and the height
    // below is the model's supremum (what inverse_stepover asks for).
    if (s > 2.0 * big_r) return r;
  }
  const double y_v = valley_offset(section);
  const double floor_mm = section(y_v);
  // Heights above the floor's lowest point: pass 0 and its neighbour one stepover to the left.
  auto pass0 = [&section, floor_mm](double y) { return section(y) - floor_mm; };
  auto pass1 = [&section, floor_mm, s](double y) { return section(y - s) - floor_mm; };
  // Between the lowest points of two neighbouring passes the sections are monotone (unimodal
  // sections), so pass 0 is lower left of the crossing and pass 1 right of it.
  double lo = y_v, hi = y_v + s;
  for (int iter = 0; iter < 200 && hi - lo > kCrossingRelTol * s; ++iter) {
    const double mid = 0.5 * (lo + hi);
    if (pass0(mid) < pass1(mid)) {
      lo = mid;
    } else {
      hi = mid;
    }
  }
  const double n_left = pass0(lo), n_right = pass1(hi);
  assert(std::isfinite(n_left) && std::isfinite(n_right) && "passes overlap for s < D");
  std::vector<CuspArcPiece> pieces;
  if (lo > y_v) pieces.push_back(graph_piece(y_v, lo, pass0));
  if (std::abs(n_left - n_right) > kWallRelTol * big_r) {
    pieces.push_back({lo, lo, n_left, n_right, {}});  // a wall: the saw-tooth's step
  }
  if (y_v + s > hi) pieces.push_back(graph_piece(hi, y_v + s, pass1));
  r.scallop_um = std::max(n_left, n_right) * kUmPerMm;
  r.stats = periodic_profile_stats(pieces, 1.0, 0.0);
  // Small-stepover approximation: the parabola of the section's curvature at its lowest point.
  const double h = kCurvatureStepRel * big_r;
  if (std::abs(y_v) + h < big_r) {
    const double curvature = (pass0(y_v - h) - 2.0 * pass0(y_v) + pass0(y_v + h)) / (h * h);
    if (curvature > 0.0) {
      r.effective_radius_mm = 1.0 / curvature;
      r.scallop_approx_um = s * s * curvature / 8.0 * kUmPerMm;
      r.stats_approx = parabolic_cusp_stats(r.scallop_approx_um);
    }
  }
  return r;
}

}  // namespace cuspmap

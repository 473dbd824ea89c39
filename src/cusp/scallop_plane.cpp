// Cusp of a revolving end mill on a sloped plane: bisection on the crossing of neighbouring
// swept sections, then the exact profile's statistics in the surface frame.
// Inputs: Cutter (mm), plan-view stepover (mm), slope (deg); output: CuspResult (um).
// Method: swept section = min of p over the chord (DESIGN.md "Geometry"); versine arc residuals.
#include "cusp/scallop_plane.h"

#include <algorithm>
#include <cassert>
#include <cmath>
#include <limits>
#include <numbers>
#include <vector>

#include "core/units.h"

namespace cuspmap {
namespace {

// Bisection on the crossing stops at this fraction of the stepover: the cusp height error is
// then below double rounding of the heights (slopes of the section are bounded off the walls).
constexpr double kCrossingRelTol = 1e-15;
// Two sides of the crossing that differ by more than this fraction of R form a wall (a jump in
// height at one plan position) rather than a smooth meeting; 1e-12 R is far above rounding.
constexpr double kWallRelTol = 1e-12;
// A bisection end this close to a rim (fraction of the stepover; a few bracket widths) is the
// rim itself.
constexpr double kRimSnapRel = 1e-13;
// Step, as a fraction of the stepover, for the one-sided slope that detects an overhang.
constexpr double kSlopeProbeRel = 1e-7;

// Plan positions within this fraction of R outside a rim count as on it: u and the contact are
// sums of a few mm-sized terms, so a rim reached through them can land a few ulps beyond R.
constexpr double kRimRelTol = 1e-14;

constexpr double kInf = std::numeric_limits<double>::infinity();

// The swept section of the cutter, positioned to touch a line of slope alpha, seen as the
// vertical height of the section above that line at plan offset u from the contact.
class SlopedSection {
 public:
  SlopedSection(const Cutter& cutter, double slope_rad)
      : big_r_(cutter.radius_mm()),
        rc_(cutter.effective_corner_mm()),
        a_(big_r_ - rc_),
        sin_a_(std::sin(slope_rad)),
        cos_a_(std::cos(slope_rad)),
        tan_a_(std::tan(slope_rad)),
        half_a_(0.5 * slope_rad),
        contact_y_(a_ + rc_ * sin_a_),
        contact_z_(2.0 * rc_ * std::sin(half_a_) * std::sin(half_a_)) {}

  // Vertical height above the surface line at plan position contact + u; +inf beyond the rims.
  double residual(double u) const {
    const double y = contact_y_ + u;
    if (std::abs(y) > big_r_ * (1.0 + kRimRelTol)) return kInf;
    const double ay = std::min(std::abs(y), big_r_);
    if (ay <= a_) return -contact_z_ - u * tan_a_;  // flat face at tip height
    // Corner arc of the side y falls on: point at angle beta from straight down; its distance
    // to the line is d_centre - rc cos(beta - alpha), d_centre the arc centre's distance.
    const double side = y > 0.0 ? 1.0 : -1.0;
    const double beta = side * std::asin(std::min(1.0, (ay - a_) / rc_));
    const double d_centre_minus_rc = (side > 0.0) ? 0.0 : 2.0 * a_ * sin_a_;
    const double half = 0.5 * (beta - 2.0 * half_a_);
    return (d_centre_minus_rc + 2.0 * rc_ * std::sin(half) * std::sin(half)) / cos_a_;
  }

  double big_r() const { return big_r_; }
  double flat_half_width() const { return a_; }
  double contact_y() const { return contact_y_; }
  double cos_a() const { return cos_a_; }
  double tan_a() const { return tan_a_; }

 private:
  double big_r_, rc_, a_;
  double sin_a_, cos_a_, tan_a_, half_a_;
  double contact_y_, contact_z_;
};

CuspArcPiece wall_piece(double u, double n0, double n1) { return {u, u, n0, n1, {}}; }

}  // namespace

CuspResult scallop_on_plane(const Cutter& cutter, double stepover_mm, double slope_deg) {
  const double slope_rad = std::abs(slope_deg) * std::numbers::pi / 180.0;
  assert(stepover_mm > 0.0 && slope_rad < 0.5 * std::numbers::pi && "plane cusp domain");
  const SlopedSection sec(cutter, slope_rad);
  const double s = stepover_mm, cos_a = sec.cos_a();
  CuspResult r;
  r.stepover_mm = s;
  r.chord_mm = s / cos_a;
  if (s >= 2.0 * sec.big_r()) r.limit = CuspLimit::PassesDoNotOverlap;
  // The next pass's section already lies on the surface line at this contact: flat faces overlap.
  if (sec.residual(-s) <= 0.0) return r;

  auto pass0 = [&sec, cos_a](double u) { return sec.residual(u) * cos_a; };
  auto pass1 = [&sec, cos_a, s](double u) { return sec.residual(u - s) * cos_a; };
  double lo = 0.0, hi = s;
  for (int iter = 0; iter < 200 && hi - lo > kCrossingRelTol * s; ++iter) {
    const double mid = 0.5 * (lo + hi);
    if (sec.residual(mid) < sec.residual(mid - s)) {
      lo = mid;
    } else {
      hi = mid;
    }
  }
  // A crossing at a rim meets a vertical tangent, where the bracket's width would show as
  // sqrt(width) in height: snap lo/hi onto the rims they sit at.
  const double u_rim0 = sec.big_r() - sec.contact_y();      // pass 0's uphill rim
  const double u_rim1 = s - sec.big_r() - sec.contact_y();  // pass 1's downhill rim
  const double snap = kRimSnapRel * s;
  if (std::abs(lo - u_rim0) <= snap) lo = u_rim0;
  if (std::abs(hi - u_rim1) <= snap) hi = u_rim1;
  std::vector<CuspArcPiece> pieces;
  double n_left = pass0(lo);  // end of pass 0's part of the profile
  double u1_start = hi;       // where pass 1's part starts
  if (lo > 0.0) pieces.push_back(graph_piece(0.0, lo, pass0));
  double n_right = pass1(hi);
  if (!std::isfinite(n_right)) {
    // No overlap: an uncut strip between the rims; its height is at least the higher rim.
    r.limit = CuspLimit::PassesDoNotOverlap;
    u1_start = u_rim1;
    n_right = pass1(u1_start);
    const double cap = std::max(n_left, n_right);
    pieces.push_back(wall_piece(lo, n_left, cap));
    pieces.push_back(graph_piece(lo, u1_start, [cap](double) { return cap; }));
    n_left = cap;
  }
  const double wall_tol = kWallRelTol * sec.big_r();
  if (std::abs(n_left - n_right) > wall_tol) {
    pieces.push_back(wall_piece(pieces.empty() ? lo : pieces.back().u1_mm, n_left, n_right));
    if (n_right > n_left) r.side_forms_cusp = true;
    if (n_right < n_left) r.profile_overhangs = true;  // a descending wall leans over
  }
  if (r.limit == CuspLimit::PassesDoNotOverlap) r.side_forms_cusp = true;
  r.scallop_um = std::max(n_left, n_right) * kUmPerMm;

  // Pass 1's part, split where its section changes from corner arc to flat face and back.
  std::vector<double> breaks{u1_start};
  for (double y_break : {-sec.flat_half_width(), sec.flat_half_width()}) {
    const double u = y_break - sec.contact_y() + s;
    if (u > breaks.back() && u < s) breaks.push_back(u);
  }
  breaks.push_back(s);
  for (size_t k = 0; k + 1 < breaks.size(); ++k) {
    if (breaks[k + 1] > breaks[k]) pieces.push_back(graph_piece(breaks[k], breaks[k + 1], pass1));
  }
  // The steepest descent of pass 1's part is at its start; if the along-surface position runs
  // backwards there (dx/du = 1/cos a + tan a dn/du < 0), the cusp's face overhangs.
  const double probe = kSlopeProbeRel * s;
  if (u1_start + probe < s) {
    const double dn = (pass1(u1_start + probe) - pass1(u1_start)) / probe;
    if (1.0 / cos_a + sec.tan_a() * dn < 0.0) r.profile_overhangs = true;
  }
  r.stats = periodic_profile_stats(pieces, 1.0 / cos_a, sec.tan_a());
  return r;
}

}  // namespace cuspmap

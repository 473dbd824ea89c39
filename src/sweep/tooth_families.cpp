// Tooth families: bearing period, runout components and each tooth's shifted profile.
// Inputs: tooth profile (mm), Z, runout (mm, rad), axial offsets (mm); output: ToothFamily list.
// Method: see tooth_families.h.
#include "sweep/tooth_families.h"

#include <algorithm>
#include <cmath>
#include <numbers>

namespace cuspmap {
namespace {

constexpr double kTwoPi = 2.0 * std::numbers::pi;
// Slope of the filler line over rho < e_cos (no edge there): any positive slope keeps q
// unimodal with its lowest point no nearer the axis than the tooth's own; 1 mm/mm is steeper
// than every dish and reads plainly in a debugger.
constexpr double kFillerSlope = 1.0;

// p(rho - shift) as a profile over rho in [0, R + shift].
RevolvedProfile shifted_profile(const RevolvedProfile& p, double shift_mm) {
  RevolvedProfile q;
  q.radius_mm = p.radius_mm + shift_mm;
  q.runout_mm = 0.0;
  q.reach_mm = p.reach_mm + shift_mm;
  q.argmin_mm = std::max(0.0, p.argmin_mm + shift_mm);
  q.min_mm = p.min_mm;
  if (shift_mm > 0.0) {
    ProfilePiece filler;
    filler.r0_mm = 0.0;
    filler.r1_mm = shift_mm;
    filler.kind = PieceKind::Line;
    filler.a = p.height_mm(0.0) + kFillerSlope * shift_mm;
    filler.b = -kFillerSlope;
    q.pieces.push_back(filler);
  }
  for (const ProfilePiece& piece : p.pieces) {
    ProfilePiece s = piece;
    s.r0_mm = std::max(0.0, piece.r0_mm + shift_mm);
    s.r1_mm = piece.r1_mm + shift_mm;
    if (!(s.r1_mm > s.r0_mm)) continue;  // wholly inside the axis after a negative shift
    if (s.kind == PieceKind::Line) {
      s.a = piece.a - piece.b * shift_mm;  // a + b (rho - shift)
    } else {
      s.a = piece.a + shift_mm;  // the circle's centre radius moves out with the edge
    }
    q.pieces.push_back(s);
  }
  q.pieces.front().r0_mm = 0.0;
  q.max_mm = std::max(q.height_mm(0.0), q.height_mm(q.reach_mm));
  return q;
}

}  // namespace

std::vector<ToothFamily> tooth_families(const RevolvedProfile& tooth, int teeth, double runout_mm,
                                        double runout_phase_rad,
                                        const std::vector<double>& axial_mm) {
  const int z = std::max(1, teeth);
  const bool alike = runout_mm == 0.0 &&
                     std::all_of(axial_mm.begin(), axial_mm.end(),
                                 [&](double a) { return a == axial_mm.front(); });
  std::vector<ToothFamily> out;
  if (alike) {
    ToothFamily f;
    f.period_rad = kTwoPi / z;
    f.axial_mm = axial_mm.empty() ? 0.0 : axial_mm.front();
    f.reach = tooth;
    out.push_back(f);
    return out;
  }
  for (int k = 0; k < z; ++k) {
    ToothFamily f;
    f.spacing_rad = kTwoPi * k / z;
    f.period_rad = kTwoPi;
    // The runout offset, seen from tooth k's edge, lies beta ahead of it.
    const double beta = runout_phase_rad - f.spacing_rad;
    f.e_sin_mm = runout_mm * std::sin(beta);
    f.e_cos_mm = runout_mm * std::cos(beta);
    f.axial_mm = k < static_cast<int>(axial_mm.size()) ? axial_mm[k] : 0.0;
    f.reach = shifted_profile(tooth, f.e_cos_mm);
    out.push_back(f);
  }
  return out;
}

double family_offset_mm(const ToothFamily& f, double w_mm) {
  const double w2 = w_mm * w_mm - f.e_sin_mm * f.e_sin_mm;
  return w2 > 0.0 ? std::sqrt(w2) : 0.0;
}

}  // namespace cuspmap

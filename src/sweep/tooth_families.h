// Teeth grouped for the tooth-resolved crossing search: per family (all teeth when they differ
// only in phase, else one tooth each) the bearing period, the runout seen from the tooth's edge,
// its axial offset, and its own profile against the runout-corrected distance, whose minima
// along a move are where that tooth's lowest crossings lie. Lengths mm, angles rad.
// Method: DESIGN.md "Tooth-resolved" (radial edge from the runout-offset centre, Kline & DeVor
// 1983): a cell at distance d from the spindle axis meets the edge at radius
// r = sqrt(d^2 - e_sin^2) - e_cos, so the tooth's height is p(rho - e_cos) with
// rho = sqrt(d^2 - e_sin^2).
#pragma once

#include <vector>

#include "tool/revolved_profile.h"

namespace cuspmap {

/// One family of teeth for the crossing search.
struct ToothFamily {
  double spacing_rad = 0.0;  ///< tooth angle ahead of tooth 0 (0 for a family of alike teeth)
  double period_rad = 0.0;   ///< bearing lattice step: 2 pi / Z for alike teeth, else 2 pi
  double e_sin_mm = 0.0;     ///< runout across the edge: the cell's bearing leads by asin(e_sin/d)
  double e_cos_mm = 0.0;     ///< runout along the edge, outwards (mm)
  double axial_mm = 0.0;     ///< axial offset of the tooth (+ = higher)
  /// q(rho) = p(rho - e_cos) for rho = sqrt(d^2 - e_sin^2) in [0, R + e_cos] (reach_mm): the
  /// tooth's heights as a profile of revolution. Where rho < e_cos (behind the edge's start) a
  /// line falling to rho = e_cos keeps q unimodal; no crossing there counts.
  RevolvedProfile reach;
};

/// Families of the cutter's teeth.
/// @param[in] tooth             one tooth's edge profile p(r), r <= R (no runout)
/// @param[in] teeth             Z >= 1
/// @param[in] runout_mm         e >= 0
/// @param[in] runout_phase_rad  angle of the runout offset ahead of tooth 0
/// @param[in] axial_mm          Z axial offsets (mm)
/// @return one family when the teeth are alike (no runout, equal offsets), else Z families
std::vector<ToothFamily> tooth_families(const RevolvedProfile& tooth, int teeth, double runout_mm,
                                        double runout_phase_rad,
                                        const std::vector<double>& axial_mm);

/// rho = sqrt(d^2 - e_sin^2) for a lateral offset (line moves: the chord offset w to use with
/// ToothFamily::reach); 0 when |w| <= |e_sin| (cells closer to the move than the runout).
double family_offset_mm(const ToothFamily& f, double w_mm);

}  // namespace cuspmap

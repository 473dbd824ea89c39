// Sweep setup: profiles, tilt vector, teeth, runout and spindle speed from Cutter and CutSpec.
// Inputs: Cutter (mm, deg, um offsets), CutSpec (rpm, direction), Patch; output: SweepSetup (mm).
// Method: DESIGN.md "Geometry" and "Tooth-resolved"; M3 (cw seen from above) is negative omega.
#include "sweep/sweep_setup.h"

#include <algorithm>
#include <cmath>
#include <numbers>

namespace cuspmap {

SweepSetup sweep_setup(const Cutter& cutter, const CutSpec& cut, const Patch& patch) {
  constexpr double kDegToRad = std::numbers::pi / 180.0;
  SweepSetup s;
  s.envelope = revolved_profile(cutter, cutter.runout_mm);
  s.tooth = revolved_profile(cutter, 0.0);
  const double toward = cutter.tilt_toward_deg * kDegToRad;
  s.tilt =
      std::tan(cutter.tilt_deg * kDegToRad) * Eigen::Vector2d(std::cos(toward), std::sin(toward));
  s.tilt_drop_mm = s.tilt.norm() * s.envelope.reach_mm;
  s.teeth = std::max(1, cutter.teeth);
  s.runout_mm = cutter.runout_mm;
  s.runout_phase_rad = cutter.runout_phase_deg * kDegToRad;
  s.axial_mm.assign(s.teeth, 0.0);
  for (int k = 0; k < s.teeth && k < static_cast<int>(cutter.axial_offsets_um.size()); ++k) {
    s.axial_mm[k] = cutter.axial_offsets_um[k] / 1000.0;
  }
  s.axial_min_mm = *std::min_element(s.axial_mm.begin(), s.axial_mm.end());
  const double axial_max = *std::max_element(s.axial_mm.begin(), s.axial_mm.end());
  s.teeth_alike = s.runout_mm == 0.0 && axial_max == s.axial_min_mm;
  s.families = tooth_families(s.tooth, s.teeth, s.runout_mm, s.runout_phase_rad, s.axial_mm);
  const double sign = cut.spindle == SpindleDirection::Cw ? -1.0 : 1.0;
  s.omega_rad_per_s = sign * 2.0 * std::numbers::pi * cut.rpm / 60.0;
  std::int64_t nx = 0, ny = 0;
  grid_dimensions(patch, nx, ny);
  s.nx = static_cast<int>(nx);
  s.ny = static_cast<int>(ny);
  s.cell_mm = patch.cell_mm;
  s.top_mm = s.envelope.max_mm + axial_max + s.tilt_drop_mm;
  // Undished profiles rise from the axis (argmin 0); runout turns that into a ring (q lowest at
  // r = e) and tilt adds a term in the direction, so either needs the general envelope.
  s.level_distance = s.runout_mm == 0.0 && s.tilt_drop_mm == 0.0 && s.envelope.non_decreasing();
  s.flat_mm = cutter.flat_radius_mm();
  s.corner_mm = cutter.effective_corner_mm();
  return s;
}

}  // namespace cuspmap

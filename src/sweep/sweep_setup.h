// Read-only data every tile of one sweep shares: the revolved and single-tooth profiles, tilt,
// teeth, runout, spindle speed and the grid. Lengths mm, angles rad, time s.
// Method: DESIGN.md "Geometry" (tilt first order, p_tilt = p - tan(tau) v.n) and "Tooth-resolved"
// (tooth k at theta_0 + 2 pi k / Z + omega t; Kline & DeVor 1983 runout offset of the centre).
#pragma once

#include <Eigen/Core>
#include <vector>

#include "core/heightfield.h"
#include "path/path_spec.h"
#include "sweep/tooth_families.h"
#include "tool/cutter.h"
#include "tool/revolved_profile.h"

namespace cuspmap {

/// What the sweep kernels need to know about the cutter, the spindle and the grid.
struct SweepSetup {
  RevolvedProfile envelope;       ///< the turning body with runout: envelope heights, bounds
  RevolvedProfile tooth;          ///< one tooth edge's heights p(r) (no runout), r <= R
  Eigen::Vector2d tilt{0, 0};     ///< tan(tau) n: the lower surface drops by tilt . v (mm/mm)
  double tilt_drop_mm = 0.0;      ///< |tilt| (R + e): the most tilt lowers any cutter point
  int teeth = 1;                  ///< Z
  double runout_mm = 0.0;         ///< e
  double runout_phase_rad = 0.0;  ///< angle of the runout offset ahead of tooth 0
  std::vector<double> axial_mm;   ///< per tooth axial offset (+ = higher), Z entries
  double axial_min_mm = 0.0;      ///< lowest axial offset: the revolving envelope's tooth
  double omega_rad_per_s = 0.0;   ///< spindle angular speed, signed (+ = ccw seen from above)
  bool teeth_alike = true;        ///< no runout and equal offsets: teeth differ only in phase
  std::vector<ToothFamily> families;  ///< teeth grouped for the crossing search (1 when alike)
  int nx = 0;                     ///< grid columns
  int ny = 0;                     ///< grid rows
  double cell_mm = 0.0;           ///< cell size
  double top_mm = 0.0;            ///< highest any cutter point reaches above its tip
  /// The envelope height is z + p(distance to the nearest move) for level moves: untilted, no
  /// runout, p non-decreasing in r (ball, undished bull-nose or flat). See distance_tile.h.
  bool level_distance = false;
  double flat_mm = 0.0;           ///< R - rc: where the corner starts (0 for a ball)
  double corner_mm = 0.0;         ///< rc (R for a ball, 0 for a flat end)
};

/// A move whose lowest tip is this far above the highest any cutter point reaches still counts
/// as unable to reach the floor: 1 um covers rounding of program coordinates in mm.
inline constexpr double kReachMarginMm = 1e-3;

/// Builds the setup for a validated cutter, cutting conditions and patch.
SweepSetup sweep_setup(const Cutter& cutter, const CutSpec& cut, const Patch& patch);

}  // namespace cuspmap

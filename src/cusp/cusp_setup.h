// A closed-form cusp question (cutter, surface, slope) and the named result every cusp/ function
// returns: exact height and statistics, the approximation beside them, effective radius, limits.
// Heights along the surface normal; stepover in plan view on planes, along cylinders.
// Method: DESIGN.md "Closed forms" and "Command line" (stepover conventions).
#pragma once

#include <optional>

#include "cusp/cusp_profile_stats.h"
#include "tool/cutter.h"

namespace cuspmap {

/// The nominal surface across the feed direction.
enum class SurfaceKind {
  Plane,    ///< a flat floor, level or sloped across the pass (slope_deg)
  Convex,   ///< outside of a cylinder of radius surface_radius_mm, axis along the feed
  Concave,  ///< inside of such a cylinder (a fillet or trough), axis along the feed
};

/// A cusp question: which cutter on which surface. Validated where input enters (cli/, job/).
struct CuspSetup {
  Cutter cutter;                             ///< shape, diameter, corner radius (dish accepted)
  SurfaceKind surface = SurfaceKind::Plane;  ///< plane or cylinder
  double slope_deg = 0.0;                    ///< plane only: slope across the pass, |slope| < 90
  double surface_radius_mm = 0.0;            ///< cylinders only: rho > 0
};

/// Why an answer lies outside the ideal-geometry model (its numbers are then bounds or limits).
enum class CuspLimit {
  None,                    ///< inside the model
  PassesDoNotOverlap,      ///< stepover >= D (or tool circles that no longer meet): uncut strips
                           ///< stand between passes; the height shown is a lower bound
  ToolTooLargeForConcave,  ///< concave radius <= ball radius: the ball cannot follow it
};

/// A cusp, exact and approximate. Heights along the surface normal.
struct CuspResult {
  double stepover_mm = 0.0;        ///< stepover asked for or found (plan view on planes,
                                   ///< along the surface on cylinders)
  double chord_mm = 0.0;           ///< distance between neighbouring contacts along the nominal
                                   ///< surface: stepover / cos(slope) on planes
  double scallop_um = 0.0;         ///< exact cusp height, um
  ProfileStats stats;              ///< Ra, Rq, Rz of the exact ideal profile, um
  double scallop_approx_um = 0.0;  ///< small-stepover approximation of the cusp height, um
  ProfileStats stats_approx;       ///< Ra, Rq, Rz of the approximating parabolic profile, um
  /// Radius of the circle whose arcs form the cusp, adjusted for surface curvature
  /// (R, R rho/(rho +- R), rc; 0 for a sharp corner); empty when a flat face finishes the floor.
  std::optional<double> effective_radius_mm;
  CuspLimit limit = CuspLimit::None;  ///< where the answer leaves the model
  bool side_forms_cusp = false;    ///< the cutter's cylindrical side (not its end) bounds the cusp
  bool profile_overhangs = false;  ///< part of the cusp leans over the surface (steep slopes):
                                   ///< Ra/Rq are of the net profile along the surface
};

}  // namespace cuspmap

// Envelope of the revolving cutter along a circular arc (or helix) at one cell: the lowest point
// of the cutter over the cell while its axis runs along the arc. Heights mm above the floor.
// Level arcs of an untilted cutter: closed form from the distances to the arc. Helices and
// tilt: 1-D minimisation over the arc parameter. Cost O(1) resp. ~60 profile evaluations.
// Method: DESIGN.md "Geometry" ("arcs by distance to the arc"); golden-section search (Kiefer
// 1953; Press et al., Numerical Recipes 3rd ed., §10.2) from a bracketing sample.
#pragma once

#include <array>

#include "sweep/prepare_moves.h"
#include "sweep/sweep_setup.h"

namespace cuspmap {

/// Most local minima reported along one move.
inline constexpr int kMaxMoveMinima = 8;

/// Local minima of the height a move leaves at one cell, along the move parameter t in [0, 1].
struct MoveMinima {
  double value_mm = 0.0;                   ///< lowest height, mm (+infinity: never reached)
  int count = 0;                           ///< entries of t in use
  std::array<double, kMaxMoveMinima> t{};  ///< parameters of local minima, any order
};

/// Local minima along an arc of h(t) = z(t) + q(rho) - tilt . (P - c(t)),
/// rho = sqrt(|P - c(t)|^2 - e_sin^2).
/// @param[in] setup     tilt
/// @param[in] q         the profile to use (setup.envelope, or a ToothFamily's reach)
/// @param[in] move      an Arc move
/// @param[in] p_mm      the cell centre, patch-local
/// @param[in] e_sin_mm  a tooth's runout across its edge (ToothFamily); 0 for the envelope
MoveMinima arc_minima(const SweepSetup& setup, const RevolvedProfile& q, const PreparedMove& move,
                      const Eigen::Vector2d& p_mm, double e_sin_mm = 0.0);

/// Envelope height of an arc at a cell, mm above the floor (axial offset not included);
/// +infinity when out of reach. Closed form for level arcs without tilt, else arc_minima.
double envelope_arc_mm(const SweepSetup& setup, const PreparedMove& move,
                       const Eigen::Vector2d& p_mm);

}  // namespace cuspmap

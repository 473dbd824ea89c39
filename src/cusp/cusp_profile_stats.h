// Ra, Rq, Rz of the ideal periodic cusp profile: parabolic forms in closed form, the exact
// profile (arcs, flats, tilted walls) by graded Gauss-Legendre to ~1e-12. mm in, um out.
// Method: ISO 4287:1997 §4.2.1-4.2.2 over whole periods; parabola Ra = 4h/(9 sqrt 3),
// Rq = 2h/(3 sqrt 5) (DESIGN.md "Closed forms"); Gauss-Legendre nodes by Newton on P_n.
#pragma once

#include <functional>
#include <vector>

namespace cuspmap {

/// Texture parameters of an ideal periodic profile, measured from its mean line over whole
/// periods (a sampling length of many periods gives the same values).
struct ProfileStats {
  double ra_um = 0.0;  ///< arithmetic mean deviation from the mean line (ISO 4287 Ra), um
  double rq_um = 0.0;  ///< root-mean-square deviation from the mean line (ISO 4287 Rq), um
  double rz_um = 0.0;  ///< peak-to-valley height; Rz = Rt = the cusp height for a periodic profile
};

/// Statistics of a cusp profile made of parabolic arcs z = h (x / w)^2, |x| <= w, between flat
/// stretches at z = 0 that cover the fraction 1 - q of each period.
/// @param[in] scallop_um    h >= 0, um
/// @param[in] arc_fraction  q in (0, 1]: fraction of the period covered by the arcs (1 for a
///                          ball: Ra = 4h/(9 sqrt 3), Rq = 2h/(3 sqrt 5), Rz = h)
/// @return all zero when h = 0.
ProfileStats parabolic_cusp_stats(double scallop_um, double arc_fraction = 1.0);

/// Exact statistics of a profile of circular arcs of radius rho, each spanning half-chord w
/// either side of its lowest point, separated by flat stretches of width f at the arcs' bottom
/// level (period 2w + f). A ball's cusps have f = 0; a bull-nose beyond its flat width has
/// f = 2(R - rc); turning marks have f = 0 and w = feed / 2.
/// @param[in] radius_mm      rho > 0
/// @param[in] half_chord_mm  w in [0, rho]
/// @param[in] flat_width_mm  f >= 0
ProfileStats arc_cusp_stats(double radius_mm, double half_chord_mm, double flat_width_mm);

/// One stretch of a profile, in a parameter u that runs along the profile (mm). Either a graph
/// piece n(u) monotone on [u0, u1], or a wall (u0 == u1): a jump of the height from n0 to n1.
struct CuspArcPiece {
  double u0_mm = 0.0;                       ///< start of the stretch
  double u1_mm = 0.0;                       ///< end of the stretch; == u0_mm for a wall
  double n0_mm = 0.0;                       ///< height along the surface normal at the start
  double n1_mm = 0.0;                       ///< height at the end
  std::function<double(double)> height_mm;  ///< n(u) for u in [u0, u1]; empty for a wall
};

/// A graph piece n(u) over [u0, u1] with its end heights n(u0), n(u1) filled in.
CuspArcPiece graph_piece(double u0_mm, double u1_mm, std::function<double(double)> height_mm);

/// Ra, Rq, Rz over one period of a profile given as pieces in order, whose position along the
/// nominal surface is x = kx * u + kn * n (kx = 1, kn = 0 when u already is that position; a
/// plane of slope a measured through plan-view u has kx = 1/cos a, kn = tan a).
/// Integrals are line integrals in x, exact for walls; graph pieces use graded Gauss-Legendre,
/// split where the profile crosses its mean line.
/// @param[in] pieces  consecutive stretches; the profile returns to its start height
/// @param[in] kx, kn  map from (u, n) to the along-surface position x (kx > 0)
/// Cost: ~600 evaluations of n(u) per piece and statistic.
ProfileStats periodic_profile_stats(const std::vector<CuspArcPiece>& pieces, double kx, double kn);

}  // namespace cuspmap

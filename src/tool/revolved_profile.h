// Revolved lower-surface profile q(r): the envelope of a cutter body turning about a spindle axis
// that is offset from the body's own axis by the radial runout e, as line and circle pieces in r.
// Inputs: Cutter (mm, deg), runout e (mm); output: q in mm above the tip for 0 <= r <= R + e.
// Method: surface of revolution of DESIGN.md "Geometry"; the turning offset body reaches radius
// r at body radii [|r - e|, min(r + e, R)] (Kline & DeVor 1983 runout geometry), so q(r) is p
// minimised over that interval: p clamped at its argmin.
#pragma once

#include <vector>

#include "tool/cutter.h"

namespace cuspmap {

/// Shape of one piece of a profile.
enum class PieceKind {
  Line,    ///< q = a + b r (flat part, dish cone, the constant bottom of a runout envelope)
  Circle,  ///< q = c - sqrt(b^2 - (r - a)^2): a circle of radius b centred at radius a, height c
};

/// One piece of a profile over [r0_mm, r1_mm].
struct ProfilePiece {
  double r0_mm = 0.0;                ///< radius where the piece starts
  double r1_mm = 0.0;                ///< radius where it ends (>= r0_mm)
  PieceKind kind = PieceKind::Line;  ///< line or circle
  double a = 0.0;                    ///< Line: height at r = 0 (mm). Circle: centre radius (mm)
  double b = 0.0;                    ///< Line: slope dq/dr. Circle: circle radius (mm)
  double c = 0.0;                    ///< Circle: height of the centre (mm); unused for lines

  /// q at radius r (mm); r is clamped into the piece.
  double height_mm(double r_mm) const;
  /// dq/dr at r (mm/mm); +-infinity at a circle's vertical tangent.
  double slope(double r_mm) const;
};

/// A unimodal profile of revolution, piecewise line/circle, covering [0, reach_mm].
struct RevolvedProfile {
  double radius_mm = 0.0;  ///< the cutter's R
  double runout_mm = 0.0;  ///< radial offset e of the body from the spindle axis
  double reach_mm = 0.0;   ///< R + e: nothing beyond this radius is touched
  double argmin_mm = 0.0;  ///< a radius where q is lowest
  double min_mm = 0.0;     ///< q at argmin_mm
  double max_mm = 0.0;     ///< largest q over [0, reach]: how high above the tip the cutter reaches
  std::vector<ProfilePiece> pieces;  ///< in order of r, contiguous, first r0 = 0, last r1 = reach

  /// q(r) in mm; +infinity beyond reach_mm.
  double height_mm(double r_mm) const;
  /// Minimum of q over [lo, min(hi, reach)], mm; +infinity when lo > reach. Exact (unimodal q).
  double min_over_mm(double lo_mm, double hi_mm) const;
  /// Index of the piece containing r (the later one at a shared end).
  int piece_at(double r_mm) const;
  /// True when q does not decrease with r (argmin 0): the lowest point of a chord is its middle.
  bool non_decreasing() const { return argmin_mm == 0.0; }
  /// True when q is a single circle centred on the axis (a ball without runout).
  bool is_centred_circle() const;
};

/// The envelope of the cutter turning with runout e about the spindle axis:
/// q(r) = p(clamp(a, |r - e|, min(r + e, R))), a = profile_argmin_mm(cutter).
/// With e = 0 this is p itself (used for single teeth in the tooth-resolved sweep).
/// @param[in] cutter     validated cutter (its own runout_mm is not read)
/// @param[in] runout_mm  e >= 0, e < R
RevolvedProfile revolved_profile(const Cutter& cutter, double runout_mm);

}  // namespace cuspmap

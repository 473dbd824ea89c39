// Cutter: the lower surface of a revolving end mill as a height p(r) above its tip, plus the
// imperfections that mark a floor: dish (end-face concavity), small axis tilt, radial runout,
// per-tooth axial offsets. Lengths mm, angles deg, p in mm.
// Method: surface-of-revolution cutter model (DESIGN.md "Geometry"; Altintas, Manufacturing
// Automation, 2nd ed. 2012, ch. 2 surface generation; Kline & DeVor 1983 runout model).
#pragma once

#include <Eigen/Core>
#include <limits>
#include <vector>

namespace cuspmap {

/// Cutter shapes the model knows.
enum class CutterShape {
  Ball,      ///< hemispherical end, corner radius = R
  BullNose,  ///< flat centre of radius R - rc with a toroidal corner of radius rc
  Flat,      ///< flat end (rc = 0); the dish angle makes the rim the lowest point
};

/// Spindle rotation seen from above (looking down -Z at the part).
enum class SpindleDirection {
  Cw,   ///< M3: clockwise
  Ccw,  ///< M4: counter-clockwise
};

/// Largest axis tilt the first-order tilt model accepts, deg. p_tilt = p - tan(tau) v.n neglects
/// terms of order tau^2 R; at 1 deg and R = 10 mm that is ~1.5 um of 175 um, under 1%.
inline constexpr double kMaxTiltDeg = 1.0;

/// A cutter and its imperfections. Validated where input enters (job/, cli/).
struct Cutter {
  CutterShape shape = CutterShape::Ball;  ///< shape of the lower end
  double diameter_mm = 6.0;               ///< D > 0
  double corner_radius_mm = 0.0;          ///< bull-nose rc, 0 < rc <= R; ignored for ball/flat
  double dish_deg = 0.0;                  ///< end-face concavity of the flat part, >= 0 (0-3 typ.)
  int teeth = 2;                          ///< number of flutes, >= 1
  double tilt_deg = 0.0;                  ///< axis tilt (tram error), |tilt| <= kMaxTiltDeg
  double tilt_toward_deg = 0.0;           ///< XY direction of the end face's lowest point, from +X ccw
  double runout_mm = 0.0;                 ///< radial runout: offset of the cutting centre, >= 0
  double runout_phase_deg = 0.0;          ///< angle of that offset relative to tooth 0
  std::vector<double> axial_offsets_um;   ///< per-tooth axial offset (+ = tooth higher); empty = 0

  /// R = D / 2, mm.
  double radius_mm() const { return 0.5 * diameter_mm; }
  /// Corner radius the geometry uses: R for a ball, 0 for a flat, rc for a bull-nose (mm).
  double effective_corner_mm() const;
  /// Radius where the flat (possibly dished) part ends and the corner begins: R - rc (mm).
  double flat_radius_mm() const { return radius_mm() - effective_corner_mm(); }
};

/// Height of the cutter's lower surface above its tip at distance r from the axis, mm.
/// @param[in] r_mm  >= 0; beyond R the cutter has no lower surface: returns +infinity.
double profile_height_mm(const Cutter& cutter, double r_mm);

/// Radius in [0, R] where p is lowest (the contact point on a flat floor): 0 for a ball or an
/// undished bull-nose/flat, R for a dished flat, R - rc for a dished bull-nose.
double profile_argmin_mm(const Cutter& cutter);

/// Minimum of p over the radii [r_lo, min(r_hi, R)], mm; +infinity when r_lo > R.
/// p is unimodal (decreasing on the dished flat, increasing on the corner), so the minimum is at
/// the clamp of profile_argmin into the interval.
double profile_min_mm(const Cutter& cutter, double r_lo_mm, double r_hi_mm);

/// Height of the tilted cutter's lower surface at horizontal offset v from the axis, mm:
/// p(|v|) - tan(tilt) (v . n), n the unit vector towards tilt_toward_deg (first order, see
/// kMaxTiltDeg). Equals profile_height_mm when tilt is 0.
double profile_height_tilted_mm(const Cutter& cutter, const Eigen::Vector2d& v_mm);

}  // namespace cuspmap

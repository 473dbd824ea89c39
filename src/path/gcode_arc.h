// Centre of a G2/G3 arc in the XY plane from its centre-format (I J) or radius-format (R)
// words, with the checks RS-274 makes: end point on the circle within a tolerance, radius large
// enough to reach the end point. Inputs mm; output the centre (mm) and a status.
// Method: RS274NGC v3 (Kramer, Proctor & Messina, NIST IR 6556, 2000) §3.5.3.1 radius format
// (positive R: 180 deg or less, negative R: 180 to 359.999 deg), §3.5.3.2 centre format (start
// and end radii may differ by 0.0002 in / 0.002 mm).
#pragma once

#include <Eigen/Core>

namespace cuspmap {

/// RS274NGC v3 §3.5.3.2: the start and end radii of a centre-format arc may differ by at most
/// 0.002 mm when millimetres are in use ...
inline constexpr double kArcEndToleranceMm = 0.002;
/// ... and by 0.0002 in (= 0.00508 mm) when inches are in use.
inline constexpr double kArcEndToleranceInch = 0.0002;

/// Outcome of an arc-centre computation.
enum class ArcCentreStatus {
  Ok,              ///< centre found
  ZeroRadius,      ///< the centre coincides with the start point
  EndOffCircle,    ///< centre format: end radius differs from start radius beyond tolerance
  RadiusTooSmall,  ///< radius format: |R| shorter than half the chord beyond tolerance
  EndAtStart,      ///< radius format: end equals start (a full circle needs I/J)
};

/// Centre and the figures the checks used (for messages).
struct ArcCentre {
  ArcCentreStatus status = ArcCentreStatus::Ok;  ///< outcome
  Eigen::Vector2d centre_mm{0, 0};               ///< centre in XY (valid when Ok)
  double start_radius_mm = 0.0;                  ///< |start - centre|
  double end_radius_mm = 0.0;                    ///< |end - centre|
  double half_chord_mm = 0.0;                    ///< |end - start| / 2 (radius format)
};

/// Centre format: checks a given centre against the start and end points.
/// @param[in] start_mm, end_mm  arc ends in XY; @param[in] centre_mm  absolute centre
/// @param[in] tolerance_mm  allowed |end radius - start radius| (kArcEndTolerance*)
/// @return Ok, ZeroRadius (start radius <= tolerance) or EndOffCircle. Equal start and end with
///         Ok is a full circle.
ArcCentre arc_centre_from_offsets(const Eigen::Vector2d& start_mm, const Eigen::Vector2d& end_mm,
                                  const Eigen::Vector2d& centre_mm, double tolerance_mm);

/// Radius format: the centre of the arc from start to end with signed radius R.
/// For a clockwise arc (G2) with R > 0 the centre lies right of the chord start -> end, so the
/// arc turns 180 deg or less; R < 0 puts it on the left (180 to 360 deg); G3 mirrors both.
/// A half chord longer than |R| by at most tolerance_mm is taken as a semicircle (posts round
/// coordinates, so an exact semicircle may miss by a few um).
/// @param[in] start_mm, end_mm  arc ends in XY; @param[in] radius_mm  signed R, != 0
/// @param[in] ccw  true for G3; @param[in] tolerance_mm  as above
/// @return Ok, EndAtStart (ends closer than tolerance_mm) or RadiusTooSmall.
ArcCentre arc_centre_from_radius(const Eigen::Vector2d& start_mm, const Eigen::Vector2d& end_mm,
                                 double radius_mm, bool ccw, double tolerance_mm);

}  // namespace cuspmap

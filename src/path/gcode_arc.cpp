// Centre of a G2/G3 arc from I/J offsets or an R word, with RS-274's checks (see gcode_arc.h).
// Inputs mm; outputs mm. Cost O(1).
// Method: RS274NGC v3 (Kramer, Proctor & Messina 2000) §3.5.3.1 and §3.5.3.2; the chord-normal
// construction of the centre is plane geometry (centre on the chord's perpendicular bisector).
#include "path/gcode_arc.h"

#include <algorithm>
#include <cmath>

namespace cuspmap {

ArcCentre arc_centre_from_offsets(const Eigen::Vector2d& start_mm, const Eigen::Vector2d& end_mm,
                                  const Eigen::Vector2d& centre_mm, double tolerance_mm) {
  ArcCentre out;
  out.centre_mm = centre_mm;
  out.start_radius_mm = (start_mm - centre_mm).norm();
  out.end_radius_mm = (end_mm - centre_mm).norm();
  out.half_chord_mm = 0.5 * (end_mm - start_mm).norm();
  if (out.start_radius_mm <= tolerance_mm) {
    out.status = ArcCentreStatus::ZeroRadius;
  } else if (std::abs(out.end_radius_mm - out.start_radius_mm) > tolerance_mm) {
    out.status = ArcCentreStatus::EndOffCircle;
  }
  return out;
}

ArcCentre arc_centre_from_radius(const Eigen::Vector2d& start_mm, const Eigen::Vector2d& end_mm,
                                 double radius_mm, bool ccw, double tolerance_mm) {
  ArcCentre out;
  const Eigen::Vector2d chord = end_mm - start_mm;
  const double length = chord.norm();
  out.half_chord_mm = 0.5 * length;
  const double r = std::abs(radius_mm);
  out.start_radius_mm = out.end_radius_mm = r;
  if (length <= tolerance_mm) {
    out.status = ArcCentreStatus::EndAtStart;
    return out;
  }
  if (out.half_chord_mm > r + tolerance_mm) {
    out.status = ArcCentreStatus::RadiusTooSmall;
    return out;
  }
  const double h = std::min(out.half_chord_mm, r);
  const double offset = std::sqrt(std::max(0.0, r * r - h * h));
  const Eigen::Vector2d left(-chord.y() / length, chord.x() / length);
  // Short arc (R > 0): a ccw arc bulges to the right of the chord, so its centre is on the left.
  const double side = ((radius_mm > 0.0) == ccw) ? 1.0 : -1.0;
  out.centre_mm = 0.5 * (start_mm + end_mm) + side * offset * left;
  out.start_radius_mm = (start_mm - out.centre_mm).norm();
  out.end_radius_mm = (end_mm - out.centre_mm).norm();
  return out;
}

}  // namespace cuspmap

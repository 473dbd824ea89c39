// Lower-surface profile p(r) of ball, bull-nose and dished flat cutters, and its first-order tilt.
// Inputs: Cutter (mm, deg), radius or offset (mm); output: height above the tip (mm).
// Method: DESIGN.md "Geometry" (ball sphere, torus corner, cone of angle dish on the flat part).
#include "tool/cutter.h"

#include <algorithm>
#include <cassert>
#include <cmath>
#include <numbers>

namespace cuspmap {
namespace {

constexpr double kDegToRad = std::numbers::pi / 180.0;

}  // namespace

double Cutter::effective_corner_mm() const {
  switch (shape) {
    case CutterShape::Ball:
      return radius_mm();
    case CutterShape::Flat:
      return 0.0;
    case CutterShape::BullNose:
      return std::clamp(corner_radius_mm, 0.0, radius_mm());
  }
  return 0.0;
}

double profile_height_mm(const Cutter& cutter, double r_mm) {
  assert(r_mm >= 0.0 && "radius must be non-negative");
  const double big_r = cutter.radius_mm();
  if (r_mm > big_r) return std::numeric_limits<double>::infinity();
  const double rc = cutter.effective_corner_mm();
  const double r_flat = big_r - rc;
  if (r_mm <= r_flat) {
    // Dished flat part: a shallow cone rising towards the centre; the rim is lowest.
    return (r_flat - r_mm) * std::tan(cutter.dish_deg * kDegToRad);
  }
  const double u = r_mm - r_flat;
  return rc - std::sqrt(std::max(0.0, rc * rc - u * u));
}

double profile_argmin_mm(const Cutter& cutter) {
  if (cutter.dish_deg > 0.0) return cutter.flat_radius_mm();
  return 0.0;
}

double profile_min_mm(const Cutter& cutter, double r_lo_mm, double r_hi_mm) {
  const double big_r = cutter.radius_mm();
  if (r_lo_mm > big_r) return std::numeric_limits<double>::infinity();
  const double hi = std::min(r_hi_mm, big_r);
  // Undished profiles are non-decreasing in r; the dished ones fall to the argmin then rise.
  const double r = std::clamp(profile_argmin_mm(cutter), std::max(0.0, r_lo_mm), hi);
  return profile_height_mm(cutter, r);
}

double profile_height_tilted_mm(const Cutter& cutter, const Eigen::Vector2d& v_mm) {
  const double base = profile_height_mm(cutter, v_mm.norm());
  if (cutter.tilt_deg == 0.0) return base;
  const double toward = cutter.tilt_toward_deg * kDegToRad;
  const Eigen::Vector2d n(std::cos(toward), std::sin(toward));
  return base - std::tan(cutter.tilt_deg * kDegToRad) * v_mm.dot(n);
}

}  // namespace cuspmap

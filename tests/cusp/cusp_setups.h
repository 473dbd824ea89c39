// Test helpers: a Cutter or CuspSetup from shape, diameter, corner radius and surface in one call.
#pragma once

#include "cusp/cusp_setup.h"

namespace cuspmap::test {

/// Cutter of `shape`, diameter d and corner radius rc (mm); other fields default.
inline Cutter make_cutter(CutterShape shape, double d_mm, double rc_mm) {
  Cutter c;
  c.shape = shape;
  c.diameter_mm = d_mm;
  c.corner_radius_mm = rc_mm;
  return c;
}

/// Setup of that cutter on a surface: slope (deg) for planes, radius rho (mm) for cylinders.
inline CuspSetup make_setup(CutterShape shape, double d_mm, double rc_mm,
                            SurfaceKind surface = SurfaceKind::Plane, double slope_deg = 0.0,
                            double rho_mm = 0.0) {
  CuspSetup s;
  s.cutter = make_cutter(shape, d_mm, rc_mm);
  s.surface = surface;
  s.slope_deg = slope_deg;
  s.surface_radius_mm = rho_mm;
  return s;
}

}  // namespace cuspmap::test

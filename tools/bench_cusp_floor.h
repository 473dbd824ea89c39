// A cusp floor for the benchmarks: parabolic cusps of a raster at `stepover_mm` (depth `cusp_um`)
// across Y with feed marks 0.08 mm apart along X (0.3 um), on n x n cells of 10 um.
// Method: analytic surface (derived: the parabola u^2 stands in for the ball's circular arc).
#pragma once

#include <cmath>

#include "core/heightfield.h"

inline cuspmap::Heightfield bench_cusp_floor(int n, double stepover_mm, double cusp_um) {
  cuspmap::Heightfield hf;
  hf.nx = n;
  hf.ny = n;
  hf.cell_mm = 0.01;
  hf.z_um.resize(n, n);
  for (int j = 0; j < n; ++j) {
    const double y = hf.y_mm(j), d = y - stepover_mm * std::round(y / stepover_mm);
    const double u = 2 * d / stepover_mm;
    for (int i = 0; i < n; ++i) {
      hf.z_um(j, i) = static_cast<float>(cusp_um * u * u +
                                         0.3 * std::sin(2 * 3.14159265 * hf.x_mm(i) / 0.08));
    }
  }
  return hf;
}

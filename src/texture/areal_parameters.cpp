// Areal height parameters through ArealMoments, and Sdr from cell-square slopes.
// Inputs: residual heightfield um; output: ArealParameters. Cost O(cells).
// Method: ISO 25178-2:2012 §4.1 and §4.3.2.
#include "texture/areal_parameters.h"

#include <cassert>
#include <cmath>

#include "core/units.h"
#include "texture/areal_moments.h"

namespace cuspmap {

double developed_area_ratio(const Heightfield& hf, std::int64_t& squares) {
  squares = 0;
  double sum = 0.0;
  // Slopes are height (um -> mm) over run (mm); the 1/(2 cell) averages the two edges.
  const double k = 1.0 / (kUmPerMm * 2.0 * hf.cell_mm);
  for (int j = 0; j + 1 < hf.ny; ++j) {
    for (int i = 0; i + 1 < hf.nx; ++i) {
      const double z00 = hf.z_um(j, i), z10 = hf.z_um(j, i + 1);
      const double z01 = hf.z_um(j + 1, i), z11 = hf.z_um(j + 1, i + 1);
      const double gx = ((z10 - z00) + (z11 - z01)) * k;
      const double gy = ((z01 - z00) + (z11 - z10)) * k;
      const double g2 = gx * gx + gy * gy;
      if (std::isnan(g2)) continue;
      // sqrt(1 + g2) - 1 written to keep its digits for small slopes.
      sum += g2 / (std::sqrt(1.0 + g2) + 1.0);
      ++squares;
    }
  }
  return squares > 0 ? sum / static_cast<double>(squares) : 0.0;
}

ArealParameters areal_parameters(const Heightfield& residual) {
  ArealMoments m;
  const float* z = residual.z_um.data();
  for (std::int64_t k = 0; k < residual.cells(); ++k) m.add(z[k]);
  assert(m.count > 0 && "areal parameters need a finite cell");
  const AmplitudeParameters a = amplitude_parameters(m);
  ArealParameters p;
  p.sa_um = a.mean_abs_um;
  p.sq_um = a.rms_um;
  p.sp_um = a.peak_um;
  p.sv_um = a.valley_um;
  p.sz_um = a.total_um;
  p.ssk = a.skewness;
  p.sku = a.kurtosis;
  p.shape_defined = a.shape_defined;
  p.cells = m.count;
  p.sdr = developed_area_ratio(residual, p.squares);
  return p;
}

}  // namespace cuspmap

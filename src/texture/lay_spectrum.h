// Power-weighted doubled-angle sums of a heightfield's Hann-windowed spectrum, the ingredients
// of the lay direction and strength (texture/texture_direction.h).
// Inputs: heightfield (um, NaN = unreached, read as 0); output: LaySums. Cost O(N log N) /
// threads, 8 bytes per cell (double precision); bit-identical for any thread count.
// Method: Hann window (Blackman & Tukey 1958); row-column real FFT (FFTW3 double precision,
// Frigo & Johnson 2005); doubled-angle mean of axial data (Mardia & Jupp 2000, sec. 9.3).
#pragma once

#include "core/heightfield.h"
#include "core/large_buffer.h"
#include "texture/fit_plane.h"

namespace cuspmap {

/// Sums over every spectrum bin but k = 0 of p = |Z(k)|^2 (each bin standing for k and -k once):
/// c = sum p cos 2 phi, s = sum p sin 2 phi, total = sum p, with phi the wave vector's angle.
struct LaySums {
  double c = 0.0;      ///< sum p cos(2 phi)
  double s = 0.0;      ///< sum p sin(2 phi)
  double total = 0.0;  ///< sum p
};

/// @param[in] hf       heights, nx, ny >= 2
/// @param[in] threads  workers, 0 = all hardware threads
/// @param[in] remove   optional plane taken off each height first, with remove_plane's
///                     arithmetic (the same float residual), so a caller need not hold the
///                     residual and this transform at once
/// @param[out] spent   optional: receives the transform's memory for the caller's next field
LaySums lay_spectrum(const Heightfield& hf, int threads, const Plane* remove = nullptr,
                     LargeBytes* spent = nullptr);

/// Makes and drops the plans lay_spectrum uses on an nx x ny field, so that its own planning
/// later finds them in FFTW's planner cache. Thread-safe (fftw_plan.h).
void warm_lay_spectrum_plans(int nx, int ny);

}  // namespace cuspmap

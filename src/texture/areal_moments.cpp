// Merging of height moments and the amplitude parameters derived from them.
// Inputs: sums of powers of heights in um; outputs: Sa..Sku / Ra..Rku.
// Method: ISO 25178-2:2012 §4.1 and ISO 4287:1997 §4.2 (discrete means over the sampled heights).
#include "texture/areal_moments.h"

#include <algorithm>
#include <cassert>
#include <cmath>

namespace cuspmap {

void ArealMoments::merge(const ArealMoments& other) {
  count += other.count;
  sum_abs_um += other.sum_abs_um;
  sum_um += other.sum_um;
  sum_um2 += other.sum_um2;
  sum_um3 += other.sum_um3;
  sum_um4 += other.sum_um4;
  max_um = std::max(max_um, other.max_um);
  min_um = std::min(min_um, other.min_um);
}

AmplitudeParameters amplitude_parameters(const ArealMoments& m) {
  assert(m.count > 0 && "amplitude parameters need at least one finite height");
  const double n = static_cast<double>(m.count);
  AmplitudeParameters p;
  p.mean_abs_um = m.sum_abs_um / n;
  const double mean_sq = m.sum_um2 / n;
  p.rms_um = std::sqrt(mean_sq);
  p.peak_um = m.max_um;
  p.valley_um = -m.min_um;
  p.total_um = m.max_um - m.min_um;
  // A profile is flat when its rms is zero to double precision: the shape parameters divide by it.
  p.shape_defined = mean_sq > 0.0 && std::isfinite(mean_sq);
  if (p.shape_defined) {
    p.skewness = (m.sum_um3 / n) / (mean_sq * p.rms_um);
    p.kurtosis = (m.sum_um4 / n) / (mean_sq * mean_sq);
  }
  return p;
}

}  // namespace cuspmap

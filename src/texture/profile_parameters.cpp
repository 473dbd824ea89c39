// ISO 4287 amplitude and spacing parameters of an evaluated profile.
// Inputs: heights um about the mean line; output: Ra..RSm. Cost O(n).
// Method: ISO 4287:1997 §4.1-4.3 with ISO 4288:1996 §5 averaging over sampling lengths.
#include "texture/profile_parameters.h"

#include <algorithm>
#include <cassert>

#include "texture/areal_moments.h"
#include "texture/mean_element_width.h"

namespace cuspmap {

ProfileParameters profile_parameters(std::span<const double> z_um, double spacing_mm,
                                     int sampling_lengths, double sampling_length_mm) {
  assert(sampling_lengths >= 1 && z_um.size() >= static_cast<size_t>(sampling_lengths) &&
         "each sampling length needs at least one sample");
  ArealMoments all;
  for (double z : z_um) all.add(z);
  const AmplitudeParameters amp = amplitude_parameters(all);
  ProfileParameters p;
  p.a_um = amp.mean_abs_um;
  p.q_um = amp.rms_um;
  p.t_um = amp.total_um;
  p.sk = amp.skewness;
  p.ku = amp.kurtosis;
  p.shape_defined = amp.shape_defined;
  // Peak, valley and height per sampling length, then the mean over sampling lengths.
  const size_t n = z_um.size();
  for (int k = 0; k < sampling_lengths; ++k) {
    const size_t lo = n * static_cast<size_t>(k) / static_cast<size_t>(sampling_lengths);
    const size_t hi = n * static_cast<size_t>(k + 1) / static_cast<size_t>(sampling_lengths);
    const auto [mn, mx] = std::minmax_element(z_um.begin() + static_cast<std::ptrdiff_t>(lo),
                                              z_um.begin() + static_cast<std::ptrdiff_t>(hi));
    p.p_um += *mx;
    p.v_um += -*mn;
  }
  p.p_um /= sampling_lengths;
  p.v_um /= sampling_lengths;
  p.z_um = p.p_um + p.v_um;
  const auto sm = mean_element_width(z_um, spacing_mm, kHeightDiscriminationOfRz * p.z_um,
                                     kWidthDiscriminationOfSamplingLength * sampling_length_mm);
  p.sm_defined = sm.has_value();
  p.sm_mm = sm.value_or(0.0);
  return p;
}

}  // namespace cuspmap

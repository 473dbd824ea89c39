// ISO 4287 parameters of one evaluated profile (roughness R, primary P or waviness W) whose
// heights are already taken about the mean line. Inputs: heights um, spacing mm, number of
// sampling lengths; output: ProfileParameters. Cost O(n).
// Method: ISO 4287:1997 §4.1 (Rp, Rv, Rz per sampling length, Rt), §4.2 (Ra, Rq, Rsk, Rku),
// §4.3 (RSm); ISO 4288:1996 §5 (a parameter defined on a sampling length is the mean over the
// sampling lengths of the evaluation length).
#pragma once

#include <span>

namespace cuspmap {

/// Parameters of one profile. Letters: R for roughness, P for primary, W for waviness.
struct ProfileParameters {
  double a_um = 0.0;           ///< Ra: mean |z| over the evaluation length
  double q_um = 0.0;           ///< Rq: rms of z over the evaluation length
  double p_um = 0.0;           ///< Rp: highest peak per sampling length, mean over sampling lengths
  double v_um = 0.0;           ///< Rv: deepest valley per sampling length (positive), mean
  double z_um = 0.0;           ///< Rz: Rp + Rv per sampling length, mean over sampling lengths
  double t_um = 0.0;           ///< Rt: highest peak minus deepest valley over the evaluation length
  double sk = 0.0;             ///< Rsk: skewness (0 when the profile is flat, see shape_defined)
  double ku = 0.0;             ///< Rku: kurtosis (0 when flat)
  double sm_mm = 0.0;          ///< RSm: mean element width (0 when no element, see sm_defined)
  bool shape_defined = false;  ///< Rq > 0, so Rsk and Rku exist
  bool sm_defined = false;     ///< at least one complete profile element was found
};

/// Computes the parameters of an evaluated profile.
/// @param[in] z_um                heights about the mean line (z = 0), equally spaced, finite;
///                                at least one sample per sampling length
/// @param[in] spacing_mm          sample spacing, > 0
/// @param[in] sampling_lengths    number of equal sampling lengths the profile is cut into (>= 1)
/// @param[in] sampling_length_mm  the sampling length, for RSm's width discrimination (1 %)
/// @return parameters; RSm uses the height discrimination 10 % of the Rz found here
ProfileParameters profile_parameters(std::span<const double> z_um, double spacing_mm,
                                     int sampling_lengths, double sampling_length_mm);

}  // namespace cuspmap

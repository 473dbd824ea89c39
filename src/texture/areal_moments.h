// Height moments about a reference (the mean line or mean plane, z = 0) accumulated one value
// at a time, mergeable across tiles, and the amplitude parameters they give (Sa..Sku, Ra..Rku).
// Inputs: heights in um relative to the reference; NaN values are skipped. Cost O(1) per value.
// Method: ISO 25178-2:2012 §4.1 (Sq, Ssk, Sku, Sp, Sv, Sz, Sa) and ISO 4287:1997 §4.2 (Ra..Rku).
#pragma once

#include <cmath>
#include <cstdint>
#include <limits>

namespace cuspmap {

/// Running sums of |z|, z, z^2, z^3, z^4 with min and max, in um. Sums of merged parts equal the
/// sums of the whole, so tiles can be accumulated separately and combined with merge().
struct ArealMoments {
  std::int64_t count = 0;   ///< finite values added
  double sum_abs_um = 0.0;  ///< sum |z|
  double sum_um = 0.0;      ///< sum z (near 0 about a least-squares reference)
  double sum_um2 = 0.0;     ///< sum z^2
  double sum_um3 = 0.0;     ///< sum z^3
  double sum_um4 = 0.0;     ///< sum z^4
  double max_um = -std::numeric_limits<double>::infinity();  ///< highest z seen
  double min_um = std::numeric_limits<double>::infinity();   ///< lowest z seen

  /// Adds one height (um about the reference); NaN is ignored (an unreached cell).
  void add(double z_um) {
    if (std::isnan(z_um)) return;
    const double z2 = z_um * z_um;
    ++count;
    sum_abs_um += z_um < 0.0 ? -z_um : z_um;
    sum_um += z_um;
    sum_um2 += z2;
    sum_um3 += z2 * z_um;
    sum_um4 += z2 * z2;
    if (z_um > max_um) max_um = z_um;
    if (z_um < min_um) min_um = z_um;
  }
  /// Adds the sums of another accumulator (e.g. another tile) to this one.
  void merge(const ArealMoments& other);
};

/// Amplitude parameters about the reference z = 0 (ISO 25178-2 S-names, ISO 4287 R/P/W-names).
struct AmplitudeParameters {
  double mean_abs_um = 0.0;    ///< Sa / Ra: arithmetic mean of |z|
  double rms_um = 0.0;         ///< Sq / Rq: root mean square of z
  double peak_um = 0.0;        ///< Sp / Rp: highest z (>= 0 about a mean reference)
  double valley_um = 0.0;      ///< Sv / Rv: depth of the lowest z, as a positive number
  double total_um = 0.0;       ///< Sz / Rt: peak + valley
  double skewness = 0.0;       ///< Ssk / Rsk: mean z^3 / rms^3 (0 when rms = 0, see shape_defined)
  double kurtosis = 0.0;       ///< Sku / Rku: mean z^4 / rms^4 (0 when rms = 0, see shape_defined)
  bool shape_defined = false;  ///< false when rms = 0 (flat): skewness and kurtosis are undefined
};

/// Amplitude parameters of the accumulated heights.
/// @param[in] m  moments of at least one finite height (asserted)
/// @return parameters; skewness/kurtosis are 0 with shape_defined = false for a flat set.
AmplitudeParameters amplitude_parameters(const ArealMoments& m);

}  // namespace cuspmap

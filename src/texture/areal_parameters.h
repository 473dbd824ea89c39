// ISO 25178-2 height parameters (Sa, Sq, Sp, Sv, Sz, Ssk, Sku) and the developed interfacial
// area ratio Sdr of a scale-limited surface (plane already removed, filters already applied).
// Inputs: Heightfield of residual heights um over mm cells, NaN cells skipped. Cost O(cells).
// Method: ISO 25178-2:2012 §4.1.1-4.1.7 (height parameters), §4.3.2 (Sdr, gradients by central
// differences at the centre of each square of four cells).
#pragma once

#include <cstdint>

#include "core/heightfield.h"
#include "texture/fit_plane.h"

namespace cuspmap {

/// Areal height and hybrid parameters.
struct ArealParameters {
  double sa_um = 0.0;          ///< Sa: arithmetic mean height |z|
  double sq_um = 0.0;          ///< Sq: root mean square height
  double sp_um = 0.0;          ///< Sp: maximum peak height
  double sv_um = 0.0;          ///< Sv: maximum pit depth (positive)
  double sz_um = 0.0;          ///< Sz: Sp + Sv
  double ssk = 0.0;            ///< Ssk: skewness (0 when flat, see shape_defined)
  double sku = 0.0;            ///< Sku: kurtosis (0 when flat)
  double sdr = 0.0;            ///< Sdr: developed area / projected area - 1, a ratio (x100 for %)
  bool shape_defined = false;  ///< Sq > 0
  std::int64_t cells = 0;      ///< finite cells used
  std::int64_t squares = 0;    ///< squares of four finite cells used for Sdr
};

/// Parameters of residual heights (z = 0 is the reference plane).
/// @param[in] residual  heightfield after plane removal (and S/L filters); >= 1 finite cell
/// @return parameters; Sdr is 0 when no square of four finite cells exists
ArealParameters areal_parameters(const Heightfield& residual);

/// The same for `floor` less `plane` (residual_row's arithmetic, the same values as
/// areal_parameters(remove_plane(floor, plane))), without holding that residual: each row block
/// makes its rows as it goes.
ArealParameters areal_parameters(const Heightfield& floor, const Plane& plane);

/// Sdr alone: mean over squares of four finite cells of sqrt(1 + gx^2 + gy^2) - 1, with gx, gy
/// the slopes at the square's centre (heights converted to mm).
/// @param[in] hf heightfield; @param[out] squares number of squares used
double developed_area_ratio(const Heightfield& hf, std::int64_t& squares);

}  // namespace cuspmap

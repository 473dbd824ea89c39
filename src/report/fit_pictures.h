// fit.png: the fit window side by side on one height scale: measured (setup plane removed),
// best-fit simulated, residual (measured - simulated, drawn with the same um per gray level,
// centred on 0). Inputs: FloorFit (window fields, um over mm); output: Image.
// Cost O(window cells). Method: linear gray mapping (report/height_image) and montage.
#pragma once

#include "core/units.h"
#include "infer/floor_fit.h"
#include "io/raster_image.h"

namespace cuspmap {

/// Renders the three window pictures with labels and one scale bar.
/// @param[in] fit    the fit (measured, simulated, residual on the window grid)
/// @param[in] units  labels in um (Millimetre) or uin (Inch)
Image render_fit_pictures(const FloorFit& fit, LengthUnit units);

}  // namespace cuspmap

// ISO 16610-61 areal Gaussian filter: the mean surface of a heightfield for a nesting index,
// NaN-aware (each output is the weighted mean of the finite cells in reach).
// Inputs: Heightfield um over mm cells, nesting index mm; output: mean surface, same grid.
// Cost O(cells * nesting index / cell) (separable).
// Method: ISO 16610-61:2015 weighting function s(x, y) = s(x) s(y) with the ISO 16610-21 profile
// weight; normalised convolution (Knutsson & Westin 1993) for the missing cells.
#pragma once

#include "core/heightfield.h"

namespace cuspmap {

/// Gaussian mean surface (the L-filter output; for the S-filter it is the smoothed surface).
/// Cells that are NaN stay NaN; a finite cell whose reach holds no finite weight keeps its value.
/// @param[in] hf                heightfield
/// @param[in] nesting_index_mm  cut-off of the filter, mm, > 0
/// @return the filtered heightfield
Heightfield gaussian_areal_filter(const Heightfield& hf, double nesting_index_mm);

}  // namespace cuspmap

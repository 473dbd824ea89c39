// Splits the wall band off a walled pocket's floor: cells whose centre lies outside the region
// the tool centre may visit (within R of the wall, where the cutter's side leaves its fillet)
// are set to NaN, so they are left out of every floor statistic, and summarised separately.
// Inputs: heightfield (um, mm cells; a whole floor or one band of rows), region polygons (mm);
// cost O(rows x polygon edges + cells). Method: even-odd scanline fill at the cell centres.
#pragma once

#include <Eigen/Core>
#include <cstdint>
#include <vector>

#include "core/heightfield.h"

namespace cuspmap {

/// What the wall band held.
struct WallBand {
  std::int64_t cells = 0;            ///< reached cells in the band (taken out of the floor)
  double highest_point_um = 0.0;     ///< highest of them above nominal (0 when none)
  double lowest_point_um = 0.0;      ///< lowest of them (0 when none)
};

/// Sets every cell whose centre lies outside all region polygons to NaN and adds the finite ones
/// to `band`. Polygons combine by the even-odd rule (a hole inside an outer loop is outside).
/// @param[in]     region_mm  closed polygons in program XY, mm (empty: nothing is masked)
/// @param[in,out] hf         cells at ((i + 0.5) cell + origin_x, (j + 0.5) cell + origin_y)
/// @param[in,out] band       accumulated over calls (bands of one floor)
void split_wall_band(const std::vector<std::vector<Eigen::Vector2d>>& region_mm, Heightfield& hf,
                     WallBand& band);

}  // namespace cuspmap

// Sanding allowance: how deep to sand before the machining marks vanish, the volume that takes,
// the programmed stock that puts the sanded surface on nominal (two conventions), the grit
// sequence, and a check against a dimensional tolerance. Heights um, areas mm^2, volumes mm^3/in^3.
// Method: marks vanish at the deepest valley: remove Sz from the peaks, Sv on average
// (ISO 25178-2 Sz, Sv); grit layers from grit_sequence (docs/finishing.md).
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "finish/grit_sequence.h"
#include "finish/grit_table.h"
#include "finish/surface_heights.h"

namespace cuspmap {

/// Cubic millimetres per cubic inch: 25.4^3, exact (the inch is 25.4 mm exactly since 1959).
inline constexpr double kMm3PerIn3 = 16387.064;

/// One-line meaning of stock_valleys_nominal_um.
inline constexpr const char* kStockValleysNominalNote =
    "tool tip (the cusp valleys) programmed at nominal + this stock: the sanded mean lands on "
    "nominal";
/// One-line meaning of stock_mean_nominal_um.
inline constexpr const char* kStockMeanNominalNote =
    "mean plane of the cusps programmed at nominal + this stock (mean-line convention): Sv more, "
    "the sanded mean lands on nominal";

/// Everything `cuspmap allowance` reports.
struct Allowance {
  double depth_to_clear_um =
      0.0;  ///< Sz: peaks to the deepest valley, sanded before the marks vanish
  double mean_removal_um = 0.0;  ///< Sv: mean minus minimum, the average thickness over the marks
  double stock_valleys_nominal_um =
      0.0;  ///< stock when the program puts the valleys on the stock plane
  double stock_mean_nominal_um =
      0.0;                ///< stock when the program puts the cusps' mean on the stock plane
  double area_mm2 = 0.0;  ///< area the volumes and times are for, mm^2
  double volume_per_area_mm3_per_mm2 = 0.0;  ///< Sv in mm: volume over the marks per unit area
  double volume_mm3 = 0.0;                   ///< Sv x area: volume down to the deepest valley, mm^3
  double volume_in3 = 0.0;                   ///< the same in in^3
  double sequence_volume_mm3 = 0.0;  ///< volume all grades remove (marks + scratch layers), mm^3
  double sequence_volume_in3 = 0.0;  ///< the same in in^3
  double dimension_change_um = 0.0;  ///< Sz + deepest scratch: peaks to the lowest sanded point, um
  std::optional<double> tolerance_um;  ///< +- dimensional tolerance checked, um (empty: none given)
  bool within_tolerance = true;        ///< dimension_change_um <= tolerance (true when none given)
  GritSequence grits;                  ///< the sanding sequence over area_mm2
};

/// Computes the allowance. When sanding is not needed (the machined Ra meets `target_ra_um`, or
/// the last grade would leave it no finer: GritSequence::needed), nothing is sanded: stock,
/// volumes and dimension change are 0 and the sequence is empty.
/// @param[in] marks         machined surface heights, um (finite, >= 0)
/// @param[in] table         grades available
/// @param[in] sequence      grade names, coarse to fine, non-empty (validated by the caller)
/// @param[in] area_mm2      area for volumes and times, mm^2, >= 0
/// @param[in] tolerance_um  +- tolerance on the sanded dimension, um (> 0), or empty
/// @param[in] target_ra_um  finished Ra wanted, um (> 0), or empty
Allowance sanding_allowance(const SurfaceHeights& marks, const GritTable& table,
                            const std::vector<std::string>& sequence, double area_mm2,
                            std::optional<double> tolerance_um,
                            std::optional<double> target_ra_um);

}  // namespace cuspmap

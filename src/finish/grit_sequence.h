// Grit sequence: for each abrasive grade in turn, the mean thickness it must remove to erase the
// marks before it, the time that takes by hand over an area, and where the sanded surface ends.
// Inputs: SurfaceHeights of the machined marks (um), a GritTable, grade names, area mm^2.
// Method: layered scratch model (docs/finishing.md): each grade cuts until no earlier mark is left,
// its own scratches c = fraction x FEPA mean particle size; time = area x thickness / rate.
#pragma once

#include <string>
#include <vector>

#include "finish/grit_table.h"
#include "finish/surface_heights.h"

namespace cuspmap {

/// One grade of the sequence.
struct GritStep {
  std::string grit;                  ///< grade name, e.g. "P240"
  double particle_um = 0.0;          ///< its mean particle size, um
  double scratch_um = 0.0;           ///< depth of the scratches it leaves, um
  double remove_um = 0.0;            ///< mean thickness it removes, um (volume per area)
  double removal_mm3_per_min = 0.0;  ///< its hand removal rate, mm^3/min
  double volume_mm3 = 0.0;           ///< volume it removes over the area, mm^3
  double time_s = 0.0;               ///< time that takes by hand, s
  double ra_after_um = 0.0;          ///< predicted Ra after this grade: the Ra it leaves, um
};

/// The whole sequence and where it leaves the surface.
struct GritSequence {
  /// False when sanding cannot leave the surface finer than machined (its Ra is already at or
  /// below the Ra the last grade leaves): no grade is used, nothing is removed, stock is 0.
  bool needed = true;
  std::string verdict;          ///< one line: why sanding is or is not needed
  std::string finer_grit;       ///< when not needed: the coarsest grade of the table that would
                                ///< leave a finer Ra than machined, or empty when none does
  std::vector<GritStep> steps;  ///< grades used, coarse to fine; empty when not needed
  std::vector<std::string>
      skipped;  ///< leading grades skipped: their scratches are deeper than the marks
  double mean_below_valleys_um = 0.0;     ///< final mean plane below the machined valleys, um
  double deepest_below_valleys_um = 0.0;  ///< final deepest scratch below the machined valleys, um
  double final_scratch_um = 0.0;  ///< scratch depth of the last grade (peak to valley), um; the
                                  ///< marks' Sz when not needed
  double final_ra_um = 0.0;       ///< Ra estimate after the last grade (its own Ra), or the
                                  ///< machined Ra when not needed: never above the machined Ra
  double total_remove_um = 0.0;           ///< sum of remove_um: machined mean to final mean, um
  double total_volume_mm3 = 0.0;          ///< sum of volume_mm3
  double total_time_s = 0.0;              ///< sum of time_s
};

/// Plans the sanding.
/// Model: the machined marks (depth Sz, mean Sv above the deepest valley) are erased by the first
/// grade, which cuts until its scratch peaks reach the deepest valley; every later grade cuts until
/// its peaks reach the previous grade's deepest scratch. A scratch pattern's mean lies halfway
/// down its depth (symmetric scratches). Hence grade 1 removes Sv + c1/2, grade i removes
/// (c_{i-1} + c_i)/2, and the final mean lies sum(c) - c_n/2 below the machined valleys.
/// Leading grades whose scratch depth exceeds the marks' Sz are skipped (they would cut deeper
/// than the marks they erase); the last grade is always used when sanding is needed.
/// Sanding is not needed when the machined Ra is at or below the Ra the last grade leaves: the
/// sequence would end rougher than it started (e.g. a flat end mill's near-zero closed-form
/// marks); `finer_grit` then names a finer grade of the table that would help, if any.
/// @param[in] marks     height parameters of the machined surface, um (sz, sv, ra used)
/// @param[in] table     grades available
/// @param[in] sequence  grade names in `table`, coarse to fine, non-empty (validated by the caller)
/// @param[in] area_mm2  sanded area, mm^2, >= 0 (0 gives zero volumes and times)
GritSequence grit_sequence(const SurfaceHeights& marks, const GritTable& table,
                           const std::vector<std::string>& sequence, double area_mm2);

}  // namespace cuspmap

// ISO 4288 default cut-off choice (by RSm for periodic profiles, by Ra for non-periodic ones)
// and the lambda-s short-wave cut-off ISO 3274 pairs with each cut-off.
// Inputs: RSm mm or Ra um; outputs: cut-off mm, lambda-s um. Cost O(1).
// Method: ISO 4288:1996 Table 1 (Ra) and Table 3 (RSm); ISO 3274:1996 Table 1 (lambda-s),
// recalled from memory, rows checked in tests/data/iso4288_cutoffs.toml.
#pragma once

#include <array>

namespace cuspmap {

/// The standard cut-off series of ISO 4288 / ISO 16610-21, mm.
inline constexpr std::array<double, 5> kStandardCutoffsMm = {0.08, 0.25, 0.8, 2.5, 8.0};

/// Sampling lengths in the default evaluation length (ISO 4288:1996 §4.4: ln = 5 lr).
inline constexpr int kDefaultSamplingLengths = 5;

/// A cut-off picked from a table row.
struct CutoffRow {
  double cutoff_mm = 0.8;  ///< the cut-off of the row
  bool in_range = true;    ///< false when the value lay outside every row (nearest end row used)
};

/// Cut-off for a periodic profile from its RSm: (0.013, 0.04] -> 0.08; (0.04, 0.13] -> 0.25;
/// (0.13, 0.4] -> 0.8; (0.4, 1.3] -> 2.5; (1.3, 4] -> 8 mm (ISO 4288:1996 Table 3).
/// @param[in] rsm_mm mean element width, mm; outside (0.013, 4] gives the end row, in_range false
CutoffRow cutoff_for_rsm(double rsm_mm);

/// Cut-off for a non-periodic profile from its Ra: (0.006, 0.02] -> 0.08; (0.02, 0.1] -> 0.25;
/// (0.1, 2] -> 0.8; (2, 10] -> 2.5; (10, 80] -> 8 mm (ISO 4288:1996 Table 1).
/// @param[in] ra_um Ra, um; outside (0.006, 80] gives the end row, in_range false
CutoffRow cutoff_for_ra(double ra_um);

/// lambda-s paired with a cut-off by ISO 3274:1996 Table 1: 0.08, 0.25, 0.8 -> 2.5 um;
/// 2.5 -> 8 um; 8 -> 25 um. A non-standard cut-off takes the row of the nearest standard one
/// (nearest on a log scale).
/// @param[in] cutoff_mm cut-off, mm, > 0
double lambda_s_um_for_cutoff(double cutoff_mm);

/// Whether the range of row `cutoff_mm` in Table 1 contains `ra_um` (used by the ISO 4288
/// procedure to accept a measurement); false for a non-standard cut-off.
bool ra_in_cutoff_range(double ra_um, double cutoff_mm);

/// Whether the range of row `cutoff_mm` in Table 3 contains `rsm_mm`.
bool rsm_in_cutoff_range(double rsm_mm, double cutoff_mm);

}  // namespace cuspmap

// ISO 1302 roughness grade numbers N1..N12 and the Ra value each stands for.
// Inputs: Ra um; output: the finest grade the Ra meets ("N7"). Cost O(1).
// Method: ISO 1302:1992 Table of roughness grade numbers (N1 = 0.025 um ... N12 = 50 um),
// recalled from memory; rows checked in tests/data/iso1302_grades.toml.
#pragma once

#include <string>

namespace cuspmap {

/// Ra in um of grade N`n` (1..12): 0.025, 0.05, 0.1, 0.2, 0.4, 0.8, 1.6, 3.2, 6.3, 12.5, 25, 50.
/// @param[in] n grade number, 1..12 (asserted)
double iso1302_grade_ra_um(int n);

/// The finest grade whose Ra is not exceeded by `ra_um`, e.g. 1.2 um -> "N7" (1.6 um).
/// @param[in] ra_um measured Ra, um, >= 0
/// @return "N1".."N12", or "coarser than N12" above 50 um
std::string iso1302_grade(double ra_um);

}  // namespace cuspmap

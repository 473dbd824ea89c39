// ISO 1302 roughness grade numbers N1 ... N12 for an Ra value: the smallest grade whose nominal
// Ra is at least the given Ra (N1 0.025 um, doubling to N12 50 um, with N9 = 6.3 and
// N10 = 12.5 as the standard rounds them). Input um; output grade number and its Ra.
// Method: ISO 1302:1992 Table (roughness grade numbers), retained as informative in ISO 1302:2002.
#pragma once

#include <optional>
#include <string>

namespace cuspmap {

/// An ISO 1302 roughness grade.
struct RoughnessGrade {
  int number = 0;      ///< 1 ... 12 (N1 ... N12)
  double ra_um = 0.0;  ///< the grade's nominal Ra, um
  /// "N7" style label.
  std::string label() const;
};

/// Smallest grade whose nominal Ra is >= ra_um (within a relative 1e-9, so that a computed Ra of
/// 0.8000000001 um still counts as N6).
/// @param[in] ra_um  Ra >= 0, um; 0 gives N1
/// @return empty when Ra exceeds 50 um (coarser than N12) or is negative or not finite.
std::optional<RoughnessGrade> iso1302_grade(double ra_um);

}  // namespace cuspmap

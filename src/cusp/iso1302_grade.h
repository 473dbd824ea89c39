// ISO 1302 roughness grade numbers N1 ... N12 for an Ra value: the smallest grade whose Ra (its
// um value, or the conventional inch value printed beside it when larger: 32 uin for N6) is at
// least the given Ra. Input um; output grade number, its Ra in um and uin.
// Method: ISO 1302:1992 Table (roughness grade numbers), retained as informative in ISO 1302:2002.
#pragma once

#include <optional>
#include <string>

namespace cuspmap {

/// An ISO 1302 roughness grade.
struct RoughnessGrade {
  int number = 0;      ///< 1 ... 12 (N1 ... N12)
  double ra_um = 0.0;  ///< the grade's nominal Ra, um
  double ra_uin = 0.0;  ///< the table's conventional inch value, uin (N6: 32)
  /// "N7" style label.
  std::string label() const;
};

/// Smallest grade whose Ra limit (iso1302_limit_um: um value or conventional inch value) is
/// >= ra_um, within a relative 1e-9 (a computed 0.8000000001 um still counts as N6; so does
/// 32 uin = 0.8128 um, as an inch print means it).
/// @param[in] ra_um  Ra >= 0, um; 0 gives N1
/// @return empty when Ra exceeds 50 um (coarser than N12) or is negative or not finite.
std::optional<RoughnessGrade> iso1302_grade(double ra_um);

}  // namespace cuspmap

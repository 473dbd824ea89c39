// ISO 1302:1992 roughness grade numbers N1 ... N12: each grade's Ra in micrometres and the
// conventional microinch value the same table prints beside it (N6 = 0.8 um = 32 uin).
// Inputs: grade number or text such as "N6"; outputs: Ra um / uin. Cost O(1).
// Method: ISO 1302:1992 table of roughness grade numbers (from memory; the 2002 edition dropped
// the N-grades); rows checked in tests/data/iso1302_grades.toml.
#pragma once

#include <array>
#include <optional>
#include <string_view>

namespace cuspmap {

/// One row of the ISO 1302:1992 grade table.
struct Iso1302Row {
  int grade = 0;        ///< N-number, 1 ... 12
  double ra_um = 0.0;   ///< Ra, um (the standard's value)
  double ra_uin = 0.0;  ///< the conventional inch value printed beside it, uin (not 39.37 x um)
};

/// The twelve rows, N1 first. Ra doubles from 0.025 um (1 uin) to 50 um (2000 uin), rounded at
/// N9 (6.3 um, 250 uin), N10 (12.5 um, 500 uin) and N7 (1.6 um, 63 uin), N8 (125 uin).
inline constexpr std::array<Iso1302Row, 12> kIso1302Table = {{
    {1, 0.025, 1.0},
    {2, 0.05, 2.0},
    {3, 0.1, 4.0},
    {4, 0.2, 8.0},
    {5, 0.4, 16.0},
    {6, 0.8, 32.0},
    {7, 1.6, 63.0},
    {8, 3.2, 125.0},
    {9, 6.3, 250.0},
    {10, 12.5, 500.0},
    {11, 25.0, 1000.0},
    {12, 50.0, 2000.0},
}};

/// The row of a grade written "N6" (or "n6"); empty when the text is not N1 ... N12.
std::optional<Iso1302Row> iso1302_row(std::string_view text);

/// The largest Ra, um, that still meets a row: its um value or its conventional inch value,
/// whichever is larger (32 uin = 0.8128 um meets N6 as an inch print means it to).
double iso1302_limit_um(const Iso1302Row& row);

}  // namespace cuspmap

// Flags shared by `allowance` and `plan`: the tool (--tool --diameter --corner-radius --dish
// --tilt), the abrasive set-up (--grit-table --grits), areas, and number formatting for tables.
// cli/ holds no computation: these parse and check input, then hand plain values to the library.
#pragma once

#include <CLI/CLI.hpp>
#include <nlohmann/json.hpp>
#include <string>
#include <string_view>
#include <vector>

#include "core/units.h"
#include "finish/grit_sequence.h"
#include "finish/grit_table.h"
#include "tool/cutter.h"

namespace cuspmap {

/// Tool flags as typed (lengths keep their suffixes until parsed).
struct ToolFlags {
  std::string tool = "ball";      ///< ball | bullnose | flat
  std::string diameter;           ///< --diameter, required
  std::string corner_radius;      ///< --corner-radius, bull-nose only
  std::string dish = "0";         ///< --dish, deg
  std::string tilt = "0";         ///< --tilt, deg (flat end: taken along the feed)
  std::string tilt_toward = "0";  ///< --tilt-toward, deg from +X (the pass direction), ccw
};

/// Adds --tool --diameter --corner-radius --dish --tilt --tilt-toward.
void add_tool_flags(CLI::App& sub, ToolFlags& flags);

/// Parses a shape name.
/// @throws InputError "<what> <name>: must be ball, bullnose or flat".
CutterShape parse_cutter_shape(std::string_view name, std::string_view what);

/// Builds and validates the cutter the tool flags describe.
/// @throws InputError naming the flag: missing --diameter, bad numbers, values out of range.
Cutter tool_from_flags(const ToolFlags& flags, LengthUnit units);

/// Refuses a flat end tilted across the feed where only the closed form will be used: its cusp
/// model takes the tilt along the passes (+X), i.e. --tilt-toward 0 or 180.
/// @throws InputError naming --tilt-toward and suggesting the simulated route (`hint`).
void require_tilt_along_feed(const Cutter& cutter, const std::string& hint);

/// Abrasive flags as typed.
struct GritFlags {
  std::string table_file;  ///< --grit-table FILE ("" = built-in defaults)
  std::string grits;       ///< --grits P180,P240,... ("" = the table's sequence)
};

/// Adds --grit-table and --grits.
void add_grit_flags(CLI::App& sub, GritFlags& flags);

/// The grade table and sequence the flags choose.
struct GritChoice {
  GritTable table;                    ///< built-in or read from --grit-table
  std::vector<std::string> sequence;  ///< grades to use, coarse to fine
};

/// @throws InputError for an unreadable or invalid table or sequence.
GritChoice grit_choice_from_flags(const GritFlags& flags);

/// Parses an area: "120x80" (two lengths, suffixes allowed: "4.7inx3in") or one number in mm^2
/// (in^2 with --units in) with an optional suffix mm2, cm2 or in2.
/// @throws InputError naming `what` when malformed or not > 0.
double parse_area_mm2(std::string_view text, LengthUnit units, std::string_view what);

/// Fixed-point text with `decimals` digits, locale-independent ("12.35").
std::string fixed(double value, int decimals);

/// A height for human output: "12.35 um" (mm) or "486 uin" (in).
std::string height_text(double um, LengthUnit units);

/// A duration for human output: "45 s", "12.5 min", "2.25 h".
std::string duration_text(double seconds);

/// grits[] of the JSON contract: {grit, particle_um, scratch_um, remove_um, removal_mm3_per_min,
/// volume_mm3, time_s} per step.
nlohmann::json grits_json(const GritSequence& sequence);

/// Prints the one-line caution (report/html_report.h kShortCaution) on stdout; the full
/// list is in the JSON and in --help.
void print_cautions();

}  // namespace cuspmap

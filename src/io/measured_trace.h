// A single measured profile trace as stylus instruments export it: text rows of two numbers,
// x (position along the trace) and z (height), and the rule that tells such a file from a grid.
// Inputs: file text; output: MeasuredTrace (runs of finite, equally spaced heights um, spacing
// mm). Cost O(rows log rows). Method: locale-free tokens (io/heightmap_text.h); uneven x is
// resampled linearly onto the median step (ISO 4287 evaluates equally spaced ordinates).
#pragma once

#include <string>
#include <string_view>
#include <vector>

#include "texture/extract_profiles.h"

namespace cuspmap {

/// Positions within this fraction of the median step count as equally spaced (instruments print
/// x with 4-6 significant digits: common practice, no source).
inline constexpr double kTraceStepTolerance = 0.01;
/// Fewest points a trace may hold: one 0.08 mm cut-off at 0.5 um steps is 160; 16 points cannot
/// hold two profile elements with the 1 % width discrimination of ISO 4287 (derived bound).
inline constexpr int kMinTracePoints = 16;

/// A trace read from a file.
struct MeasuredTrace {
  std::vector<ProfileTrace> runs;  ///< finite runs (split where z is NaN), equally spaced
  double spacing_mm = 0.0;         ///< the sample step
  double length_mm = 0.0;          ///< last x minus first x
  int points = 0;                  ///< rows read (NaN heights included)
  int missing_points = 0;          ///< rows whose z is NaN
  bool resampled = false;          ///< x was uneven and the trace was resampled
};

/// How a text file's columns are taken.
enum class InputLayout {
  Auto,   ///< a .csv/.txt/.xyz/.asc file whose every data row holds two numbers is a trace
  Trace,  ///< always an x, z trace (any extension)
  Grid,   ///< always a heightmap (a two-column CSV is then a grid two cells wide)
};

/// Parses a --layout value: auto, trace or grid.
/// @throws InputError naming the value when it is none of those
InputLayout parse_input_layout(const std::string& text);

/// Whether `path` is read as a trace under `layout` (reads the file for Auto).
/// @throws InputError when the file cannot be opened
bool is_trace_file(const std::string& path, InputLayout layout);

/// Reads `path` as a trace (see decode_trace).
MeasuredTrace read_trace(const std::string& path, double x_mm_per_unit, double z_um_per_unit);

/// True when `text` reads as a trace: every data row (not blank, not '#', a first row of
/// column names, in which no field is a number, skipped) holds exactly two
/// fields. This is the rule `texture` and `diagnose` apply to .csv/.txt/.xyz/.asc files.
bool looks_like_trace(std::string_view text);

/// Decodes an x, z trace.
/// @param[in] text          the whole file
/// @param[in] name          file name for messages
/// @param[in] x_mm_per_unit mm per unit of the x column (1 for mm, 25.4 for inches)
/// @param[in] z_um_per_unit um per unit of the z column (1 for um, 1e3 for mm)
/// @throws InputError "<name>:<line>: <what>" for a row without exactly two fields, a field that
///         is not a number, a NaN x, x not strictly increasing, or fewer than kMinTracePoints rows
MeasuredTrace decode_trace(std::string_view text, const std::string& name, double x_mm_per_unit,
                           double z_um_per_unit);

}  // namespace cuspmap

// Job: everything one simulation needs (cutter, patch, cut, path, sim settings), read from a TOML
// job file and validated, in core units (mm, deg, mm/min). docs/job-file.md lists every key.
// Method: toml++ 3 parser; schema checks with file:line:col messages and nearest-key suggestions.
#pragma once

#include <string>
#include <string_view>
#include <vector>

#include "core/heightfield.h"
#include "core/units.h"
#include "path/path_spec.h"
#include "sweep/simulate_floor.h"
#include "tool/cutter.h"

namespace cuspmap {

/// A validated job.
struct Job {
  std::string name;                       ///< `name` key, or the file's stem
  std::string source;                     ///< path of the job file ("" for built-in jobs)
  LengthUnit units = LengthUnit::Millimetre;  ///< unit of bare numbers in the file and of human output
  Patch patch;                            ///< floor region, mm
  bool patch_from_program = false;        ///< gcode job without [patch] size: derive it from the program
  Cutter cutter;                          ///< tool, mm/deg
  CutSpec cut;                            ///< cutting conditions
  PathSpec path;                          ///< strategy; path.file is absolute or relative to the job file
  SimSpec sim;                            ///< tooth_marks (threads and memory come from flags)
  std::vector<std::string> ignored_keys;  ///< known keys that do not apply here, "tool.dish_deg (ball)"
};

/// Reads and validates a job file.
/// @param[in] path  TOML file
/// @throws InputError "<file>:<line>:<col>: <what>" for unreadable files, TOML syntax, unknown
///         keys (with the nearest known key), wrong types and out-of-range values.
Job load_job(const std::string& path);

/// Same, from text already in memory; relative [path] file names resolve against base_dir.
Job parse_job(std::string_view text, const std::string& source_name, const std::string& base_dir);

/// Short one-line description of a job's tool ("6 mm ball", "6 mm flat, 1 deg dish").
std::string describe_tool(const Cutter& cutter, LengthUnit units);
/// Short one-line description of a job's path ("raster one-way 0.3 mm @ 0 deg").
std::string describe_path(const PathSpec& path, LengthUnit units);

}  // namespace cuspmap

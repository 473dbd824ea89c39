// Reads the measurements file of `cuspmap calibrate`: one row per past finishing job (a job file,
// or tool + diameter + stepover) with the Ra the shop's profilometer measured on it.
// Lengths in mm after parsing (suffixes mm, um, in, thou, uin; bare numbers in `unit`), Ra in um
// (bare numbers um, or uin with --units in). Errors name file:line, the column and the value.
// Method: RFC 4180 comma-separated values (header row, optional double quotes); '#' comments.
#pragma once

#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "core/units.h"
#include "cusp/cusp_setup.h"

namespace cuspmap {

/// One measured job.
struct MeasuredJob {
  int line = 0;                    ///< line in the file (1-based)
  std::string name;                ///< `name` column, or "row <line>"
  std::string job_path;            ///< `job` column resolved against the file's folder; empty = flags
  std::optional<CuspSetup> setup;  ///< cutter on a flat floor when no job is given
  double stepover_mm = 0.0;        ///< stepover (flags rows), mm
  double measured_ra_um = 0.0;     ///< the profilometer's Ra, um (> 0)
};

/// Parses the file's text. Columns (header names, any order, case-insensitive): measured_ra
/// (required), name, job, tool (ball | bullnose | flat), diameter, corner_radius, stepover.
/// A row gives either `job` or `tool`, `diameter` and `stepover` (bull-nose: `corner_radius`).
/// @param[in] base_dir  folder job paths are relative to ("" = current)
/// @throws InputError on a missing header column, an unknown column, a row that gives neither a
///         job nor a tool, a malformed or out-of-range value, or fewer than two rows.
std::vector<MeasuredJob> parse_measured_jobs(std::string_view text, const std::string& file_name,
                                             const std::string& base_dir, LengthUnit unit);

/// Reads and parses a measurements file (job paths relative to its folder).
/// @throws InputError when the file cannot be read, or as parse_measured_jobs.
std::vector<MeasuredJob> read_measured_jobs(const std::string& path, LengthUnit unit);

}  // namespace cuspmap

// Runs a set of jobs for `compare` and `demo` and writes their shared outputs: per-job pictures on
// one height scale, montage.png, compare.json, compare.csv and an optional HTML page.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "cli/output_dir.h"
#include "report/compare_report.h"
#include "job/run_job.h"

namespace cuspmap {

/// The compared rows and the basis their profile parameters share.
struct Comparison {
  std::vector<CompareRow> rows;  ///< one per job, in order
  ProfileBasis basis;            ///< common cut-off and direction rule, or why not
};

/// Simulates every job (progress bar on a terminal), puts their profile parameters on one basis
/// (job/common_profile_basis.h) and renders their pictures; height.png of all jobs share
/// `range`, or the overall min..max when it is empty; height_own.png shows each floor on its own
/// range.
Comparison run_comparison(const std::vector<Job>& jobs, RunOptions options,
                                       std::optional<HeightRange> range, LengthUnit units,
                                       bool verbose);

/// Writes <n>_<name>_height.png (shared scale) / _height_own.png (own range) / _shaded.png /
/// _detail.png / _detail_shaded.png / _profile.png, montage.png, compare.csv,
/// compare.json and, when html_path is not empty, the HTML page (extra notes appended).
/// @return compare.json's document
nlohmann::json write_comparison(OutputDir& dir, const Comparison& comparison,
                                LengthUnit units, const std::string& html_path,
                                const std::vector<std::string>& html_notes = {});

}  // namespace cuspmap

// Encodes a stepover plan as CSV, one row per option (lengths mm, heights um, times s, costs in
// the rates' currency), for spreadsheets. Pure: returns the text; the caller writes it.
// Method: RFC 4180 (comma-separated, CRLF-free here: LF line ends; fields with commas or quotes
// quoted, quotes doubled). Numbers via std::to_chars (locale-independent).
#pragma once

#include <string>

#include "finish/price_option.h"

namespace cuspmap {

/// Header row then one row per option in plan order; column `best` is 1 for the best option.
/// Columns: tool, stepover_mm, passes, path_length_mm, machine_time_s, scallop_um (Sz), sv_um,
/// ra_um, simulated, sanded, grits, bench_time_s, removed_volume_mm3, final_ra_um, machine_cost,
/// bench_cost, cost, meets_spec, best, reason.
std::string encode_plan_csv(const PlanResult& plan);

}  // namespace cuspmap

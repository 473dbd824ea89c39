// Reads an abrasive grade table (TOML, tests/data/grits_default.toml style) into a GritTable, and
// checks a user's grade sequence against a table. Sizes um, rates mm^3/min.
// Errors name file:line:col, the key or value and what is allowed. Cost O(file size).
// Method: TOML v1.0 via toml++ 3.3; fractions of the FEPA P-grade mean particle size as in
// finish/grit_table.h.
#pragma once

#include <string>
#include <string_view>
#include <vector>

#include "finish/grit_table.h"

namespace cuspmap {

/// Parses a grade table from TOML text.
/// Keys: source (string), sequence (array of names), scratch_per_particle, ra_per_particle,
/// removal_mm3_per_min_per_particle_um (numbers > 0; default the built-in fractions), grit (array
/// of tables {name, particle_um, scratch_um?, ra_um?, removal_mm3_per_min?}).
/// @param[in] text       file contents
/// @param[in] file_name  shown in messages
/// @return grades sorted coarse to fine; the sequence is the file's, or all grades when the
///         file gives none.
/// @throws InputError on a TOML syntax error, an unknown key, a missing or non-positive value,
///         a duplicate grade name or an invalid sequence.
GritTable parse_grit_table(std::string_view text, const std::string& file_name);

/// Reads and parses a grade table file.
/// @throws InputError when the file cannot be read, or as parse_grit_table.
GritTable read_grit_table(const std::string& path);

/// Splits a comma-separated list of grade names ("P180,P240") and checks it against a table.
/// @param[in] text   the list as typed
/// @param[in] table  grades available
/// @param[in] what   flag name for messages, e.g. "--grits"
/// @throws InputError on an empty list, an unknown name (listing the known ones) or grades not
///         going from coarse to fine (particle size strictly decreasing).
std::vector<std::string> parse_grit_sequence(std::string_view text, const GritTable& table,
                                             std::string_view what);

}  // namespace cuspmap

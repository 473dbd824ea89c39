// Nearest known key to a misspelt one, for "unknown key 'tool.diamter'; did you mean ...".
// Inputs: the unknown key and the known ones; output: the closest, or "" when none is close.
// Method: Levenshtein edit distance (Levenshtein 1966), Wagner-Fischer dynamic programme.
#pragma once

#include <string>
#include <string_view>
#include <vector>

namespace cuspmap {

/// Edit distance (insertions, deletions, substitutions, each cost 1) between a and b.
int edit_distance(std::string_view a, std::string_view b);

/// The known key with the smallest edit distance to `key`, if that distance is at most
/// max(2, key.size() / 3); otherwise "".
std::string nearest_key(std::string_view key, const std::vector<std::string>& known);

}  // namespace cuspmap

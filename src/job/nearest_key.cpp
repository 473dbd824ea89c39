// Levenshtein distance and nearest-key suggestion for misspelt job keys.
// Inputs: short ASCII strings; output: distance / best candidate. O(|a| |b|) per pair.
// Method: Wagner & Fischer, "The string-to-string correction problem", JACM 1974.
#include "job/nearest_key.h"

#include <algorithm>
#include <numeric>

namespace cuspmap {

int edit_distance(std::string_view a, std::string_view b) {
  std::vector<int> prev(b.size() + 1), cur(b.size() + 1);
  std::iota(prev.begin(), prev.end(), 0);
  for (size_t i = 1; i <= a.size(); ++i) {
    cur[0] = static_cast<int>(i);
    for (size_t j = 1; j <= b.size(); ++j) {
      const int substitute = prev[j - 1] + (a[i - 1] == b[j - 1] ? 0 : 1);
      cur[j] = std::min({prev[j] + 1, cur[j - 1] + 1, substitute});
    }
    std::swap(prev, cur);
  }
  return prev[b.size()];
}

std::string nearest_key(std::string_view key, const std::vector<std::string>& known) {
  // A suggestion further away than a third of the word is more confusing than helpful.
  const int limit = std::max(2, static_cast<int>(key.size()) / 3);
  std::string best;
  int best_distance = limit + 1;
  for (const std::string& k : known) {
    const int d = edit_distance(key, k);
    if (d < best_distance) {
      best_distance = d;
      best = k;
    }
  }
  return best;
}

}  // namespace cuspmap

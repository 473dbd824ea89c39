// Pass-band correlations: traces grouped by pass, partners found one and two stepovers over,
// the normalised cross-correlation of the group pooled and maximised over the along-lay shift.
// Inputs: along-lay traces; output: PassSignatures. Cost O(traces * n * shifts).
// Method: see pass_signatures.h.
#include "infer/pass_signatures.h"

#include <algorithm>
#include <cmath>
#include <map>
#include <utility>
#include <vector>

#include "core/parallel_blocks.h"
#include "texture/remove_least_squares_line.h"

namespace cuspmap {
namespace {

struct Line {
  std::vector<double> z;  // detrended heights
  double start = 0.0;     // along position of z[0], mm
};

// Pooled correlation of pairs (a_k, b_k) at along shift s (samples): sum a(x) b(x + s) over the
// overlap, normalised by the energies of the overlapping parts. index[k][i] is the sample of b_k
// that a_k's sample i meets at shift 0 (rounded once per pair, not once per shift).
double pooled(const std::vector<std::pair<const Line*, const Line*>>& pairs,
              const std::vector<std::vector<int>>& index, int s) {
  double ab = 0.0, aa = 0.0, bb = 0.0;
  for (size_t k = 0; k < pairs.size(); ++k) {
    const Line& a = *pairs[k].first;
    const Line& b = *pairs[k].second;
    const int na = static_cast<int>(a.z.size()), nb = static_cast<int>(b.z.size());
    const int* j0 = index[k].data();
    for (int i = 0; i < na; ++i) {
      const int j = j0[i] + s;
      if (j < 0 || j >= nb) continue;
      ab += a.z[i] * b.z[j];
      aa += a.z[i] * a.z[i];
      bb += b.z[j] * b.z[j];
    }
  }
  return aa > 0.0 && bb > 0.0 ? ab / std::sqrt(aa * bb) : 0.0;
}

double best_over_shifts(const std::vector<std::pair<const Line*, const Line*>>& pairs,
                        int max_shift, double dx, bool mirror) {
  std::vector<std::vector<int>> index(pairs.size());
  for (size_t k = 0; k < pairs.size(); ++k) {
    const Line& a = *pairs[k].first;
    const Line& b = *pairs[k].second;
    const int base = static_cast<int>(std::lround((a.start - b.start) / dx));
    index[k].resize(a.z.size());
    for (size_t i = 0; i < a.z.size(); ++i) {
      // Mirror: b read backwards about the field centre (along position -x).
      index[k][i] =
          mirror ? static_cast<int>(std::lround((-(a.start + static_cast<double>(i) * dx) - b.start) / dx))
                 : static_cast<int>(i) + base;
    }
  }
  double best = -1.0;
  for (int s = -max_shift; s <= max_shift; ++s) best = std::max(best, pooled(pairs, index, s));
  return best;
}

}  // namespace

PassSignatures pass_signatures(const std::vector<ProfileTrace>& along, double stepover_mm,
                               double valley_mm, double max_shift_mm, int threads) {
  PassSignatures p;
  if (along.empty() || stepover_mm <= 0.0) return p;
  const double dx = along.front().spacing_mm;
  // One detrended line per cell offset (the longest run there).
  // Lines keyed by whole cells from the first offset (offsets sit on a one-cell lattice that
  // may be shifted half a cell from 0, where rounding offset / dx would be ambiguous).
  double o0 = 1e300;
  for (const ProfileTrace& t : along) o0 = std::min(o0, t.offset_mm);
  std::map<long, Line> lines;
  double ss = 0.0, count = 0.0;
  for (const ProfileTrace& t : along) {
    if (t.z_um.size() < 3) continue;
    const long key = std::lround((t.offset_mm - o0) / dx);
    auto it = lines.find(key);
    if (it != lines.end() && it->second.z.size() >= t.z_um.size()) continue;
    Line l{t.z_um, t.start_mm};
    remove_least_squares_line(l.z);
    lines[key] = std::move(l);
  }
  for (const auto& [key, l] : lines) {
    for (double v : l.z) ss += v * v;
    count += static_cast<double>(l.z.size());
  }
  p.along_rms_um = count > 0.0 ? std::sqrt(ss / count) : 0.0;
  const int max_shift = std::max(1, static_cast<int>(std::lround(max_shift_mm / dx)));
  // Bands centred on pass centres.
  std::map<long, std::vector<long>> bands;
  for (const auto& [key, l] : lines) {
    const double o = o0 + key * dx;
    bands[std::lround(std::floor((o - valley_mm) / stepover_mm + 0.5))].push_back(key);
  }
  auto partner = [&](long key, int passes) -> const Line* {
    const auto it = lines.find(std::lround((key * dx + passes * stepover_mm) / dx));  // o0 cancels
    return it == lines.end() ? nullptr : &it->second;
  };
  // Each band's three correlations are independent: parallel blocks, summed in band order
  // afterwards (the same result for any thread count).
  struct BandScore {
    bool counted = false, has_one = false, has_two = false;
    double one = 0.0, two = 0.0, mirror = 0.0;
  };
  std::vector<const std::vector<long>*> band_keys;
  for (const auto& [band, keys] : bands) band_keys.push_back(&keys);
  std::vector<BandScore> scores(band_keys.size());
  parallel_blocks(static_cast<int>(band_keys.size()), threads, [&](int b) {
    const std::vector<long>& keys = *band_keys[static_cast<size_t>(b)];
    // A band counts when it holds most of a stepover's traces (edge bands are partial).
    if (static_cast<double>(keys.size()) < 0.8 * stepover_mm / dx) return;
    std::vector<std::pair<const Line*, const Line*>> one, two, self;
    for (long key : keys) {
      const Line* a = &lines.at(key);
      self.emplace_back(a, a);
      if (const Line* l = partner(key, 1)) one.emplace_back(a, l);
      if (const Line* l = partner(key, 2)) two.emplace_back(a, l);
    }
    BandScore& sc = scores[static_cast<size_t>(b)];
    sc.counted = true;
    sc.mirror = best_over_shifts(self, 2 * max_shift, dx, true);
    sc.has_one = one.size() == keys.size();
    if (sc.has_one) sc.one = best_over_shifts(one, max_shift, dx, false);
    sc.has_two = two.size() == keys.size();
    if (sc.has_two) sc.two = best_over_shifts(two, max_shift, dx, false);
  });
  double sum1 = 0.0, sum2 = 0.0, summ = 0.0;
  int n1 = 0, n2 = 0, nm = 0;
  for (const BandScore& sc : scores) {
    if (!sc.counted) continue;
    summ += sc.mirror;
    ++nm;
    if (sc.has_one) {
      sum1 += sc.one;
      ++n1;
    }
    if (sc.has_two) {
      sum2 += sc.two;
      ++n2;
    }
  }
  p.bands = n1;
  p.next_pass = n1 > 0 ? sum1 / n1 : 0.0;
  p.second_pass = n2 > 0 ? sum2 / n2 : 0.0;
  p.mirror = nm > 0 ? summ / nm : 0.0;
  return p;
}

}  // namespace cuspmap

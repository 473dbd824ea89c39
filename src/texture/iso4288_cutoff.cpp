// ISO 4288 cut-off tables (Ra, RSm) and ISO 3274 lambda-s pairs.
// Inputs: Ra um or RSm mm; output: cut-off mm / lambda-s um. Cost O(1).
// Method: ISO 4288:1996 Tables 1 and 3, ISO 3274:1996 Table 1 (from memory; see the test table).
#include "texture/iso4288_cutoff.h"

#include <cmath>

namespace cuspmap {
namespace {

// Upper bounds of each row, matching kStandardCutoffsMm; a row holds (previous bound, bound].
constexpr std::array<double, 5> kRaUpperUm = {0.02, 0.1, 2.0, 10.0, 80.0};
constexpr double kRaLowerUm = 0.006;
constexpr std::array<double, 5> kRsmUpperMm = {0.04, 0.13, 0.4, 1.3, 4.0};
constexpr double kRsmLowerMm = 0.013;
constexpr std::array<double, 5> kLambdaSUm = {2.5, 2.5, 2.5, 8.0, 25.0};

CutoffRow pick(double value, double lower, const std::array<double, 5>& upper) {
  if (!(value > lower)) return {kStandardCutoffsMm.front(), false};
  for (size_t k = 0; k < upper.size(); ++k) {
    if (value <= upper[k]) return {kStandardCutoffsMm[k], true};
  }
  return {kStandardCutoffsMm.back(), false};
}

int standard_index(double cutoff_mm) {
  // A cut-off within 0.1 % of a standard one is that one (values come from flags and tables).
  constexpr double kSameCutoffRel = 1e-3;
  for (size_t k = 0; k < kStandardCutoffsMm.size(); ++k) {
    if (std::abs(cutoff_mm - kStandardCutoffsMm[k]) <= kSameCutoffRel * kStandardCutoffsMm[k]) {
      return static_cast<int>(k);
    }
  }
  return -1;
}

bool in_row(double value, double lower, const std::array<double, 5>& upper, double cutoff_mm) {
  const int k = standard_index(cutoff_mm);
  if (k < 0) return false;
  const double lo = k == 0 ? lower : upper[static_cast<size_t>(k) - 1];
  return value > lo && value <= upper[static_cast<size_t>(k)];
}

}  // namespace

CutoffRow cutoff_for_rsm(double rsm_mm) { return pick(rsm_mm, kRsmLowerMm, kRsmUpperMm); }

CutoffRow cutoff_for_ra(double ra_um) { return pick(ra_um, kRaLowerUm, kRaUpperUm); }

double lambda_s_um_for_cutoff(double cutoff_mm) {
  size_t best = 0;
  double best_dist = 1e300;
  for (size_t k = 0; k < kStandardCutoffsMm.size(); ++k) {
    const double dist = std::abs(std::log(cutoff_mm / kStandardCutoffsMm[k]));
    if (dist < best_dist) {
      best_dist = dist;
      best = k;
    }
  }
  return kLambdaSUm[best];
}

bool ra_in_cutoff_range(double ra_um, double cutoff_mm) {
  return in_row(ra_um, kRaLowerUm, kRaUpperUm, cutoff_mm);
}

bool rsm_in_cutoff_range(double rsm_mm, double cutoff_mm) {
  return in_row(rsm_mm, kRsmLowerMm, kRsmUpperMm, cutoff_mm);
}

}  // namespace cuspmap

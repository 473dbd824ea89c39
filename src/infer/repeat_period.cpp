// Repeat period from a mean autocorrelation: first peak after the first dip below zero, then
// every multiple's peak, period from the slope of lag against repeat number.
// Inputs: traces or an ACF; output: RepeatPeriod. Cost: see repeat_period.h.
// Method: Box & Jenkins (autocorrelation); parabolic interpolation of a sampled peak.
#include "infer/repeat_period.h"

#include <algorithm>
#include <cmath>

#include "texture/remove_least_squares_line.h"

namespace cuspmap {
namespace {

// Comb search: candidate step (quarter sample: the flat floors' ACF peaks are a few samples
// wide), the longest submultiple tried, its search band, and the share of the best comb score a
// submultiple keeps to be the period (derived: a false 1/m of the period combs the ACF at
// lags where only every m-th is a repeat, ~1/m of the score plus scatter, measured up to 0.67
// for m = 3 on a dished flat floor; the true period of a floor whose comb peaks at twice it
// keeps 0.99 on ball floors).
constexpr double kCombStepSamples = 0.25;
constexpr int kMaxSubmultiple = 4;
constexpr double kSubmultipleSlack = 0.03;
constexpr double kMinSubmultipleScore = 0.8;
// A comb scoring below this is no repeat (as kMinRepeatPeak, for a mean over the multiples).
constexpr double kMinCombScore = kMinRepeatPeak;
// Peaks at the multiples must keep this share of the comb score to enter the refinement.
constexpr double kCombPeakShare = 0.5;

// Sub-sample position of the peak at index i (parabola through i-1, i, i+1).
double refine_peak(const std::vector<double>& a, int i) {
  if (i <= 0 || i + 1 >= static_cast<int>(a.size())) return i;
  const double l = a[i - 1], c = a[i], r = a[i + 1];
  const double den = l - 2.0 * c + r;
  if (den >= 0.0) return i;
  return i + std::clamp(0.5 * (l - r) / den, -0.5, 0.5);
}

// Index of the largest value in [lo, hi] that is a local maximum, or -1.
int local_max_in(const std::vector<double>& a, int lo, int hi) {
  lo = std::max(lo, 1);
  hi = std::min(hi, static_cast<int>(a.size()) - 2);
  int best = -1;
  for (int i = lo; i <= hi; ++i) {
    if (a[i] >= a[i - 1] && a[i] >= a[i + 1] && (best < 0 || a[i] > a[best])) best = i;
  }
  return best;
}

// Refines a repeat of `guess` samples: the peak near every multiple k (within a quarter
// period, at least `min_peak`) is located to a sub-sample, and the period is the least-squares
// slope of lag against k; fills period, sigma, repeats and the strongest peak of r.
void refine_repeats(const std::vector<double>& acf, double spacing_mm, double guess, int first,
                    double min_peak, RepeatPeriod& r) {
  const int n = static_cast<int>(acf.size());
  // Each multiple k of the guess has its own peak within a quarter period.
  double skk = 0.0, skl = 0.0;
  std::vector<std::pair<double, double>> kl;
  int strongest = first;
  for (int k = 1;; ++k) {
    const double centre = k * guess;
    const int half = std::max(1, static_cast<int>(0.25 * guess));
    if (centre + half + 1 >= n) break;
    const int i = local_max_in(acf, static_cast<int>(std::lround(centre)) - half,
                               static_cast<int>(std::lround(centre)) + half);
    if (i < 0 || acf[i] < min_peak) break;
    if (acf[i] > acf[strongest]) strongest = i;
    const double lag = refine_peak(acf, i);
    kl.emplace_back(k, lag);
    skk += static_cast<double>(k) * k;
    skl += k * lag;
  }
  r.repeats = static_cast<int>(kl.size());
  const double period = kl.empty() ? guess : skl / skk;
  r.period_mm = period * spacing_mm;
  if (kl.size() >= 2) {
    double ss = 0.0;
    for (const auto& [k, lag] : kl) ss += (lag - k * period) * (lag - k * period);
    r.sigma_mm = std::sqrt(ss / static_cast<double>(kl.size() - 1) / skk) * spacing_mm;
  }
  // Parabolic interpolation of a sampled peak is biased by up to ~0.1 sample whatever the
  // scatter (derived: the peak of a sampled cosine-like ACF); the last repeat divides it.
  constexpr double kPeakBiasSamples = 0.1;
  r.sigma_mm = std::max(r.sigma_mm, kPeakBiasSamples * spacing_mm / std::max(1, r.repeats));
  r.strongest_mm = refine_peak(acf, strongest) * spacing_mm;
  r.strongest_peak = acf[strongest];
}

}  // namespace

std::vector<double> mean_autocorrelation(const std::vector<ProfileTrace>& traces, int max_lag) {
  std::vector<double> sum(static_cast<size_t>(max_lag) + 1, 0.0), pairs(sum.size(), 0.0);
  std::vector<double> z;
  for (const ProfileTrace& t : traces) {
    if (t.z_um.size() < 3) continue;
    z = t.z_um;
    remove_least_squares_line(z);
    const int n = static_cast<int>(z.size());
    for (int lag = 0; lag <= std::min(max_lag, n - 1); ++lag) {
      double s = 0.0;
      for (int i = 0; i + lag < n; ++i) s += z[i] * z[i + lag];
      sum[lag] += s;
      pairs[lag] += n - lag;
    }
  }
  std::vector<double> acf(sum.size(), 0.0);
  if (pairs[0] == 0.0 || sum[0] <= 0.0) return acf;
  const double var = sum[0] / pairs[0];
  for (size_t k = 0; k < acf.size(); ++k) acf[k] = pairs[k] > 0.0 ? sum[k] / pairs[k] / var : 0.0;
  return acf;
}

double acf_at(const std::vector<double>& acf, double spacing_mm, double lag_mm) {
  const double x = lag_mm / spacing_mm;
  const int i = static_cast<int>(std::floor(x));
  if (i < 0 || i + 1 >= static_cast<int>(acf.size())) return 0.0;
  return acf[i] + (x - i) * (acf[i + 1] - acf[i]);
}

RepeatPeriod repeat_period(const std::vector<double>& acf, double spacing_mm, int min_lag) {
  RepeatPeriod r;
  const int n = static_cast<int>(acf.size());
  int dip = min_lag;
  while (dip < n && acf[dip] > 0.0) ++dip;
  if (dip >= n) return r;
  // First clear peak after the dip: the first local maximum above the threshold.
  int first = -1;
  for (int i = std::max(dip, 1); i + 1 < n; ++i) {
    if (acf[i] >= acf[i - 1] && acf[i] >= acf[i + 1] && acf[i] >= kMinRepeatPeak) {
      first = i;
      break;
    }
  }
  if (first < 0) return r;
  r.found = true;
  r.first_peak = acf[first];
  refine_repeats(acf, spacing_mm, refine_peak(acf, first), first, kMinRepeatPeak, r);
  return r;
}

double comb_score(const std::vector<double>& acf, double period) {
  const double last = static_cast<double>(acf.size()) - 1.0;
  double s = 0.0;
  int k = 0;
  for (double lag = period; lag <= last; lag += period, ++k) s += acf_at(acf, 1.0, lag);
  return k > 0 ? s / k : 0.0;
}

RepeatPeriod comb_period(const std::vector<double>& acf, double spacing_mm, int min_lag,
                         double max_period) {
  RepeatPeriod r;
  const int n = static_cast<int>(acf.size());
  // Candidate periods every quarter sample, each scored by the mean ACF at its multiples.
  const auto score = [&](double p) { return comb_score(acf, p); };
  double best_p = 0.0, best = -1.0;
  const double longest = std::min(0.5 * (n - 1), max_period);
  for (double p = std::max(min_lag, 2); p <= longest; p += kCombStepSamples) {
    const double s = score(p);
    if (s > best) best = s, best_p = p;
  }
  if (best < kMinCombScore) return r;
  // The comb of a multiple of the period scores as well as the period's own: step down to the
  // best-scoring submultiple while it keeps kMinSubmultipleScore of the best score.
  const double top = best;
  for (bool stepped = true; stepped;) {
    stepped = false;
    double sub_p = 0.0, sub = -1.0;
    for (int m = 2; m <= kMaxSubmultiple; ++m) {
      const double centre = best_p / m;
      if (centre < std::max(min_lag, 2)) break;
      for (double p = centre * (1.0 - kSubmultipleSlack);
           p <= centre * (1.0 + kSubmultipleSlack); p += kCombStepSamples) {
        const double s = score(p);
        if (s > sub) sub = s, sub_p = p;
      }
    }
    if (sub >= kMinSubmultipleScore * top) {
      best_p = sub_p;
      best = sub;
      stepped = true;
    }
  }
  r.found = true;
  const int first = static_cast<int>(std::lround(best_p));
  r.first_peak = acf_at(acf, 1.0, best_p);
  refine_repeats(acf, spacing_mm, best_p, std::min(first, n - 1), kCombPeakShare * best, r);
  if (r.repeats == 0) r = RepeatPeriod{};
  return r;
}

}  // namespace cuspmap

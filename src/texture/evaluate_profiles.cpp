// Profile evaluation at one cut-off: primary, waviness and roughness profiles of each trace, the
// centred evaluation length, and the parameters averaged over traces.
// Inputs: traces um; output: ProfileEvaluation. Cost O(traces * n * lc / spacing).
// Method: ISO 3274:1996, ISO 16610-21:2011, ISO 4287:1997, ISO 4288:1996 §4.4 (ln = 5 lr), with
// end effects handled by dropping lc/2 at each end (the run-up/run-out of ISO 4288).
#include "texture/evaluate_profiles.h"

#include <algorithm>
#include <cmath>

#include "texture/gaussian_profile_filter.h"
#include "texture/iso4288_cutoff.h"
#include "texture/remove_least_squares_line.h"

namespace cuspmap {
namespace {

size_t samples_per_cutoff(double spacing_mm, double cutoff_mm) {
  return static_cast<size_t>(std::max(1L, std::lround(cutoff_mm / spacing_mm)));
}

// Running sums of parameters over traces, with separate counts for the optional ones.
struct Mean {
  ProfileParameters sum;
  int n = 0, shape_n = 0, sm_n = 0;
  void add(const ProfileParameters& p) {
    sum.a_um += p.a_um;
    sum.q_um += p.q_um;
    sum.p_um += p.p_um;
    sum.v_um += p.v_um;
    sum.z_um += p.z_um;
    sum.t_um += p.t_um;
    ++n;
    if (p.shape_defined) {
      sum.sk += p.sk;
      sum.ku += p.ku;
      ++shape_n;
    }
    if (p.sm_defined) {
      sum.sm_mm += p.sm_mm;
      ++sm_n;
    }
  }
  ProfileParameters mean() const {
    ProfileParameters m = sum;
    const double k = n > 0 ? 1.0 / n : 0.0;
    m.a_um *= k;
    m.q_um *= k;
    m.p_um *= k;
    m.v_um *= k;
    m.z_um *= k;
    m.t_um *= k;
    m.shape_defined = shape_n > 0;
    m.sk = shape_n > 0 ? sum.sk / shape_n : 0.0;
    m.ku = shape_n > 0 ? sum.ku / shape_n : 0.0;
    m.sm_defined = sm_n > 0;
    m.sm_mm = sm_n > 0 ? sum.sm_mm / sm_n : 0.0;
    return m;
  }
};

}  // namespace

int sampling_lengths_that_fit(size_t samples, double spacing_mm, double cutoff_mm) {
  const size_t k = samples_per_cutoff(spacing_mm, cutoff_mm);
  const long fit = static_cast<long>(samples / k) - 1;
  return static_cast<int>(std::clamp<long>(fit, 0, kDefaultSamplingLengths));
}

std::optional<ProfileEvaluation> evaluate_profiles(const std::vector<ProfileTrace>& traces,
                                                   double cutoff_mm, double lambda_s_um) {
  size_t longest = 0;
  double spacing_mm = 0.0;
  for (const ProfileTrace& t : traces) {
    if (t.z_um.size() > longest) {
      longest = t.z_um.size();
      spacing_mm = t.spacing_mm;
    }
  }
  if (longest == 0) return std::nullopt;
  const int n = sampling_lengths_that_fit(longest, spacing_mm, cutoff_mm);
  if (n < 1) return std::nullopt;
  const size_t k = samples_per_cutoff(spacing_mm, cutoff_mm);
  const size_t eval = static_cast<size_t>(n) * k;
  const double eval_mm = static_cast<double>(eval) * spacing_mm;
  Mean r, p, w;
  std::vector<double> z, rough(eval), prim(eval), wav(eval);
  for (const ProfileTrace& t : traces) {
    if (t.z_um.size() < static_cast<size_t>(n + 1) * k) continue;
    z = t.z_um;
    remove_least_squares_line(z);
    const std::vector<double> primary =
        lambda_s_um > 0.0 ? gaussian_profile_filter(z, t.spacing_mm, lambda_s_um * 1e-3) : z;
    const std::vector<double> mean_line = gaussian_profile_filter(primary, t.spacing_mm, cutoff_mm);
    const size_t i0 = (primary.size() - eval) / 2;
    for (size_t i = 0; i < eval; ++i) {
      prim[i] = primary[i0 + i];
      wav[i] = mean_line[i0 + i];
      rough[i] = prim[i] - wav[i];
    }
    remove_least_squares_line(prim);
    remove_least_squares_line(wav);
    r.add(profile_parameters(rough, t.spacing_mm, n, cutoff_mm));
    p.add(profile_parameters(prim, t.spacing_mm, 1, eval_mm));
    w.add(profile_parameters(wav, t.spacing_mm, 1, eval_mm));
  }
  ProfileEvaluation e;
  e.roughness = r.mean();
  e.primary = p.mean();
  e.waviness = w.mean();
  e.cutoff_mm = cutoff_mm;
  e.lambda_s_um = lambda_s_um;
  e.sampling_lengths = n;
  e.evaluation_length_mm = eval_mm;
  e.traces = r.n;
  return e;
}

}  // namespace cuspmap

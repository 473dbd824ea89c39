// ISO 4288 cut-off selection loop with the length check and its warnings.
// Inputs: traces; output: CutoffSelection. Cost: up to kMaxCutoffIterations evaluations.
// Method: ISO 4288:1996 §7.2 (measure with the estimated cut-off, compare with the table's
// range, change cut-off and re-measure), Tables 1 (Ra) and 3 (RSm).
#include "texture/select_cutoff.h"

#include <algorithm>
#include <set>

#include "core/input_error.h"
#include "core/units.h"
#include "texture/iso4288_cutoff.h"
#include "texture/profile_parameters.h"
#include "texture/remove_least_squares_line.h"

namespace cuspmap {
namespace {

size_t longest_samples(const std::vector<ProfileTrace>& traces, double& spacing_mm) {
  size_t longest = 0;
  for (const ProfileTrace& t : traces) {
    if (t.z_um.size() > longest) {
      longest = t.z_um.size();
      spacing_mm = t.spacing_mm;
    }
  }
  return longest;
}

// The longest standard cut-off not above `wanted` that leaves one sampling length.
double fitting_cutoff(double wanted_mm, size_t samples, double spacing_mm) {
  double best = 0.0;
  for (double c : kStandardCutoffsMm) {
    if (c <= wanted_mm * (1.0 + 1e-9) && sampling_lengths_that_fit(samples, spacing_mm, c) >= 1) {
      best = c;
    }
  }
  return best;
}

// Start estimate from the form-removed traces taken whole (ISO 4288 §7.2.1 a: "estimate").
double first_estimate(const std::vector<ProfileTrace>& traces, bool periodic, double period_mm) {
  double sum = 0.0;
  int n = 0;
  for (const ProfileTrace& t : traces) {
    if (t.z_um.size() < 3) continue;
    std::vector<double> z = t.z_um;
    remove_least_squares_line(z);
    const ProfileParameters p = profile_parameters(z, t.spacing_mm, 1, t.length_mm());
    if (periodic && !p.sm_defined) continue;
    sum += periodic ? p.sm_mm : p.a_um;
    ++n;
  }
  if (n == 0) return periodic ? period_mm : 0.0;
  return sum / n;
}

std::string rsm_text(double v) { return "RSm " + format_number(v) + " mm"; }
std::string ra_text(double v) { return "Ra " + format_number(v) + " um"; }

}  // namespace

CutoffSelection select_cutoff(const std::vector<ProfileTrace>& traces, double fixed_cutoff_mm,
                              double fixed_lambda_s_um) {
  CutoffSelection sel;
  double spacing_mm = 0.0;
  const size_t longest = longest_samples(traces, spacing_mm);
  const double longest_mm = longest > 1 ? static_cast<double>(longest - 1) * spacing_mm : 0.0;
  auto lambda_s = [&](double c) {
    return fixed_lambda_s_um >= 0.0 ? fixed_lambda_s_um : lambda_s_um_for_cutoff(c);
  };
  if (fixed_cutoff_mm > 0.0) {
    sel.rule = "fixed";
    const auto e = evaluate_profiles(traces, fixed_cutoff_mm, lambda_s(fixed_cutoff_mm));
    if (!e) {
      throw InputError("--cutoff " + format_number(fixed_cutoff_mm) + " mm: the longest profile (" +
                       format_number(longest_mm) + " mm) is shorter than two cut-offs");
    }
    sel.evaluation = *e;
    sel.measurements = 1;
    sel.periodicity = profile_periodicity(traces);
    return sel;
  }
  if (fitting_cutoff(kStandardCutoffsMm.front(), longest, spacing_mm) <= 0.0) {
    throw InputError("surface too short for a profile: longest trace " + format_number(longest_mm) +
                     " mm, the smallest cut-off 0.08 mm needs at least 0.16 mm");
  }
  sel.periodicity = profile_periodicity(traces);
  const bool periodic = sel.periodicity.periodic;
  sel.rule = periodic ? "RSm (periodic)" : "Ra (non-periodic)";
  const double estimate = first_estimate(traces, periodic, sel.periodicity.period_mm);
  CutoffRow row = periodic ? cutoff_for_rsm(estimate) : cutoff_for_ra(estimate);
  auto warn = [&](const std::string& line) {
    if (std::find(sel.warnings.begin(), sel.warnings.end(), line) == sel.warnings.end()) {
      sel.warnings.push_back(line);
    }
  };
  // The rule's cut-off, or the longest standard one the surface holds (with a warning).
  auto fitted = [&](double wanted) {
    const double fit = fitting_cutoff(wanted, longest, spacing_mm);
    if (fit < wanted) {
      warn("ISO 4288 asks for cut-off " + format_number(wanted) +
           " mm but the longest profile is " + format_number(longest_mm) + " mm; used " +
           format_number(fit) + " mm, which may filter out part of the texture");
    }
    return fit;
  };
  std::set<double> tried;
  double measured = estimate;
  double cutoff = fitted(row.cutoff_mm);
  for (;;) {
    sel.evaluation = *evaluate_profiles(traces, cutoff, lambda_s(cutoff));  // fitted: >= 1 length
    ++sel.measurements;
    tried.insert(cutoff);
    const ProfileParameters& r = sel.evaluation.roughness;
    if (periodic && !r.sm_defined) {
      warn("no complete profile element at cut-off " + format_number(cutoff) + " mm; kept it");
      break;
    }
    measured = periodic ? r.sm_mm : r.a_um;
    row = periodic ? cutoff_for_rsm(measured) : cutoff_for_ra(measured);
    const double next = fitted(row.cutoff_mm);
    if (next == cutoff) break;
    if (tried.count(next) != 0 || sel.measurements >= kMaxCutoffIterations) {
      // The measured value hops between two rows: keep the longer cut-off (more of the texture
      // counts as roughness, the cautious reading).
      const double keep = std::max(cutoff, next);
      warn("ISO 4288 cut-off choice did not settle between " +
           format_number(std::min(cutoff, next)) + " and " + format_number(keep) + " mm; used " +
           format_number(keep) + " mm");
      if (keep != cutoff) sel.evaluation = *evaluate_profiles(traces, keep, lambda_s(keep));
      break;
    }
    cutoff = next;
  }
  if (!row.in_range) {
    sel.warnings.push_back(std::string(periodic ? rsm_text(measured) : ra_text(measured)) +
                           " lies outside the ISO 4288 table; used the nearest row's cut-off " +
                           format_number(sel.evaluation.cutoff_mm) + " mm");
  }
  return sel;
}

}  // namespace cuspmap

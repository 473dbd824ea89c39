// Common cut-off and direction rule for compared floors: choose, re-evaluate, or say why not.
// Inputs: JobRuns, TextureOptions; output: ProfileBasis (reports replaced in place).
// Method: ISO 4288:1996 §7.2 per row, the longest choice shared; ISO 4287:1997 re-evaluation.
#include "job/common_profile_basis.h"

#include <algorithm>
#include <cassert>

#include "core/input_error.h"
#include "core/units.h"
#include "texture/extract_profiles.h"

namespace cuspmap {
namespace {

// Re-evaluates one in-memory run's profile at `cutoff_mm` along its own trace direction.
// Returns false (run untouched) when its traces are too short for that cut-off.
bool reevaluate(JobRun& run, const TextureOptions& options, double cutoff_mm) {
  const ProfileReport& old = run.texture.profile;
  const std::vector<ProfileTrace> traces =
      extract_profiles(run.floor, old.direction_deg, options.max_traces, 2.0 * cutoff_mm);
  if (traces.empty()) return false;
  TextureOptions fixed = options;
  fixed.cutoff_mm = cutoff_mm;
  ProfileReport p;
  p.direction = old.direction;
  p.direction_deg = old.direction_deg;
  p.lay_deg = old.lay_deg;
  p.lay_source = old.lay_source;
  std::vector<std::string> warnings;
  try {
    fill_profile_report(traces, fixed, p, warnings);
  } catch (const InputError&) {
    return false;  // the fixed cut-off does not fit a sampling length: keep the row's own
  }
  const std::string own = format_number(old.cutoff_mm);
  p.cutoff_rule = "common (own ISO 4288 choice " + own + " mm)";
  // Notes about the row's own cut-off no longer apply; the re-evaluation's own notes do.
  std::erase_if(run.texture.warnings, [&](const std::string& w) {
    return w.find("cut-off") != std::string::npos || w.find("sampling length") != std::string::npos;
  });
  run.texture.warnings.insert(run.texture.warnings.end(), warnings.begin(), warnings.end());
  run.texture.profile = p;
  return true;
}

}  // namespace

ProfileBasis common_profile_basis(const std::vector<JobRun*>& runs, const TextureOptions& options,
                                  const std::vector<std::string>& names) {
  assert(!runs.empty() && names.size() == runs.size() && "one name per run");
  ProfileBasis basis;
  if (options.cutoff_mm > 0.0) {
    basis.cutoff_mm = options.cutoff_mm;
    basis.cutoff_rule = "fixed by --cutoff";
  } else {
    size_t roughest = 0;
    for (size_t k = 1; k < runs.size(); ++k) {
      if (runs[k]->texture.profile.cutoff_mm > runs[roughest]->texture.profile.cutoff_mm) {
        roughest = k;
      }
    }
    basis.cutoff_mm = runs[roughest]->texture.profile.cutoff_mm;
    basis.cutoff_rule = "ISO 4288 choice for the coarsest texture (" + names[roughest] + ", " +
                        runs[roughest]->texture.profile.cutoff_rule + ")";
    for (size_t k = 0; k < runs.size(); ++k) {
      JobRun& run = *runs[k];
      const double own = run.texture.profile.cutoff_mm;
      if (own == basis.cutoff_mm) continue;
      if (!run.streamed && reevaluate(run, options, basis.cutoff_mm)) {
        basis.notes.push_back(names[k] + ": profile re-evaluated at the common cut-off " +
                              format_number(basis.cutoff_mm) + " mm (its own ISO 4288 choice " +
                              format_number(own) + " mm)");
        continue;
      }
      basis.common_cutoff = false;
      basis.reasons.push_back(
          names[k] + " keeps cut-off " + format_number(own) + " mm, not the common " +
          format_number(basis.cutoff_mm) + " mm: " +
          (run.streamed ? "its floor was streamed and is not held for a re-evaluation"
                        : "its traces are shorter than two common cut-offs"));
    }
  }
  if (options.direction != ProfileDirection::Angle) {
    std::vector<std::string> fell_back;
    for (size_t k = 0; k < runs.size(); ++k) {
      if (runs[k]->texture.profile.lay_source == "none") fell_back.push_back(names[k]);
    }
    if (!fell_back.empty() && fell_back.size() < runs.size()) {
      basis.common_direction = false;
      std::string list;
      for (const std::string& n : fell_back) list += (list.empty() ? "" : ", ") + n;
      basis.reasons.push_back(list + " had no dominant lay and " +
                              (fell_back.size() == 1 ? "was" : "were") +
                              " traced along X, the others " + runs[0]->texture.profile.direction +
                              " their lay: give --direction as an angle to trace all alike");
    }
  }
  return basis;
}

}  // namespace cuspmap

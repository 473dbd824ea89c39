// Layered scratch model of a hand-sanding sequence: thickness per grade, volume and time over an
// area, final level below the machined valleys and final Ra. Heights um, areas mm^2, times s.
// Method: docs/finishing.md "Grit sequence" (each grade erases the scratches of the one before,
// scaled on FEPA P-grade mean particle sizes); time = volume / removal rate.
#include "finish/grit_sequence.h"

#include <cassert>

#include "core/units.h"

namespace cuspmap {
namespace {

constexpr double kSecondsPerMinute = 60.0;

}  // namespace

GritSequence grit_sequence(const SurfaceHeights& marks, const GritTable& table,
                           const std::vector<std::string>& sequence, double area_mm2) {
  assert(!sequence.empty() && "the caller validates a non-empty sequence");
  assert(area_mm2 >= 0.0 && "area must be >= 0");
  std::vector<const Grit*> grades;
  for (const std::string& name : sequence) {
    const Grit* grit = find_grit(table, name);
    assert(grit != nullptr && "the caller validates grade names against the table");
    grades.push_back(grit);
  }
  GritSequence result;
  const Grit& last = *grades.back();
  if (marks.ra_um <= last.ra_um) {
    // Every grade ends at its own Ra: a machined surface already this fine gains nothing.
    result.needed = false;
    result.final_ra_um = marks.ra_um;
    result.final_scratch_um = marks.sz_um;
    result.verdict = "no sanding needed: the machined Ra " + format_number(marks.ra_um) +
                     " um is already at or below the Ra " + last.name + " leaves (" +
                     format_number(last.ra_um) + " um)";
    for (const Grit& g : table.grits) {  // coarse to fine: the first that beats the machined Ra
      if (g.ra_um < marks.ra_um) {
        result.finer_grit = g.name;
        break;
      }
    }
    return result;
  }
  result.verdict = "sanding " + last.name + " leaves Ra " + format_number(last.ra_um) +
                   " um, finer than the machined " + format_number(marks.ra_um) + " um";
  // Start with the coarsest grade whose scratches are no deeper than the marks it erases.
  std::size_t first = grades.size() - 1;
  for (std::size_t k = 0; k < grades.size(); ++k) {
    if (grades[k]->scratch_um <= marks.sz_um) {
      first = k;
      break;
    }
  }
  for (std::size_t k = 0; k < first; ++k) result.skipped.push_back(grades[k]->name);

  double previous_scratch_um = 0.0;
  for (std::size_t k = first; k < grades.size(); ++k) {
    const Grit& grit = *grades[k];
    GritStep step;
    step.grit = grit.name;
    step.particle_um = grit.particle_um;
    step.scratch_um = grit.scratch_um;
    step.removal_mm3_per_min = grit.removal_mm3_per_min;
    // First grade: from the machined mean (Sv above the valleys) to the mean of its own scratches
    // (c/2 below the valleys). Later grades: from the previous scratch mean to their own.
    const double from_above_um = k == first ? marks.sv_um : 0.5 * previous_scratch_um;
    step.remove_um = from_above_um + 0.5 * grit.scratch_um;
    step.volume_mm3 = step.remove_um / kUmPerMm * area_mm2;
    step.time_s = step.volume_mm3 / grit.removal_mm3_per_min * kSecondsPerMinute;
    step.ra_after_um = grit.ra_um;
    result.deepest_below_valleys_um += grit.scratch_um;
    result.total_remove_um += step.remove_um;
    result.total_volume_mm3 += step.volume_mm3;
    result.total_time_s += step.time_s;
    previous_scratch_um = grit.scratch_um;
    result.steps.push_back(step);
  }
  result.final_scratch_um = last.scratch_um;
  result.final_ra_um = last.ra_um;
  result.mean_below_valleys_um = result.deepest_below_valleys_um - 0.5 * last.scratch_um;
  return result;
}

}  // namespace cuspmap

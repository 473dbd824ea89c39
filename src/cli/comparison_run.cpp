// Orchestration shared by `compare` and `demo`: run jobs, share a height scale, write outputs.
#include "cli/comparison_run.h"

#include <algorithm>
#include <limits>

#include "cli/command.h"
#include "cli/progress_bar.h"
#include "core/write_file_atomic.h"
#include "io/png.h"
#include "job/common_profile_basis.h"

namespace cuspmap {

Comparison run_comparison(const std::vector<Job>& jobs, RunOptions options,
                          std::optional<HeightRange> range, LengthUnit units, bool verbose) {
  Comparison comparison;
  std::vector<CompareRow>& rows = comparison.rows;
  {
    ProgressBar bar("simulate");
    for (size_t k = 0; k < jobs.size(); ++k) {
      options.progress = [&bar, k, n = jobs.size()](double f) { bar.update((k + f) / n); };
      options.before_sweep =
          forecast_printer(verbose, "job " + std::to_string(k + 1) + " of " +
                                        std::to_string(jobs.size()) + ": ");
      rows.push_back({jobs[k], run_job(jobs[k], options), {}});
      print_stage(verbose, "sweep", rows.back().run.sweep_s);
      print_stage(verbose, "texture", rows.back().run.texture_s);
    }
  }
  std::vector<JobRun*> runs;
  std::vector<std::string> names;
  for (size_t k = 0; k < rows.size(); ++k) {
    runs.push_back(&rows[k].run);
    names.push_back("row " + std::to_string(k + 1));
  }
  comparison.basis = common_profile_basis(runs, options.texture, names);
  if (!range) {
    HeightRange shared{std::numeric_limits<double>::infinity(),
                       -std::numeric_limits<double>::infinity()};
    for (const CompareRow& r : rows) {
      shared.lo_um = std::min(shared.lo_um, r.run.lowest_point_um);
      shared.hi_um = std::max(shared.hi_um, r.run.highest_point_um);
    }
    if (shared.hi_um > shared.lo_um) range = shared;
  }
  // Every floor on the shared scale (to compare heights) and on its own range (so a shallow
  // floor's marks show beside a deep one's).
  for (CompareRow& row : rows) {
    row.pictures = render_simulation_pictures(row.run, units, range, 0, /*own_range_too=*/true);
  }
  return comparison;
}

nlohmann::json write_comparison(OutputDir& dir, const Comparison& comparison,
                                LengthUnit units, const std::string& html_path,
                                const std::vector<std::string>& html_notes) {
  const std::vector<CompareRow>& rows = comparison.rows;
  for (size_t k = 0; k < rows.size(); ++k) {
    const std::string stem = std::to_string(k + 1) + "_" + safe_file_stem(rows[k].job.name);
    dir.write(stem + "_height.png", rows[k].pictures.height_png);
    if (!rows[k].pictures.height_own_png.empty()) {
      dir.write(stem + "_height_own.png", rows[k].pictures.height_own_png);
    }
    dir.write(stem + "_shaded.png", rows[k].pictures.shaded_png);
    if (rows[k].pictures.has_detail) {
      dir.write(stem + "_detail.png", rows[k].pictures.detail_png);
      dir.write(stem + "_detail_shaded.png", rows[k].pictures.detail_shaded_png);
    }
    if (!rows[k].pictures.profile_png.empty()) {
      dir.write(stem + "_profile.png", rows[k].pictures.profile_png);
    }
  }
  const std::string montage = encode_png(compare_montage(rows, units));
  dir.write("montage.png", montage);
  const nlohmann::json doc = compare_json(rows, comparison.basis);
  dir.write("compare.csv", compare_csv(rows));
  dir.write("compare.json", doc.dump(2) + "\n");
  if (!html_path.empty()) {
    HtmlReport page = compare_html_report(rows, comparison.basis, montage, units);
    page.notes.insert(page.notes.end(), html_notes.begin(), html_notes.end());
    write_file_atomic(html_path, render_html_report(page));
  }
  return doc;
}

}  // namespace cuspmap

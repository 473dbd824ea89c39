// Orchestration shared by `compare` and `demo`: run jobs, share a height scale, write outputs.
#include "cli/comparison_run.h"

#include <algorithm>
#include <limits>

#include "cli/command.h"
#include "cli/progress_bar.h"
#include "core/write_file_atomic.h"
#include "io/png.h"

namespace cuspmap {

std::vector<CompareRow> run_comparison(const std::vector<Job>& jobs, RunOptions options,
                                       std::optional<HeightRange> range, LengthUnit units,
                                       bool verbose) {
  std::vector<CompareRow> rows;
  {
    ProgressBar bar("simulate");
    for (size_t k = 0; k < jobs.size(); ++k) {
      options.progress = [&bar, k, n = jobs.size()](double f) { bar.update((k + f) / n); };
      rows.push_back({jobs[k], run_job(jobs[k], options), {}});
      print_stage(verbose, "sweep", rows.back().run.sweep_s);
      print_stage(verbose, "texture", rows.back().run.texture_s);
    }
  }
  if (!range) {
    HeightRange shared{std::numeric_limits<double>::infinity(),
                       -std::numeric_limits<double>::infinity()};
    for (const CompareRow& r : rows) {
      shared.lo_um = std::min(shared.lo_um, r.run.lowest_point_um);
      shared.hi_um = std::max(shared.hi_um, r.run.highest_point_um);
    }
    if (shared.hi_um > shared.lo_um) range = shared;
  }
  for (CompareRow& row : rows) row.pictures = render_simulation_pictures(row.run, units, range);
  return rows;
}

nlohmann::json write_comparison(OutputDir& dir, const std::vector<CompareRow>& rows,
                                LengthUnit units, const std::string& html_path,
                                const std::vector<std::string>& html_notes) {
  for (size_t k = 0; k < rows.size(); ++k) {
    const std::string stem = std::to_string(k + 1) + "_" + safe_file_stem(rows[k].job.name);
    dir.write(stem + "_height.png", rows[k].pictures.height_png);
    dir.write(stem + "_shaded.png", rows[k].pictures.shaded_png);
    if (!rows[k].pictures.profile_png.empty()) {
      dir.write(stem + "_profile.png", rows[k].pictures.profile_png);
    }
  }
  const std::string montage = encode_png(compare_montage(rows, units));
  dir.write("montage.png", montage);
  const nlohmann::json doc = compare_json(rows);
  dir.write("compare.csv", compare_csv(rows));
  dir.write("compare.json", doc.dump(2) + "\n");
  if (!html_path.empty()) {
    HtmlReport page = compare_html_report(rows, montage, units);
    page.notes.insert(page.notes.end(), html_notes.begin(), html_notes.end());
    write_file_atomic(html_path, render_html_report(page));
  }
  return doc;
}

}  // namespace cuspmap

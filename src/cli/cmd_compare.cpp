// `cuspmap compare JOB.toml ... --out DIR`: simulates each job (on the first job's patch and cell
// unless --own-patch), then writes montage.png, compare.json, compare.csv, each job's pictures
// and an optional HTML page; prints the table with the best value per column marked.
// cli/ holds no computation: flags -> job/ (vary_job, run_job) -> io/compare_report -> OutputDir.
#include <cstdio>
#include <memory>
#include <string>

#include "cli/command.h"
#include "cli/shop_flag.h"
#include "report/html_report.h"
#include "cli/comparison_run.h"
#include "cli/output_dir.h"
#include "cli/sim_flags.h"
#include "cli/texture_flags.h"
#include "core/input_error.h"
#include "report/compare_report.h"
#include "job/vary_job.h"

namespace cuspmap {
namespace {

struct CompareOptions {
  CommonOptions common;
  ShopFlag shop;  ///< --shop profile
  SimFlags sim;
  TextureFlags texture;
  std::vector<std::string> jobs;
  std::string out;
  std::string report_html;
  bool own_patch = false;
  std::vector<std::pair<std::string, std::string>> variations;  // (parameter, "a,b,c")
};

std::vector<std::string> split_list(const std::string& text) {
  std::vector<std::string> out;
  size_t start = 0;
  while (start <= text.size()) {
    const size_t comma = text.find(',', start);
    const size_t end = comma == std::string::npos ? text.size() : comma;
    out.push_back(text.substr(start, end - start));
    if (comma == std::string::npos) break;
    start = comma + 1;
  }
  return out;
}

std::vector<Job> expand_jobs(const CompareOptions& o, LengthUnit unit) {
  std::vector<Job> jobs;
  for (const std::string& file : o.jobs) jobs.push_back(load_job(file));
  size_t varied = 0;
  for (const auto& [parameter, list] : o.variations) {
    if (list.empty()) continue;
    if (++varied > 1) throw InputError("--" + parameter + ": vary one parameter at a time");
    if (jobs.size() != 1) {
      throw InputError("--" + parameter + " varies one job: give exactly one job file with it");
    }
    jobs = vary_job(jobs.front(), parameter, split_list(list), unit);
  }
  if (jobs.size() < 2) {
    throw InputError("compare needs at least two jobs, or one job and a list such as "
                     "--stepover 0.2,0.3,0.5");
  }
  constexpr size_t kMaxJobs = 16;  // a montage of more is unreadable; split the comparison
  if (jobs.size() > kMaxJobs) {
    throw InputError(std::to_string(jobs.size()) + " jobs to compare: at most 16 at once");
  }
  if (!o.own_patch) {
    for (Job& j : jobs) {
      if (j.patch_from_program || jobs.front().patch_from_program) continue;
      j.patch = jobs.front().patch;
    }
  }
  return jobs;
}

void run_compare(const CompareOptions& o) {
  const LengthUnit units = o.common.length_unit();
  ShopFlag shop = o.shop;
  shop.load();
  const std::vector<Job> jobs = expand_jobs(o, units);
  RunOptions ropt;
  ropt.threads = o.sim.threads;
  if (!o.sim.max_memory.empty()) ropt.max_memory_bytes = parse_bytes(o.sim.max_memory, "--max-memory");
  ropt.texture = texture_options(o.texture, units);
  const std::optional<HeightRange> range = parse_height_range(o.sim.range, units);
  OutputDir dir(o.out);
  const Comparison comparison = run_comparison(jobs, ropt, range, units, o.common.verbose);
  nlohmann::json doc = write_comparison(dir, comparison, units, o.report_html);
  if (shop.active()) {
    // Beside each row's kinematic Ra, never in its place (the stars stay kinematic).
    for (size_t k = 0; k < comparison.rows.size(); ++k) {
      doc["rows"][k]["shop"] =
          shop_ra_json(shop, comparison.rows[k].run.texture.profile.roughness.a_um);
    }
  }
  if (o.common.json) {
    print_json(doc);
    return;
  }
  std::fputs(compare_table_text(comparison.rows, comparison.basis, units).c_str(), stdout);
  if (shop.active()) {
    for (size_t k = 0; k < comparison.rows.size(); ++k) {
      std::printf("%zu: %s\n", k + 1,
                  shop_ra_text(shop, comparison.rows[k].run.texture.profile.roughness.a_um, units)
                      .c_str());
    }
  }
  std::printf("wrote %zu files to %s/\n", dir.written().size(), dir.path().c_str());
  std::printf("Before cutting: prove the chosen program on the machine as its maker instructs "
              "(guards, workholding, rotating tools); follow local codes and licensed practice.\n");
}

}  // namespace

void setup_compare(CLI::App& sub) {
  auto o = std::make_shared<CompareOptions>();
  sub.add_option("jobs", o->jobs, "Job files (TOML) to compare");
  sub.add_option("--out", o->out, "Output folder (created if missing; other files are left alone)")
      ->required();
  sub.add_option("--report", o->report_html, "Also write a self-contained HTML page here");
  // Reason for the flag: jobs of different sizes can still be compared, each on its own floor.
  sub.add_flag("--own-patch", o->own_patch, "Keep each job's own patch (default: the first job's)");
  o->variations = {{"stepover", ""}, {"angle", ""}, {"raster-direction", ""}, {"tilt", ""}, {"dish", ""}};
  const char* helps[] = {"Vary the stepover over a list, e.g. 0.2,0.3,0.5",
                         "Vary the raster angle (deg) over a list", "Vary one-way,zigzag",
                         "Vary the axis tilt (deg) over a list", "Vary the dish angle (deg) over a list"};
  for (size_t k = 0; k < o->variations.size(); ++k) {
    sub.add_option("--" + o->variations[k].first, o->variations[k].second, helps[k]);
  }
  add_sim_flags(sub, o->sim);
  add_texture_flags(sub, o->texture);
  add_common_flags(sub, o->common);
  add_shop_flag(sub, o->shop);
  sub.footer(cautions_help_text(standard_cautions()));
  sub.callback([o] { run_compare(*o); });
}

}  // namespace cuspmap

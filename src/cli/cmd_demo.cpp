// `cuspmap demo [--out DIR]`: the built-in invented scenario (an aluminium pump-cover floor
// finished four ways) simulated end to end: pictures, comparison sheet, HTML page, and a summary
// of which option to choose for the demo's target Ra and why. No input files needed.
#include <cstdio>
#include <memory>
#include <string>

#include "cli/command.h"
#include "cli/comparison_run.h"
#include "core/stage_timer.h"
#include "finish/choose_strategy.h"
#include "core/display_quantity.h"
#include "report/html_report.h"
#include "job/demo_jobs.h"

namespace cuspmap {
namespace {

struct DemoOptions {
  CommonOptions common;
  std::string out = "demo";
  bool quick = false;
  int threads = 0;
};

void run_demo(const DemoOptions& o) {
  StageTimer total;
  const LengthUnit units = o.common.length_unit();
  const std::vector<DemoJob> demo = demo_jobs(o.quick);
  std::vector<Job> jobs;
  OutputDir dir(o.out);
  for (const DemoJob& d : demo) {
    jobs.push_back(d.job);
    dir.write("job_" + d.file_name, d.toml);  // the jobs as files, to edit and rerun
  }
  RunOptions ropt;
  ropt.threads = o.threads;
  const Comparison comparison =
      run_comparison(jobs, ropt, std::nullopt, units, o.common.verbose);
  const std::vector<CompareRow>& rows = comparison.rows;
  std::vector<StrategyScore> scores;
  for (const CompareRow& r : rows) {
    scores.push_back({r.job.name, r.run.texture.profile.roughness.a_um,
                      r.run.texture.areal.parameters.sz_um, r.run.cycle_time_s});
  }
  const StrategyChoice choice = choose_strategy(scores, kDemoTargetRaUm);
  const std::string summary = "Target Ra " + display_roughness(kDemoTargetRaUm, units) +
                              " (invented print callout). Choice: " + choice.reason;
  nlohmann::json doc = write_comparison(dir, comparison, units, dir.path_of("report.html"), {summary});
  doc["target_Ra_um"] = kDemoTargetRaUm;
  doc["choice_index"] = choice.best ? nlohmann::json(*choice.best) : nlohmann::json(nullptr);
  doc["meets_target"] = choice.meets;
  doc["summary"] = summary;
  doc["cautions"] = standard_cautions();
  doc["elapsed_s"] = total.seconds();
  dir.write("demo.json", doc.dump(2) + "\n");
  if (o.common.json) {
    print_json(doc);
    return;
  }
  std::printf("cuspmap demo: the floor of an aluminium pump cover (invented), finished four ways\n\n");
  std::fputs(compare_table_text(rows, comparison.basis, units).c_str(), stdout);
  std::printf("\n%s\n", summary.c_str());
  for (size_t k = 0; k < rows.size(); ++k) {
    std::printf("  %zu. %-44s %s\n", k + 1, rows[k].job.name.c_str(),
                choice.meets[k] ? "meets the target" : "misses the target");
  }
  std::printf("\nPictures, comparison sheet (montage.png, compare.csv) and report.html are in %s/ "
              "(%s).\n", dir.path().c_str(), display_time(total.seconds()).c_str());
  std::printf("%s\n", kShortCaution);
}

}  // namespace

void setup_demo(CLI::App& sub) {
  auto o = std::make_shared<DemoOptions>();
  sub.add_option("--out", o->out, "Output folder (created if missing; other files are left alone)")
      ->capture_default_str();
  // Reason for the flag: the test suite runs the demo end to end in a few seconds.
  sub.add_flag("--quick", o->quick, "Smaller patches and coarser cells (same physics, less time)");
  sub.add_option("--threads", o->threads, "Sweep threads (0 = all cores)")
      ->capture_default_str()
      ->check(CLI::Range(0, 1024));
  add_common_flags(sub, o->common);
  sub.footer(cautions_help_text(standard_cautions()));
  sub.callback([o] { run_demo(*o); });
}

}  // namespace cuspmap

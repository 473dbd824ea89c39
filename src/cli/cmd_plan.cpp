// `cuspmap plan`: sweep the stepover (and optionally the tool) of a finishing raster over a floor,
// price machine time against bench (sanding) time at the user's hourly rates, mark the cheapest
// option that meets the spec; table or --json on stdout, plan.json/plan.csv/plan.svg with --out.
#include <algorithm>
#include <cstdio>
#include <limits>
#include <memory>
#include <optional>
#include <string>
#include <utility>
#include <vector>

#include "cli/command.h"
#include "cli/plan_flags.h"
#include "cli/finish_flags.h"
#include "cli/output_dir.h"
#include "core/input_error.h"
#include "core/stage_timer.h"
#include "cusp/kinematic_limits.h"
#include "finish/finishing_cautions.h"
#include "finish/plan_range_edge.h"
#include "finish/plan_stepover.h"
#include "finish/simulated_cusp_heights.h"
#include "finish/wide_ridges.h"
#include "report/html_report.h"
#include "io/plan_csv.h"
#include "core/display_quantity.h"
#include "report/plan_svg.h"
#include "job/job.h"
#include "job/validate_cutter.h"

namespace cuspmap {
namespace {

// A plan leads to both the machine and the bench: the report cautions (rotating tools,
// workholding, combustible dust, codes) plus the sanding dust line.
std::vector<std::string> plan_cautions() {
  std::vector<std::string> cautions = standard_cautions();
  cautions.emplace_back(kSandingDustCaution);
  return cautions;
}

constexpr const char* kClosedFormBasis =
    "closed-form cusp profile (a flat end mill's cusp comes from its tilt, taken along the feed; "
    "none without tilt)";
constexpr const char* kSimulatedBasis =
    "simulated window per option (revolving envelope, whole periods, plane removed, ISO 25178-2 "
    "Sz/Sv/Sp/Sa; Ra taken as Sa)";
constexpr const char* kJobBasis =
    "simulated window per option, swept as `simulate` sweeps the job (tooth by tooth when it asks "
    "for tooth marks, at its rpm and feed; whole periods, plane removed, ISO 25178-2 "
    "Sz/Sv/Sp/Sa; Ra taken as Sa)";

// Where each option's surface comes from.
const char* surface_basis(const PlanRequest& r, const PlanOptions& o) {
  if (!o.job.empty()) return kJobBasis;
  return r.simulate ? kSimulatedBasis : kClosedFormBasis;
}

nlohmann::json option_json(const PlanOption& p) {
  nlohmann::json j = {
      {"tool", p.tool},
      {"diameter_mm", p.cutter.diameter_mm},
      {"stepover_mm", p.stepover_mm},
      {"passes", p.machine.passes},
      {"path_length_mm", p.machine.path_length_mm},
      {"cycle_time_s", p.machine.cycle_time_s},
      {"overhead_s", p.machine.overhead_s},
      {"machine_time_s", p.machine.machine_time_s},
      {"cusp_um", p.surface.sz_um},
      {"Sv_um", p.surface.sv_um},
      {"Ra_um", p.surface.ra_um},
      {"simulated", p.simulated},
      {"sanded", p.sanded},
      {"bench_time_s", p.bench_time_s},
      {"removed_volume_mm3", p.removed_volume_mm3},
      {"final_Ra_um", p.final_ra_um},
      {"final_peak_to_valley_um", p.final_peak_to_valley_um},
      {"machine_cost", p.machine_cost},
      {"bench_cost", p.bench_cost},
      {"cost", p.cost},
      {"meets_spec", p.meets_spec},
      {"reason", p.reason},
  };
  j["grits"] = p.sanded ? grits_json(p.allowance->grits) : nlohmann::json::array();
  j["caution"] = fine_ra_caution(p.surface.ra_um);
  return j;
}

// A cost in the currency of the rates: 3 figures, below a hundredth of a unit reads 0.
std::string money(double cost) { return display_number(cost, 0.005); }

std::string best_message(const PlanResult& plan, LengthUnit u) {
  if (!plan.best) {
    return "no option meets the spec: loosen the target or tolerance, add finer grades, or try "
           "other tools and stepovers";
  }
  const PlanOption& b = plan.options[*plan.best];
  return "best: " + b.tool + " at " + display_length(b.stepover_mm, u) + " (row " +
         std::to_string(*plan.best + 1) + "), cost " + money(b.cost) + " (machine " +
         money(b.machine_cost) + " + bench " + money(b.bench_cost) + "); " + b.reason +
         "; machined cusp " + display_roughness(b.surface.sz_um, u);
}

// What the table alone does not say about the best option: it lies at an end of the stepovers
// tried (notes), or meets an Ra target with ridges Ra does not see (cautions).
struct PlanRemarks {
  std::vector<std::string> notes, cautions;
  std::optional<RangeEdge> edge;
};

PlanRemarks plan_remarks(const PlanResult& plan, LengthUnit u) {
  PlanRemarks m;
  if (!plan.best) return m;
  const PlanOption& b = plan.options[*plan.best];
  m.edge = plan_range_edge(plan);
  if (m.edge) {
    std::string next;
    for (const double s : m.edge->next_stepovers_mm) {
      next += (next.empty() ? "" : ",") +
              format_number(u == LengthUnit::Inch ? s / kMmPerInch : s) +
              (u == LengthUnit::Inch ? "in" : "mm");
    }
    std::string line = "the cheapest option is the " +
                       std::string(m.edge->at_smallest ? "smallest" : "largest") +
                       " stepover tried for " + b.tool + " (" + display_length(b.stepover_mm, u) +
                       "): the optimum may lie outside the range";
    line += next.empty() ? " only if passes could be wider than the diameter, which leave uncut "
                           "strips"
                         : "; try --stepovers " + next;
    m.notes.push_back(line);
  }
  if (b.surface.sz_um > 0.0 &&
      ridges_hidden_by_ra(b.stepover_mm, b.surface.sz_um, b.surface.ra_um)) {
    m.cautions.push_back(
        wide_ridges_caution(display_roughness(b.surface.sz_um, u), display_length(b.stepover_mm, u)));
  }
  return m;
}

nlohmann::json plan_document(const PlanRequest& r, const PlanResult& plan, LengthUnit u,
                             const char* basis) {
  nlohmann::json options = nlohmann::json::array();
  for (const PlanOption& p : plan.options) options.push_back(option_json(p));
  nlohmann::json spec = {
      {"sanding", r.spec.sanding == SandingMode::Always ? "always" : "when-needed"},
      {"grits", r.spec.grits}};
  spec["target_Ra_um"] =
      r.spec.target_ra_um ? nlohmann::json(*r.spec.target_ra_um) : nlohmann::json();
  spec["target_cusp_um"] =
      r.spec.target_scallop_um ? nlohmann::json(*r.spec.target_scallop_um) : nlohmann::json();
  spec["tolerance_um"] =
      r.spec.tolerance_um ? nlohmann::json(*r.spec.tolerance_um) : nlohmann::json();
  const PlanRemarks remarks = plan_remarks(plan, u);
  std::vector<std::string> cautions = remarks.cautions;
  for (const std::string& c : plan_cautions()) cautions.push_back(c);
  nlohmann::json doc = {
      {"options", options},
      {"message", best_message(plan, u)},
      {"size_mm", {r.patch.size_x_mm, r.patch.size_y_mm}},
      {"area_mm2", r.patch.size_x_mm * r.patch.size_y_mm},
      {"feed_mm_per_min", r.cut.feed_mm_per_min},
      {"rapid_mm_per_min", r.cut.rapid_mm_per_min},
      {"pass_direction", r.direction == RasterDirection::OneWay ? "one-way" : "zigzag"},
      {"pass_overhead_s", r.pass_overhead_s},
      {"machine_rate_per_hour", r.spec.machine_rate_per_hour},
      {"bench_rate_per_hour", r.spec.bench_rate_per_hour},
      {"spec", spec},
      {"basis",
       {{"machine",
         "raster path built over the floor: moves at their feed, rapids at the "
         "rapid rate, plus the per-pass overhead"},
        {"surface", basis},
        {"bench", "sanding time of the grit sequence (docs/finishing.md)"},
        {"grit_table", r.spec.grit_table.source}}},
      {"cautions", cautions},
  };
  // 0-based index into options[] (the table's row number minus 1); null when none meets the spec.
  doc["best_index"] = plan.best ? nlohmann::json(*plan.best) : nlohmann::json();
  doc["notes"] = remarks.notes;
  doc["range_edge"] = nlohmann::json();
  if (remarks.edge) {
    doc["range_edge"] = {{"at", remarks.edge->at_smallest ? "smallest" : "largest"},
                         {"next_stepovers_mm", remarks.edge->next_stepovers_mm}};
  }
  return doc;
}

void print_table(const PlanRequest& r, const PlanResult& plan, LengthUnit u, const char* basis) {
  std::printf(
      "Stepover plan: %s x %s floor, %s raster, feed %s/min; rates per hour: machine %s, "
      "bench %s\n",
      display_length_number(r.patch.size_x_mm, u).c_str(),
      display_length(r.patch.size_y_mm, u).c_str(),
      r.direction == RasterDirection::OneWay ? "one-way" : "zigzag",
      display_length(r.cut.feed_mm_per_min, u).c_str(), money(r.spec.machine_rate_per_hour).c_str(),
      money(r.spec.bench_rate_per_hour).c_str());
  std::string spec;
  if (r.spec.target_ra_um) spec += "Ra <= " + display_roughness(*r.spec.target_ra_um, u);
  if (r.spec.target_scallop_um) {
    spec += (spec.empty() ? "" : ", ") + std::string("peak-to-valley <= ") +
            display_roughness(*r.spec.target_scallop_um, u);
  }
  if (r.spec.tolerance_um)
    spec += (spec.empty() ? "" : ", ") + std::string("tolerance +-") +
            display_stock(*r.spec.tolerance_um, u);
  std::string grits;
  for (const std::string& g : r.spec.grits) grits += (grits.empty() ? "" : " > ") + g;
  std::printf("Spec: %s; sanding %s with %s\n\n", spec.empty() ? "none" : spec.c_str(),
              r.spec.sanding == SandingMode::Always ? "always" : "when needed", grits.c_str());
  int tool_w = 4;
  std::vector<double> machine_s, bench_s;
  for (const PlanOption& p : plan.options) {
    tool_w = std::max(tool_w, static_cast<int>(p.tool.size()));
    machine_s.push_back(p.machine.machine_time_s);
    if (p.sanded) bench_s.push_back(p.bench_time_s);
  }
  // One time unit per column, named in the header.
  const TimeUnit machine_unit = time_unit_for(machine_s), bench_unit = time_unit_for(bench_s);
  const std::string rough = roughness_symbol(u);
  const auto head = [](const std::string& name, const std::string& unit) {
    return name + " " + unit;
  };
  std::printf("  %3s %-*s %10s %7s %11s %10s %10s %13s %11s %12s %8s  %s\n", "row", tool_w, "tool",
              head("stepover", length_symbol(u)).c_str(), "passes",
              head("machine", time_unit_symbol(machine_unit)).c_str(),
              head("cusp", rough).c_str(), head("Ra", rough).c_str(), "sanding",
              head("bench", time_unit_symbol(bench_unit)).c_str(),
              head("final Ra", rough).c_str(), "cost", "spec");
  std::vector<std::string> misses;
  for (std::size_t k = 0; k < plan.options.size(); ++k) {
    const PlanOption& p = plan.options[k];
    const bool best = plan.best && *plan.best == k;
    std::string sanding = "-";
    if (!p.sanded && p.allowance && !p.allowance->grits.needed) sanding = "not needed";
    if (p.sanded) {
      const auto& steps = p.allowance->grits.steps;
      sanding = steps.front().grit + (steps.size() > 1 ? "-" + steps.back().grit : "");
    }
    std::printf("%s %3zu %-*s %10s %7d %11s %10s %10s %13s %11s %12s %8s  %s\n", best ? "*" : " ",
                k + 1, tool_w, p.tool.c_str(), display_length_number(p.stepover_mm, u).c_str(),
                p.machine.passes, display_time_number(p.machine.machine_time_s, machine_unit).c_str(),
                display_roughness_number(p.surface.sz_um, u).c_str(),
                display_roughness_number(p.surface.ra_um, u).c_str(), sanding.c_str(),
                p.sanded ? display_time_number(p.bench_time_s, bench_unit).c_str() : "-",
                display_roughness_number(p.final_ra_um, u).c_str(), money(p.cost).c_str(),
                p.meets_spec ? (best ? "ok  <- cheapest" : "ok") : "misses");
    if (!p.meets_spec &&
        (k == 0 || plan.options[k - 1].meets_spec || plan.options[k - 1].tool != p.tool)) {
      misses.push_back(p.tool + " from " + display_length(p.stepover_mm, u) + ": " + p.reason);
    }
  }
  for (const std::string& m : misses) std::printf("  misses: %s\n", m.c_str());
  double finest_ra_um = std::numeric_limits<double>::infinity();
  for (const PlanOption& p : plan.options) finest_ra_um = std::min(finest_ra_um, p.surface.ra_um);
  if (!fine_ra_caution(finest_ra_um).empty()) {
    std::printf("  caution: options with a machined Ra below %s predict a finish finer than "
                "milling usually measures: expect the real surface to be rougher\n",
                display_roughness(kFineRaCautionUm, u).c_str());
  }
  std::printf("\n%s\n", best_message(plan, u).c_str());
  const PlanRemarks remarks = plan_remarks(plan, u);
  for (const std::string& n : remarks.notes) std::printf("note: %s\n", n.c_str());
  std::printf("Costs are in the currency of the rates. Surfaces: %s.\n", basis);
  for (const std::string& c : remarks.cautions) std::printf("caution: %s\n", c.c_str());
  print_cautions();
}

void run_plan(const PlanOptions& o) {
  const LengthUnit units = o.common.length_unit();
  ShopFlag shop = o.shop;
  shop.load();
  const PlanRequest request = request_from_flags(o, units);
  StageTimer timer;
  const PlanResult plan = plan_stepover(request);
  print_stage(o.common.verbose, "plan", timer.lap());
  const char* basis = surface_basis(request, o);
  nlohmann::json doc = plan_document(request, plan, units, basis);
  if (shop.active()) {
    // The machined Ra of each option as this shop measures; decisions stay kinematic.
    for (size_t k = 0; k < plan.options.size(); ++k) {
      doc["options"][k]["shop"] = shop_ra_json(shop, plan.options[k].surface.ra_um);
    }
  }
  if (!o.out.empty()) {
    OutputDir dir(o.out);
    dir.write("plan.json", doc.dump(2) + "\n");
    dir.write("plan.csv", encode_plan_csv(plan));
    PlanSvgOptions svg;
    svg.inch = units == LengthUnit::Inch;
    dir.write("plan.svg", encode_plan_svg(plan, svg));
    print_stage(o.common.verbose, "write", timer.lap());
  }
  if (o.common.json) {
    print_json(doc);
  } else {
    print_table(request, plan, units, basis);
    if (shop.active() && plan.best) {
      std::printf("best option machined: %s\n",
                  shop_ra_text(shop, plan.options[*plan.best].surface.ra_um, units).c_str());
    }
    if (!o.out.empty())
      std::printf("\nWrote plan.json, plan.csv and plan.svg to %s\n", o.out.c_str());
  }
}

}  // namespace

void setup_plan(CLI::App& sub) {
  auto o = std::make_shared<PlanOptions>();
  add_tool_flags(sub, o->tool);
  sub.add_option("--tools", o->tools,
                 "Several tools to compare: shape:diameter[:corner], comma-separated, e.g. "
                 "ball:6mm,flat:0.5in,bullnose:10:1 (--dish/--tilt apply to each)");
  sub.add_option("--stepovers", o->stepovers,
                 "Stepovers to try, comma-separated lengths (default: 24 from 1% to 60% of each "
                 "diameter)");
  sub.add_option("--size", o->size, "Floor size to finish, e.g. 120x80 (lengths)");
  sub.add_option("--feed", o->feed, "Cutting feed, length per minute, e.g. 1500 or 60in");
  sub.add_option("--rapid", o->rapid, "Rapid rate for links, length per minute")
      ->capture_default_str();
  sub.add_option("--retract", o->retract, "One-way return height above the floor")
      ->capture_default_str();
  // Named apart from texture/simulate --direction, which picks the profile trace direction.
  sub.add_option("--pass-direction", o->pass_direction, "Raster passes: one-way or zigzag")
      ->capture_default_str();
  sub.add_option("--pass-overhead", o->pass_overhead_s,
                 "Seconds per pass beyond the constant-feed time (default 0.5: no source)")
      ->capture_default_str();
  sub.add_option("--machine-rate", o->machine_rate, "Cost of one machine hour (any currency)");
  sub.add_option("--bench-rate", o->bench_rate, "Cost of one bench (sanding) hour, same currency");
  sub.add_option("--target-ra", o->target_ra,
                 "Finished Ra at most this: 0.8 (um; uin with --units in), 32uin, N6");
  sub.add_option(
      "--target-scallop", o->target_scallop,
      "Finished peak-to-valley at most this (cusp, or the last grade's scratches), e.g. 4um");
  sub.add_option("--tolerance", o->tolerance, "+- dimensional tolerance sanding may use (length)");
  // Reason for --sand: a visible cusp pattern may be unacceptable even when its Ra meets the
  // target.
  sub.add_option("--sand", o->sand,
                 "when-needed (only if the machined surface misses the spec) "
                 "or always")
      ->capture_default_str();
  add_grit_flags(sub, o->grits);
  sub.add_option("--out", o->out, "Folder for plan.json, plan.csv and plan.svg");
  // Reason: a job's sweep (tooth marks, rpm, tilt direction) is what `simulate` and `allowance`
  // use for it; plan must price that same surface, not a closed form or envelope (issue 13).
  sub.add_option("--job", o->job,
                 "Plan the stepover of this raster job.toml: its tool, floor, feed and sweep "
                 "(tooth marks as it asks); implies --simulate")
      ->type_name("FILE");
  sub.add_flag("--simulate", o->simulate,
               "Take each option's surface from a simulated window (tilt in any direction, dish, "
               "runout) instead of the closed form");
  add_common_flags(sub, o->common);
  add_shop_flag(sub, o->shop);
  sub.footer(cautions_help_text(plan_cautions()));
  sub.callback([o] { run_plan(*o); });
}

}  // namespace cuspmap

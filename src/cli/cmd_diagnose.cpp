// `cuspmap diagnose FILE`: reads a measured or simulated floor (any heightmap `texture` reads,
// or a two-column x, z trace) back to how it was cut: lay, stepover, effective cutting radius,
// feed marks, pass signatures, setup plane. cli/ holds no computation: flags -> io/ readers ->
// infer/ estimates -> print (table or one JSON object) and diagnose.json under --out.
#include <cmath>
#include <cstdio>
#include <memory>
#include <optional>
#include <string>
#include <vector>

#include "cli/command.h"
#include "cli/output_dir.h"
#include "cli/texture_flags.h"
#include "core/input_error.h"
#include "core/stage_timer.h"
#include "core/units.h"
#include "cli/finish_flags.h"
#include "infer/fit_uncertainty.h"
#include "infer/fit_verdict.h"
#include "infer/tooth_fit.h"
#include "infer/tooth_verdict.h"
#include "infer/floor_fit.h"
#include "infer/pass_visibility.h"
#include "infer/surface_estimates.h"
#include "infer/trace_estimates.h"
#include "io/diagnose_json.h"
#include "io/floor_fit_json.h"
#include "io/tooth_fit_json.h"
#include "io/png.h"
#include "job/job.h"
#include "report/fit_pictures.h"
#include "io/measured_trace.h"
#include "io/read_heightmap.h"

namespace cuspmap {
namespace {

struct DiagnoseCliOptions {
  CommonOptions common;
  std::string file;
  std::string cell;             ///< cell size for npy/csv
  std::string z_units;          ///< um | nm | mm | m
  std::string layout = "auto";  ///< auto | trace | grid
  std::string lay;              ///< known lay, deg
  int teeth = 0;                ///< flutes when known (0 = unknown)
  std::string stylus_tip;       ///< tip radius the measurement was taken with
  std::string out;              ///< folder for diagnose.json (and fit.png)
  ToolFlags tool;               ///< known tool: the fit runs when --diameter or --job is given
  std::string direction;        ///< one-way | zigzag (known pass pattern)
  std::string job;              ///< job file: tool, pass pattern and lay
  int threads = 0;              ///< sweep threads of the fit (0 = all)
  std::string feed_per_tooth;   ///< fz when known (tooth-resolved stage)
  bool tooth_fit = false;       ///< run the experimental tooth-resolved stage
};

// Caution printed with any reading that may send someone to the machine (rules: rotating tools,
// workholding; defer to the machine maker and local practice).
constexpr const char* kMachineCaution =
    "caution: these are estimates from one surface; check the machine with an indicator before "
    "adjusting tram or spindle, with the spindle stopped and locked out, and follow the machine "
    "maker's procedure and local safety rules";

std::string mm(double v) { return format_number(v); }

void print_surface(const std::string& path, const Heightfield& hf, const SurfaceEstimates& e,
                   bool caution) {
  std::printf("%s: %d x %d cells of %s mm\n\n", path.c_str(), hf.nx, hf.ny, mm(hf.cell_mm).c_str());
  char lay_source[96];
  std::snprintf(lay_source, sizeof lay_source,
                "from the passes: band means carry %.3g %% of the variance",
                100.0 * e.lay_pass_share);
  std::printf("  lay          %.3g deg from +X (%s)\n", e.lay_deg,
              e.lay_given ? "given" : lay_source);
  std::printf("  stepover     %.4g mm (+-%.2g, %d repeats)\n", e.stepover.period_mm,
              e.stepover.sigma_mm, e.stepover.repeats);
  std::printf("  cusp         %.3g um peak to valley (mean profile over one stepover)\n",
              e.cusp.cusp_um);
  if (e.cusp.curved) {
    std::printf("  radius       %.3g mm (+-%.2g) effective cutting radius at the valley\n",
                e.cusp.radius_mm, e.cusp.radius_sigma_mm);
  }
  if (e.feed.found) {
    std::printf("  feed marks   every %.3g mm along the lay (+-%.2g)\n", e.feed.period_mm,
                e.feed.period_sigma_mm);
    if (e.feed.revolution_mm > 0.0) {
      std::printf(
          "  revolution   every %.3g mm (%d marks per revolution: one tooth cuts deeper, "
          "runout)\n",
          e.feed.revolution_mm, e.feed.marks_per_revolution);
    }
    std::printf("  feed/tooth   %.3g mm\n", e.feed.feed_per_tooth_mm);
  }
  std::printf("  passes       %s (neighbour %.2f, second %.2f, mirror %.2f)\n", e.direction.c_str(),
              e.passes.next_pass, e.passes.second_pass, e.passes.mirror);
  std::printf("  heel         %s\n", e.heel == "recuts"   ? "recuts (marks cross both ways)"
                                     : e.heel == "lifted" ? "lifted (marks one way only)"
                                                          : "undetermined");
  std::printf("  setup plane  %.3g deg, falling toward %.3g deg from +X\n", e.setup_tilt_deg,
              e.setup_tilt_toward_deg);
  for (const std::string& n : e.notes) std::printf("  note: %s\n", n.c_str());
  if (caution) std::printf("\n%s\n", kMachineCaution);
}

void print_trace(const std::string& path, const TraceEstimates& t) {
  std::printf("%s: x, z trace over %s mm\n\n", path.c_str(), mm(t.length_mm).c_str());
  std::printf(
      "  period       %.4g mm (+-%.2g, %d repeats): the stepover if traced across the "
      "lay, the feed marks if along it\n",
      t.period.period_mm, t.period.sigma_mm, t.period.repeats);
  std::printf("  cusp         %.3g um peak to valley\n", t.cusp.cusp_um);
  if (t.cusp.curved) {
    std::printf("  radius       %.3g mm (+-%.2g) effective cutting radius at the valley\n",
                t.cusp.radius_mm, t.cusp.radius_sigma_mm);
  }
}

void print_fit(const FloorFit& fit, const FittedErrors& f, const FitVerdict& v) {
  std::printf("\n  inverse simulation (%s, %d x %d samples of %s mm, %d sweeps)\n",
              fit.model.tooth_marks ? "tooth-resolved" : "revolving envelope", fit.measured.nx,
              fit.measured.ny, mm(fit.sample_mm).c_str(), fit.evaluations);
  auto row = [](const char* name, const FittedValue& x, const char* unit) {
    if (!x.fitted) return;
    if (x.resolved) {
      std::printf("  %-13s %.3g %s (+-%.2g)\n", name, x.value, unit, x.sigma);
    } else if (!std::isfinite(x.bound)) {
      std::printf("  %-13s not read (best fit %.3g %s; see cannot tell)\n", name, x.value, unit);
    } else {
      std::printf("  %-13s under %.3g %s (not resolved: %.3g +-%.2g)\n", name, x.bound, unit,
                  x.value, x.sigma);
    }
  };
  row("tilt", f.tilt_deg, "deg");
  if (f.tilt_deg.resolved) row("toward", f.tilt_toward_deg, "deg from +X");
  row("along feed", f.tilt_along_deg, "deg");
  row("across feed", f.tilt_across_deg, "deg");
  row("stepover", f.stepover_mm, "mm");
  std::printf("  setup plane   %.3g um/mm (+-%.2g) along X, %.3g um/mm (+-%.2g) along Y\n",
              f.setup_gx_um_per_mm.value, f.setup_gx_um_per_mm.sigma, f.setup_gy_um_per_mm.value,
              f.setup_gy_um_per_mm.sigma);
  std::printf("  residual      %.3g um rms (measured %.3g um rms about its plane)\n",
              fit.residual_rms_um, fit.measured_rms_um);
  for (const std::string& line : v.lines) std::printf("  verdict: %s\n", line.c_str());
  for (const std::string& line : v.cannot_tell) std::printf("  cannot tell: %s\n", line.c_str());
}

// The known tool and pass pattern from --job or the tool flags; empty when neither is given.
std::optional<FloorFitOptions> fit_options(const DiagnoseCliOptions& o, LengthUnit unit,
                                           SurfaceOptions& sopt) {
  FloorFitOptions f;
  if (!o.job.empty()) {
    const Job job = load_job(o.job);
    f.cutter = job.cutter;
    f.direction = job.path.direction;
    if (!sopt.lay_deg && job.path.kind == PathKind::Raster) sopt.lay_deg = job.path.angle_deg;
    if (!sopt.teeth) sopt.teeth = job.cutter.teeth;
  } else if (!o.tool.diameter.empty()) {
    f.cutter = tool_from_flags(o.tool, unit);
  } else {
    return std::nullopt;
  }
  if (o.direction == "zigzag") {
    f.direction = RasterDirection::Zigzag;
  } else if (o.direction == "one-way") {
    f.direction = RasterDirection::OneWay;
  } else if (!o.direction.empty()) {
    throw InputError("--direction '" + o.direction + "': allowed values are one-way, zigzag");
  }
  if (o.teeth > 0) f.cutter.teeth = o.teeth;
  f.threads = o.threads;
  return f;
}

// Tooth-resolved stage (issue 17): the teeth, feed per tooth and spindle sense from --job, else
// from --teeth and --feed-per-tooth, else the surface's own feed marks (with --teeth).
ToothFitOptions tooth_options(const DiagnoseCliOptions& o, LengthUnit unit,
                              const FloorFitOptions& fopt, const SurfaceEstimates& e) {
  ToothFitOptions t;
  t.cutter = fopt.cutter;
  t.direction = fopt.direction;
  t.threads = fopt.threads;
  if (!o.job.empty()) {
    const Job job = load_job(o.job);
    t.spindle = job.cut.spindle;
    if (job.cut.rpm > 0.0 && job.cutter.teeth > 0) {
      t.feed_per_tooth_mm = job.cut.feed_mm_per_min / (job.cut.rpm * job.cutter.teeth);
    }
  }
  if (!o.feed_per_tooth.empty()) {
    t.feed_per_tooth_mm = parse_positive_length_mm(o.feed_per_tooth, unit, "--feed-per-tooth");
  }
  if (!(t.feed_per_tooth_mm > 0.0) && o.teeth > 0 && e.feed.found) {
    t.feed_per_tooth_mm = e.feed.feed_per_tooth_mm;
  }
  if (o.job.empty() && o.teeth <= 0) t.feed_per_tooth_mm = 0.0;  // teeth unknown: skipped
  return t;
}

void print_tooth_fit(const ToothFit& t) {
  if (!t.ran) return;
  std::printf("\n  tooth-resolved stage (%d teeth, fz %s mm, %d passes, %d sweeps)\n", t.teeth,
              mm(t.feed_per_tooth_mm).c_str(), t.passes, t.sweeps);
  if (t.marks_misfit) {
    std::printf("  the fit did not reproduce the tooth marks (smoothed residual %.3g of their "
                "rms): no value given\n", t.smoothed_residual_ratio);
    return;
  }
  if (t.runout_not_read) {
    std::printf("  %-13s not read (the \"cannot tell\" lines say why)\n", "runout");
  } else {
    std::printf("  %-13s %.3g um (+-%.2g)%s\n", "runout", t.runout_um.value, t.runout_um.sigma,
                t.runout_projection_only ? " (|e cos phase| only)" : "");
  }
  if (!t.runout_projection_only && !t.runout_not_read) {
    std::printf("  %-13s %.3g deg (+-%.2g), modulo %.3g deg\n", "runout phase",
                t.runout_phase_deg.value, t.runout_phase_deg.sigma, t.runout_phase_period_deg);
  }
  std::printf("  %-13s %.3g deg (+-%.2g)\n", "dish", t.dish_deg.value, t.dish_deg.sigma);
  std::printf("  %-13s %.3g deg (+-%.2g), sign %s\n", "along feed", t.tilt_along_deg.value,
              t.tilt_along_deg.sigma, t.along_sign_known ? "known" : "open");
  std::printf("  residual      %.3g um rms (measured %.3g um rms about its plane)\n",
              t.residual_rms_um, t.measured_rms_um);
}

void run_diagnose(const DiagnoseCliOptions& o) {
  const LengthUnit unit = o.common.length_unit();
  double tip_um = 0.0;
  if (!o.stylus_tip.empty()) tip_um = parse_stylus_tip_um(o.stylus_tip, unit);
  if (o.teeth < 0) throw InputError("--teeth " + std::to_string(o.teeth) + ": must be >= 1");
  StageTimer timer;
  nlohmann::json doc;
  std::string fit_png;
  if (is_trace_file(o.file, parse_input_layout(o.layout))) {
    const double z_um = o.z_units.empty() ? 1.0 : z_units_to_um(o.z_units);
    const MeasuredTrace trace =
        read_trace(o.file, unit == LengthUnit::Inch ? kMmPerInch : 1.0, z_um);
    const TraceEstimates t = trace_estimates(trace.runs);
    print_stage(o.common.verbose, "estimate", timer.lap());
    doc = trace_estimates_json(t);
    doc["points"] = trace.points;
    doc["missing_points"] = trace.missing_points;
    doc["stylus_tip_um"] = tip_um;
    if (!o.common.json) print_trace(o.file, t);
  } else {
    HeightmapReadOptions ropt;
    if (!o.cell.empty()) ropt.cell_mm = parse_positive_length_mm(o.cell, unit, "--cell");
    if (!o.z_units.empty()) {
      z_units_to_um(o.z_units);
      ropt.z_units = o.z_units;
    }
    const HeightmapFile file = read_heightmap(o.file, ropt);
    print_stage(o.common.verbose, "read", timer.lap());
    SurfaceOptions sopt;
    if (!o.lay.empty()) sopt.lay_deg = parse_angle_deg(o.lay, "--lay");
    if (o.teeth > 0) sopt.teeth = o.teeth;
    sopt.threads = o.threads;
    std::optional<FloorFitOptions> fopt = fit_options(o, unit, sopt);
    if (fopt) fopt->stylus_tip_um = tip_um;
    SurfaceEstimates e = surface_estimates(file.field, sopt);
    print_stage(o.common.verbose, "estimate", timer.lap());
    if (tip_um > 0.0 && e.cusp.curved && e.cusp.radius_mm * kUmPerMm <= 2.0 * tip_um) {
      e.notes.push_back("the valley radius is within twice the stylus tip's: it may be the tip's");
    }
    doc = surface_estimates_json(e);
    doc["cell_mm"] = file.field.cell_mm;
    doc["size_mm"] = {file.field.nx * file.field.cell_mm, file.field.ny * file.field.cell_mm};
    doc["stylus_tip_um"] = tip_um;
    doc["cautions"] = {kMachineCaution};
    if (fopt) {
      const FloorFit fit = fit_floor(file.field, e, *fopt);
      FittedErrors f = fitted_errors(fit);
      print_stage(o.common.verbose, "fit", timer.lap());
      const PassVisibility passes = pass_visibility(fit);
      widen_for_faint_passes(passes, f);
      FitVerdict v = fit_verdict(f, fit, e, passes);
      withhold_arc_beat(v, f);
      // Tooth-resolved stage (issue 17): runout, dish and the along-feed sign. Experimental and
      // slow (docs/diagnose.md "Tooth-resolved stage"): run only when asked for, and only on
      // passes the envelope fit has read.
      ToothFit tooth;
      if (v.arc_beat) {
        e.notes.push_back("the across-lay repeat may be the beat of neighbouring passes' tooth "
                          "arcs, not the stepover (see the fit's cannot-tell lines)");
        doc["notes"].push_back(e.notes.back());
        tooth.skipped =
            "the stepover is not read (the across-lay repeat may be a beat of tooth arcs)";
      } else if (o.tooth_fit) {
        tooth = fit_teeth(file.field, tooth_fit_start(fit), tooth_options(o, unit, *fopt, e));
        print_stage(o.common.verbose, "tooth fit", timer.lap());
      } else {
        tooth.skipped =
            "the tooth-resolved stage is experimental (unreliable on measured floors, tens of "
            "seconds); --tooth-fit runs it";
      }
      merge_tooth_verdict(tooth, tooth_verdict(tooth), v);
      doc["fit"] = floor_fit_json(fit, f, v);
      doc["fit"]["passes_visible"] = passes.visible;
      doc["fit"]["pass_profile_rms_um"] = passes.model_rms_um;
      doc["fit"]["line_residual_rms_um"] = passes.line_residual_rms_um;
      add_tooth_fit_json(tooth, doc["fit"]);
      if (!o.out.empty()) fit_png = encode_png(render_fit_pictures(fit, unit));
      if (!o.common.json) {
        print_surface(o.file, file.field, e, false);
        print_fit(fit, f, v);
        print_tooth_fit(tooth);
        std::printf("\n%s\n", kMachineCaution);
      }
    } else if (!o.common.json) {
      print_surface(o.file, file.field, e, true);
    }
  }
  if (!o.out.empty()) {
    OutputDir dir(o.out);
    dir.write("diagnose.json", doc.dump(2) + "\n");
    if (!fit_png.empty()) dir.write("fit.png", fit_png);
  }
  if (o.common.json) print_json(doc);
}

}  // namespace

void setup_diagnose(CLI::App& sub) {
  auto o = std::make_shared<DiagnoseCliOptions>();
  sub.add_option("file", o->file,
                 "Measured or simulated floor: any heightmap texture reads, or an x, z trace")
      ->required();
  sub.add_option("--cell", o->cell, "Cell size for .npy/.csv (else report.json beside the file)");
  sub.add_option("--z-units", o->z_units,
                 "Height unit of .npy/.csv/.xyz/trace values: um, nm, mm, m");
  sub.add_option("--layout", o->layout, "How a text file is read: auto, trace or grid")
      ->capture_default_str();
  // Reason for the flag: a floor with faint grooves may not show its lay; the program knows it.
  sub.add_option("--lay", o->lay, "Pass direction in deg from +X when known");
  // Reason for the flag: a revolution repeat becomes a feed per tooth only with the flute count.
  sub.add_option("--teeth", o->teeth, "Flutes of the cutter, when known");
  sub.add_option("--stylus-tip", o->stylus_tip,
                 "Stylus tip radius the measurement was taken with (e.g. 2um, 5um, 10um)");
  sub.add_option("--out", o->out, "Folder to write diagnose.json (and fit.png) into");
  // Reason for the flags: the fit needs the tool that cut the floor (as simulate's tool flags).
  sub.add_option("--tool", o->tool.tool, "Tool that cut the floor: ball, bullnose or flat")
      ->capture_default_str();
  sub.add_option("--diameter", o->tool.diameter, "Its diameter: runs the inverse simulation");
  sub.add_option("--corner-radius", o->tool.corner_radius, "Bull-nose corner radius");
  sub.add_option("--dish", o->tool.dish, "End-face dish angle, deg")->capture_default_str();
  sub.add_option("--direction", o->direction, "Pass pattern when known: one-way or zigzag");
  sub.add_option("--job", o->job, "Job file that cut the floor: tool, pass pattern and lay");
  // Reason for the flag: the tooth-resolved stage needs fz; a floor cut by G-code has no job.
  sub.add_option("--feed-per-tooth", o->feed_per_tooth,
                 "Feed per tooth when known (with --teeth): runs the tooth-resolved stage");
  // Reason for the flag: the tooth-resolved stage is experimental and slow; never run unasked.
  sub.add_flag("--tooth-fit", o->tooth_fit,
               "Also run the experimental tooth-resolved stage (runout, dish, along-feed sign; "
               "slow, unreliable on measured floors)");
  sub.add_option("--threads", o->threads,
                 "Threads of the fit's sweeps and the pass signatures (0 = all; the same result "
                 "for any count)")
      ->check(CLI::Range(0, 1024));
  add_common_flags(sub, o->common);
  sub.callback([o] { run_diagnose(*o); });
}

}  // namespace cuspmap

// `cuspmap diagnose FILE`: reads a measured or simulated floor (any heightmap `texture` reads,
// or a two-column x, z trace) back to how it was cut: lay, stepover, effective cutting radius,
// feed marks, pass signatures, setup plane. cli/ holds no computation: flags -> io/ readers ->
// infer/ estimates -> print (table or one JSON object) and diagnose.json under --out.
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
#include "infer/surface_estimates.h"
#include "infer/trace_estimates.h"
#include "io/diagnose_json.h"
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
  std::string out;              ///< folder for diagnose.json
};

// Caution printed with any reading that may send someone to the machine (rules: rotating tools,
// workholding; defer to the machine maker and local practice).
constexpr const char* kMachineCaution =
    "caution: these are estimates from one surface; check the machine with an indicator before "
    "adjusting tram or spindle, with the spindle stopped and locked out, and follow the machine "
    "maker's procedure and local safety rules";

std::string mm(double v) { return format_number(v); }

void print_surface(const std::string& path, const Heightfield& hf, const SurfaceEstimates& e) {
  std::printf("%s: %d x %d cells of %s mm\n\n", path.c_str(), hf.nx, hf.ny, mm(hf.cell_mm).c_str());
  std::printf(
      "  lay          %.3g deg from +X (%s)\n", e.lay_deg,
      e.lay_given ? "given" : ("detected, strength " + format_number(e.lay_strength)).c_str());
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
  std::printf("\n%s\n", kMachineCaution);
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

void run_diagnose(const DiagnoseCliOptions& o) {
  const LengthUnit unit = o.common.length_unit();
  double tip_um = 0.0;
  if (!o.stylus_tip.empty()) tip_um = parse_stylus_tip_um(o.stylus_tip, unit);
  if (o.teeth < 0) throw InputError("--teeth " + std::to_string(o.teeth) + ": must be >= 1");
  StageTimer timer;
  nlohmann::json doc;
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
    if (!o.common.json) print_surface(o.file, file.field, e);
  }
  if (!o.out.empty()) {
    OutputDir dir(o.out);
    dir.write("diagnose.json", doc.dump(2) + "\n");
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
  sub.add_option("--out", o->out, "Folder to write diagnose.json into");
  add_common_flags(sub, o->common);
  sub.callback([o] { run_diagnose(*o); });
}

}  // namespace cuspmap

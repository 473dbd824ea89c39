// `cuspmap allowance`: depth to sand before the machining marks vanish, volume, programmed stock
// (two conventions), grit sequence with times, tolerance verdict and cautions; from the closed-form
// cusp (tool + stepover flags), a simulate report, a heightmap file (npy, csv, xyz, sdf, x3p) or
// a job file simulated on the spot, through the ISO texture parameters. Human table or --json.
#include <cstdio>
#include <fstream>
#include <optional>

#include "cli/command.h"
#include "cli/shop_flag.h"
#include "cli/finish_flags.h"
#include "cli/texture_flags.h"
#include "core/input_error.h"
#include "core/stage_timer.h"
#include "finish/cusp_profile_heights.h"
#include "cusp/kinematic_limits.h"
#include "finish/finishing_cautions.h"
#include "finish/sanding_allowance.h"
#include "io/read_heightmap.h"
#include "job/job.h"
#include "job/run_job.h"
#include "core/display_quantity.h"
#include "report/html_report.h"
#include "texture/texture_report.h"

namespace cuspmap {
namespace {

// Area the volumes and times refer to when neither --area nor a patch gives one: 100 cm^2, a
// round reference stated in the output (not a guess at the user's part).
constexpr double kReferenceAreaMm2 = 10000.0;

struct AllowanceOptions {
  CommonOptions common;
  ShopFlag shop;          // --shop profile
  ToolFlags tool;
  GritFlags grits;
  TextureFlags texture;   // how a heightmap's or job's texture is measured
  std::string input;      // report.json from `cuspmap simulate`, or a heightmap file
  std::string cell;       // --cell for npy/csv heightmaps
  std::string z_units;    // --z-units for npy/csv/xyz heightmaps
  std::string stepover;   // analytic case
  std::string area;       // --area
  std::string tolerance;  // --tolerance (+-, length)
  std::string target_ra;  // --target-ra (height): no sanding when the marks already meet it
};

// The marks to sand and where they came from.
struct Marks {
  SurfaceHeights heights;
  std::string description;               // one line for the human header
  nlohmann::json source;                 // the same for JSON
  std::optional<double> patch_area_mm2;  // area of a simulated patch
};

double report_number(const nlohmann::json& doc, const char* group, const char* key,
                     const std::string& file) {
  const auto g = doc.find(group);
  if (g == doc.end() || !g->is_object() || !g->contains(key) || !(*g)[key].is_number()) {
    throw InputError(file + ": " + group + "." + key +
                     " is missing: expected a report.json written by `cuspmap simulate`");
  }
  return (*g)[key].get<double>();
}

Marks marks_from_report(const std::string& file) {
  std::ifstream in(file, std::ios::binary);
  if (!in) throw InputError(file + ": cannot read the file");
  const nlohmann::json doc = nlohmann::json::parse(in, nullptr, false);
  if (doc.is_discarded() || !doc.is_object()) {
    throw InputError(file + ": not a JSON object: expected a report.json from `cuspmap simulate`");
  }
  Marks m;
  m.heights.sz_um = report_number(doc, "areal", "Sz_um", file);
  m.heights.sv_um = report_number(doc, "areal", "Sv_um", file);
  m.heights.sp_um = report_number(doc, "areal", "Sp_um", file);
  m.heights.sa_um = report_number(doc, "areal", "Sa_um", file);
  m.heights.ra_um = report_number(doc, "profile", "Ra_um", file);
  if (m.heights.sz_um < 0.0 || m.heights.sv_um < 0.0) {
    throw InputError(file + ": areal Sz_um/Sv_um must be >= 0");
  }
  const auto size = doc.find("size_mm");
  if (size != doc.end() && size->is_array() && size->size() == 2 && (*size)[0].is_number() &&
      (*size)[1].is_number()) {
    m.patch_area_mm2 = (*size)[0].get<double>() * (*size)[1].get<double>();
  }
  m.description = "simulated floor from " + file;
  m.source = {{"kind", "report"}, {"file", file}};
  return m;
}

// Height parameters of a texture report (the simulate pipeline's or a heightmap's).
SurfaceHeights heights_of(const TextureReport& r) {
  SurfaceHeights h;
  h.sz_um = r.areal.parameters.sz_um;
  h.sv_um = r.areal.parameters.sv_um;
  h.sp_um = r.areal.parameters.sp_um;
  h.sa_um = r.areal.parameters.sa_um;
  h.ra_um = r.profile.roughness.a_um;
  return h;
}

Marks marks_from_job(const std::string& file, const TextureOptions& texture) {
  const Job job = load_job(file);
  RunOptions options;
  options.texture = texture;
  const JobRun run = run_job(job, options);
  Marks m;
  m.heights = heights_of(run.texture);
  m.patch_area_mm2 = run.patch.size_x_mm * run.patch.size_y_mm;
  m.description = "job " + file + " simulated (" + describe_tool(job.cutter, job.units) + ", " +
                  describe_path(job.path, job.units) + ")";
  m.source = {{"kind", "job"}, {"file", file}, {"cutoff_mm", run.texture.profile.cutoff_mm}};
  return m;
}

Marks marks_from_heightmap(const AllowanceOptions& o, LengthUnit units) {
  HeightmapReadOptions read;
  if (!o.cell.empty()) {
    read.cell_mm = parse_length_mm(o.cell, units, "--cell");
    if (!(*read.cell_mm > 0.0)) throw InputError("--cell " + o.cell + ": must be > 0");
  }
  if (!o.z_units.empty()) {
    z_units_to_um(o.z_units);  // validates the value before reading
    read.z_units = o.z_units;
  }
  const HeightmapFile file = read_heightmap(o.input, read);
  std::string side_note;
  const TextureOptions topt = texture_options_for_file(o.texture, units, o.input, side_note);
  const TextureReport r = texture_report(file.field, topt);
  Marks m;
  m.heights = heights_of(r);
  m.patch_area_mm2 = r.size_x_mm * r.size_y_mm;
  m.description = file.format + " heightmap " + o.input + " (ISO 25178-2, plane removed; Ra " +
                  r.profile.direction + " the lay, cut-off " +
                  display_cutoff(r.profile.cutoff_mm, units) + ")";
  m.source = {{"kind", "heightmap"},
              {"file", o.input},
              {"format", file.format},
              {"cutoff_mm", r.profile.cutoff_mm}};
  return m;
}

Marks marks_from_flags(const AllowanceOptions& o, LengthUnit units) {
  const Cutter cutter = tool_from_flags(o.tool, units);
  require_tilt_along_feed(cutter, "simulate the job and pass its report.json or height.npy");
  const double s_mm = parse_length_mm(o.stepover, units, "--stepover");
  if (s_mm <= 0.0 || s_mm > cutter.diameter_mm) {
    throw InputError("--stepover " + format_number(s_mm) +
                     " mm: must be > 0 and <= the tool "
                     "diameter " +
                     format_number(cutter.diameter_mm) + " mm");
  }
  Marks m;
  m.heights = cusp_profile_heights(cutter, s_mm);
  const std::string step = units == LengthUnit::Inch ? format_number(s_mm / kMmPerInch) + " in"
                                                     : format_number(s_mm) + " mm";
  m.description =
      describe_tool(cutter, units) + ", stepover " + step + " (closed-form cusp profile";
  m.description += cutter.shape == CutterShape::Flat && cutter.tilt_deg != 0.0
                       ? ", tilt taken along the feed)"
                       : ")";
  m.source = {{"kind", "analytic"},
              {"tool", describe_tool(cutter, LengthUnit::Millimetre)},
              {"stepover_mm", s_mm}};
  return m;
}

// The tolerance verdict, in the chosen unit (stock and tolerances in um, or thou in inch mode).
std::string verdict_text(const Allowance& a, LengthUnit u) {
  const std::string change = display_stock(a.dimension_change_um, u);
  const std::string tol = "+-" + display_stock(*a.tolerance_um, u);
  if (a.within_tolerance) {
    return "within: sanding changes the dimension by up to " + change + ", inside " + tol;
  }
  return "exceeds: sanding changes the dimension by up to " + change + ", more than " + tol +
         "; program the stock and check the dimension after sanding";
}

// The sanding cautions, with the fine-Ra caution first when the predicted Ra draws it.
std::vector<std::string> allowance_cautions(double ra_um) {
  std::vector<std::string> c = sanding_cautions();
  if (const std::string fine = fine_ra_caution(ra_um); !fine.empty()) c.insert(c.begin(), fine);
  return c;
}

void print_human(const Allowance& a, const Marks& m, const GritChoice& g,
                 const std::string& area_note, LengthUnit u) {
  std::printf("Sanding allowance: %s\n\n", m.description.c_str());
  std::printf("Marks left by the pass\n");
  std::printf("  depth to clear (Sz, highest peak to deepest valley)  %s\n",
              display_roughness(a.depth_to_clear_um, u).c_str());
  std::printf("  mean sanding depth Sv (mean minus minimum)           %s\n",
              display_roughness(a.mean_removal_um, u).c_str());
  std::printf("  Ra of the marks                                      %s\n",
              display_roughness(m.heights.ra_um, u).c_str());
  std::printf("\nProgrammed stock so that the sanded surface lands on nominal\n");
  std::printf("  valleys on nominal  %-11s %s\n", display_stock(a.stock_valleys_nominal_um, u).c_str(),
              kStockValleysNominalNote);
  std::printf("  mean on nominal     %-11s %s\n", display_stock(a.stock_mean_nominal_um, u).c_str(),
              kStockMeanNominalNote);
  std::printf("\nVolume over %s (%s)\n", display_area(a.area_mm2, u).c_str(), area_note.c_str());
  std::printf("  down to the deepest valley (Sv x area)  %s\n", display_volume(a.volume_mm3, u).c_str());
  std::printf("  whole grit sequence                     %s\n",
              display_volume(a.sequence_volume_mm3, u).c_str());
  std::printf("\nGrit sequence (%s)\n", g.table.source.c_str());
  if (!a.grits.needed) {
    std::printf("  %s: stock 0, program the floor on nominal\n", a.grits.verdict.c_str());
    if (!a.grits.finer_grit.empty()) {
      std::printf("  for a finer finish than machined, finish with %s or finer (the grades given "
                  "leave it rougher)\n",
                  a.grits.finer_grit.c_str());
    }
  } else {
    std::vector<double> times;
    for (const GritStep& s : a.grits.steps) times.push_back(s.time_s);
    // One time unit for the column (the total may need a larger one: it is a separate line).
    const TimeUnit tu = time_unit_for(times);
    const std::string rough = roughness_symbol(u);
    std::printf("  %-6s %14s %14s %10s %14s\n", "grit", ("scratches " + rough).c_str(),
                ("remove " + rough).c_str(), (std::string("time ") + time_unit_symbol(tu)).c_str(),
                ("Ra after " + rough).c_str());
    for (const GritStep& s : a.grits.steps) {
      std::printf("  %-6s %14s %14s %10s %14s\n", s.grit.c_str(),
                  display_roughness_number(s.scratch_um, u).c_str(),
                  display_roughness_number(s.remove_um, u).c_str(),
                  display_time_number(s.time_s, tu).c_str(),
                  display_roughness_number(s.ra_after_um, u).c_str());
    }
    std::printf("  %-6s %14s %14s %10s\n", "total", "",
                display_roughness_number(a.grits.total_remove_um, u).c_str(),
                display_time_number(a.grits.total_time_s, tu).c_str());
    if (time_unit_for(a.grits.total_time_s) != tu) {
      std::printf("  (total sanding time %s)\n", display_time(a.grits.total_time_s).c_str());
    }
    for (const std::string& name : a.grits.skipped) {
      std::printf("  skipped %s: its scratches are deeper than the marks\n", name.c_str());
    }
  }
  if (a.grits.needed) {
    std::printf("Predicted Ra: machined %s, after %s %s (estimate: the Ra the last grade leaves on "
                "its own, from the grade table)\n",
                display_roughness(m.heights.ra_um, u).c_str(), a.grits.steps.back().grit.c_str(),
                display_roughness(a.grits.final_ra_um, u).c_str());
  } else {
    std::printf("Predicted Ra: %s as machined, unsanded\n",
                display_roughness(m.heights.ra_um, u).c_str());
  }
  if (const std::string c = fine_ra_caution(m.heights.ra_um, u); !c.empty()) {
    std::printf("  caution: %s\n", c.c_str());
  }
  std::printf("%s\n", kKinematicBestCase);
  if (a.tolerance_um) std::printf("\nTolerance check: %s\n", verdict_text(a, u).c_str());
  print_cautions();
}

void run_allowance(const AllowanceOptions& o) {
  const LengthUnit units = o.common.length_unit();
  ShopFlag shop = o.shop;
  shop.load();
  StageTimer timer;
  Marks marks;
  if (!o.input.empty()) {
    const auto ends_with = [&](std::string_view tail) {
      return o.input.size() >= tail.size() && o.input.substr(o.input.size() - tail.size()) == tail;
    };
    marks = ends_with(".json")   ? marks_from_report(o.input)
            : ends_with(".toml") ? marks_from_job(o.input, texture_options(o.texture, units))
                                 : marks_from_heightmap(o, units);
  } else if (!o.stepover.empty()) {
    marks = marks_from_flags(o, units);
  } else {
    throw InputError(
        "allowance needs a job.toml, a simulate report.json, a heightmap file or --stepover "
        "with the tool flags (--tool, --diameter)");
  }
  const GritChoice grits = grit_choice_from_flags(o.grits);
  double area_mm2 = kReferenceAreaMm2;
  std::string area_note = "reference area 100 cm^2: no --area given";
  if (!o.area.empty()) {
    area_mm2 = parse_area_mm2(o.area, units, "--area");
    area_note = "from --area";
  } else if (marks.patch_area_mm2) {
    area_mm2 = *marks.patch_area_mm2;
    area_note = "the simulated patch";
  }
  std::optional<double> tolerance_um;
  if (!o.tolerance.empty()) {
    const double t_mm = parse_length_mm(o.tolerance, units, "--tolerance");
    if (!(t_mm > 0.0)) {
      throw InputError("--tolerance " + o.tolerance + ": must be > 0 (the +- band, e.g. 0.05mm)");
    }
    tolerance_um = t_mm * kUmPerMm;
  }
  print_stage(o.common.verbose, "marks", timer.lap());
  std::optional<double> target_ra_um;
  if (!o.target_ra.empty()) {
    target_ra_um = parse_length_mm(o.target_ra, units, "--target-ra") * kUmPerMm;
    if (!(*target_ra_um > 0.0)) {
      throw InputError("--target-ra " + o.target_ra + ": must be > 0 (e.g. 0.8um)");
    }
  }
  const Allowance a = sanding_allowance(marks.heights, grits.table, grits.sequence, area_mm2,
                                        tolerance_um, target_ra_um);
  print_stage(o.common.verbose, "allowance", timer.lap());
  if (!o.common.json) {
    print_human(a, marks, grits, area_note, units);
    if (shop.active()) std::printf("%s\n", shop_ra_text(shop, marks.heights.ra_um, units).c_str());
    return;
  }
  nlohmann::json doc = {
      {"input", marks.source},
      {"marks",
       {{"Sz_um", marks.heights.sz_um},
        {"Sv_um", marks.heights.sv_um},
        {"Sp_um", marks.heights.sp_um},
        {"Sa_um", marks.heights.sa_um},
        {"Ra_um", marks.heights.ra_um}}},
      {"depth_to_clear_um", a.depth_to_clear_um},
      {"mean_removal_um", a.mean_removal_um},
      {"stock_valleys_nominal_um", a.stock_valleys_nominal_um},
      {"stock_mean_nominal_um", a.stock_mean_nominal_um},
      {"stock_notes",
       {{"valleys_nominal", kStockValleysNominalNote}, {"mean_nominal", kStockMeanNominalNote}}},
      {"area_mm2", a.area_mm2},
      {"area_basis", area_note},
      {"volume_per_area_mm3_per_mm2", a.volume_per_area_mm3_per_mm2},
      {"volume_mm3", a.volume_mm3},
      {"volume_in3", a.volume_in3},
      {"sequence_volume_mm3", a.sequence_volume_mm3},
      {"sequence_volume_in3", a.sequence_volume_in3},
      {"dimension_change_um", a.dimension_change_um},
      {"grits", grits_json(a.grits)},
      {"skipped_grits", a.grits.skipped},
      {"sanding_time_s", a.grits.total_time_s},
      {"final_Ra_um", a.grits.final_ra_um},
      {"sanding_needed", a.grits.needed},
      {"verdict", a.grits.verdict},
      {"finer_grit", a.grits.finer_grit},
      {"target_Ra_um", target_ra_um ? nlohmann::json(*target_ra_um) : nlohmann::json()},
      {"model", kKinematicBestCase},
      {"final_scratch_um", a.grits.final_scratch_um},
      {"basis",
       {{"grit_table", grits.table.source},
        {"final_Ra",
         "Ra the last grade leaves on its own, from the grade table; the machined Ra when no "
         "sanding is needed (never above it)"},
        {"model",
         "marks vanish at the deepest valley; each grade erases the scratches "
         "of the one before (docs/finishing.md)"}}},
      {"cautions", allowance_cautions(marks.heights.ra_um)},
  };
  doc["tolerance"] = nullptr;
  if (a.tolerance_um) {
    doc["tolerance"] = {{"tolerance_um", *a.tolerance_um},
                        {"within", a.within_tolerance},
                        {"verdict", verdict_text(a, LengthUnit::Millimetre)}};
  }
  if (shop.active()) doc["shop"] = shop_ra_json(shop, marks.heights.ra_um);
  print_json(doc);
}

}  // namespace

void setup_allowance(CLI::App& sub) {
  auto o = std::make_shared<AllowanceOptions>();
  sub.add_option("input", o->input,
                 "job.toml (simulated here), report.json written by `cuspmap simulate`, or a "
                 "heightmap (npy, csv, xyz, sdf, x3p); else use the tool flags and --stepover");
  sub.add_option("--cell", o->cell,
                 "Cell size of an npy/csv heightmap (length; else report.json "
                 "beside it)");
  sub.add_option("--z-units", o->z_units, "Height unit of an npy/csv/xyz heightmap: um, nm, mm, m");
  add_tool_flags(sub, o->tool);
  sub.add_option("--stepover", o->stepover, "Stepover of the raster (length), closed-form case");
  sub.add_option("--area", o->area,
                 "Area to sand: 9600 (mm^2, in^2 with --units in), 96cm2 or 120x80; default the "
                 "simulated patch, else 100 cm^2");
  sub.add_option("--tolerance", o->tolerance, "+- dimensional tolerance to check (length)");
  // Reason for the flag: a floor that already meets its Ra callout needs no sanding and no stock.
  sub.add_option("--target-ra", o->target_ra,
                 "Finished Ra wanted, e.g. 0.8um: no sanding when the marks already meet it");
  add_grit_flags(sub, o->grits);
  add_texture_flags(sub, o->texture);
  add_common_flags(sub, o->common);
  add_shop_flag(sub, o->shop);
  sub.footer(cautions_help_text(sanding_cautions()));
  sub.callback([o] { run_allowance(*o); });
}

}  // namespace cuspmap

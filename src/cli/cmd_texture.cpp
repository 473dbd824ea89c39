// `cuspmap texture FILE`: reads a heightmap (npy, csv, xyz, sdf, x3p), prints ISO 4287 profile
// and ISO 25178-2 areal parameters as a table or one JSON object, optionally re-saves the map.
// cli/ holds no computation: flags -> io/read_heightmap -> texture/texture_report -> print.
#include <cstdio>
#include <memory>
#include <string>
#include <vector>

#include "cli/command.h"
#include "cli/texture_flags.h"
#include "core/input_error.h"
#include "core/stage_timer.h"
#include "core/units.h"
#include "core/write_file_atomic.h"
#include "io/measured_trace.h"
#include "io/read_heightmap.h"
#include "io/texture_json.h"
#include "core/display_quantity.h"
#include "texture/texture_report.h"
#include "texture/trace_report.h"

namespace cuspmap {
namespace {

struct TextureCliOptions {
  CommonOptions common;
  std::string file;
  std::string cell;                  ///< cell size for npy/csv (length with optional suffix)
  TextureFlags texture;              ///< cut-off, lambda-s, direction, lay, areal filters
  std::string z_units;               ///< um | nm | mm | m for npy/csv/xyz
  std::string export_path;           ///< re-save the heightmap in the format of this extension
  std::string layout = "auto";       ///< auto | trace | grid (how a text file's columns are read)
};

// One table row: name, value in the display unit, and a note.
void height_row(const char* name, double um, LengthUnit u, const std::string& note = "") {
  std::printf("  %-4s %10s %-3s  %s\n", name, display_roughness_number(um, u).c_str(),
              roughness_symbol(u), note.c_str());
}

// A dimensionless parameter (skewness, kurtosis, ratios): 3 figures, noise below 1e-6 reads 0.
std::string ratio(double v) { return display_number(v, 1e-6); }

void print_warnings(const std::vector<std::string>& warnings) {
  if (warnings.empty()) return;
  std::printf("\nWarnings:\n");
  for (const std::string& w : warnings) std::printf("  - %s\n", w.c_str());
}

// Cut-off line, R parameters, P and W summary of a profile report.
void print_profile_parameters(const ProfileReport& p, LengthUnit u) {
  const ProfileParameters& q = p.roughness;
  if (p.stylus_tip_um > 0.0) {
    std::printf("  stylus tip %s: traces closed by it (ISO 16610-41) before the filters\n",
                display_roughness(p.stylus_tip_um, u).c_str());
  }
  std::printf("  cut-off %s, chosen by %s; lambda-s %s; evaluation length %s = %d x cut-off\n",
              display_cutoff(p.cutoff_mm, u).c_str(), p.cutoff_rule.c_str(),
              display_roughness(p.lambda_s_um, u).c_str(),
              display_length(p.evaluation_length_mm, u).c_str(), p.sampling_lengths);
  height_row("Ra", q.a_um, u, "ISO 1302:1992 " + p.iso1302_grade);
  height_row("Rq", q.q_um, u);
  height_row("Rz", q.z_um, u, "mean of " + std::to_string(p.sampling_lengths) + " sampling lengths");
  height_row("Rp", q.p_um, u);
  height_row("Rv", q.v_um, u);
  height_row("Rt", q.t_um, u);
  std::printf("  Rsk %s   Rku %s   RSm %s\n", ratio(q.sk).c_str(), ratio(q.ku).c_str(),
              display_length(q.sm_mm, u).c_str());
  std::printf("  primary: Pa %s, Pt %s;  waviness: Wa %s, Wt %s\n",
              display_roughness(p.primary.a_um, u).c_str(),
              display_roughness(p.primary.t_um, u).c_str(),
              display_roughness(p.waviness.a_um, u).c_str(),
              display_roughness(p.waviness.t_um, u).c_str());
}

void print_table(const HeightmapFile& file, const TextureReport& r, const std::string& path,
                 LengthUnit u) {
  const ProfileReport& p = r.profile;
  std::printf("%s: %s, %d x %d cells of %s (%s x %s), cell from %s\n", path.c_str(),
              file.format.c_str(), file.field.nx, file.field.ny,
              display_length(r.cell_mm, u).c_str(), display_length_number(r.size_x_mm, u).c_str(),
              display_length(r.size_y_mm, u).c_str(), file.cell_source.c_str());
  std::printf("\nProfile (ISO 4287), %s the lay at %s deg, mean of %d traces\n",
              p.direction == "angle" ? "at an angle to" : p.direction.c_str(),
              display_number(p.direction_deg, 1e-6).c_str(), p.traces);
  print_profile_parameters(p, u);
  const ArealReport& a = r.areal;
  const ArealParameters& s = a.parameters;
  std::printf("\nAreal (ISO 25178-2), least-squares plane removed%s%s\n",
              a.s_filter_mm > 0 ? (", S-filter " + display_cutoff(a.s_filter_mm, u)).c_str() : "",
              a.l_filter_mm > 0 ? (", L-filter " + display_cutoff(a.l_filter_mm, u)).c_str() : "");
  height_row("Sa", s.sa_um, u);
  height_row("Sq", s.sq_um, u);
  height_row("Sz", s.sz_um, u);
  height_row("Sp", s.sp_um, u);
  height_row("Sv", s.sv_um, u);
  std::printf("  Ssk %s   Sku %s   Sdr %s %%   Str %s   Sal %s\n", ratio(s.ssk).c_str(),
              ratio(s.sku).c_str(), ratio(s.sdr * 100.0).c_str(), ratio(a.spatial.str).c_str(),
              display_length(a.spatial.sal_mm, u).c_str());
  std::printf("  lay %s deg from +X (strength %s)\n", display_number(a.spatial.lay_deg, 1e-6).c_str(),
              ratio(a.spatial.lay_strength).c_str());
  print_warnings(r.warnings);
}

void print_trace_table(const MeasuredTrace& t, const TraceReport& r, const std::string& path,
                       LengthUnit u) {
  std::printf("%s: x, z trace, %d points every %s over %s%s\n", path.c_str(), t.points,
              display_length(t.spacing_mm, u).c_str(), display_length(t.length_mm, u).c_str(),
              t.resampled ? " (uneven x, resampled)" : "");
  std::printf("\nProfile (ISO 4287), the measured trace\n");
  print_profile_parameters(r.profile, u);
  print_warnings(r.warnings);
}

// A two-column x, z file: the profile side only (an areal side needs a surface).
void run_trace(const TextureCliOptions& o, const TextureOptions& topt, LengthUnit unit) {
  if (!o.cell.empty()) {
    throw InputError("--cell " + o.cell + ": " + o.file + " is an x, z trace, whose step comes "
                     "from its x column");
  }
  if (!o.export_path.empty()) {
    throw InputError("--export " + o.export_path + ": " + o.file +
                     " is an x, z trace, not a heightmap");
  }
  const double x_mm = unit == LengthUnit::Inch ? kMmPerInch : 1.0;
  const double z_um = o.z_units.empty() ? 1.0 : z_units_to_um(o.z_units);
  const MeasuredTrace trace = read_trace(o.file, x_mm, z_um);
  TraceReport report = trace_report(trace.runs, topt);
  if (trace.missing_points > 0) {
    report.warnings.push_back(std::to_string(trace.missing_points) + " of " +
                              std::to_string(trace.points) +
                              " points have no height (NaN): the trace is split there");
  }
  if (trace.resampled) {
    report.warnings.push_back("x steps differ by more than 1 %: resampled linearly every " +
                              format_number(trace.spacing_mm) + " mm");
  }
  if (o.common.json) {
    print_json(trace_report_json(report, trace.points, trace.missing_points));
  } else {
    print_trace_table(trace, report, o.file, unit);
  }
}

void run_texture(const TextureCliOptions& o) {
  const LengthUnit unit = o.common.length_unit();
  std::string side_note;
  const TextureOptions topt = texture_options_for_file(o.texture, unit, o.file, side_note);
  if (is_trace_file(o.file, parse_input_layout(o.layout))) {
    run_trace(o, topt, unit);
    return;
  }
  HeightmapReadOptions ropt;
  if (!o.cell.empty()) ropt.cell_mm = parse_positive_length_mm(o.cell, unit, "--cell");
  if (!o.z_units.empty()) {
    z_units_to_um(o.z_units);  // validates the value before reading
    ropt.z_units = o.z_units;
  }
  StageTimer timer;
  const HeightmapFile file = read_heightmap(o.file, ropt);
  print_stage(o.common.verbose, "read", timer.lap());
  TextureReport report = texture_report(file.field, topt);
  if (!side_note.empty()) report.warnings.push_back(side_note);
  print_stage(o.common.verbose, "texture", timer.lap());
  if (!o.export_path.empty()) {
    write_file_atomic(o.export_path, encode_heightmap(file.field, o.export_path));
    print_stage(o.common.verbose, "export", timer.lap());
  }
  if (o.common.json) {
    print_json(texture_report_json(report));
  } else {
    print_table(file, report, o.file, unit);
  }
}

}  // namespace

void setup_texture(CLI::App& sub) {
  auto opts = std::make_shared<TextureCliOptions>();
  sub.add_option("file", opts->file,
                 "Heightmap: .npy (um), .csv grid (um), .xyz X Y Z list (mm, mm, um), .sdf or .x3p "
                 "(metres); or a measured trace: rows of x (mm, or --units) and z (um, or "
                 "--z-units)")
      ->required();
  sub.add_option("--cell", opts->cell,
                 "Cell size for .npy/.csv (else report.json beside the file gives cell_mm)");
  add_texture_flags(sub, opts->texture);
  sub.add_option("--z-units", opts->z_units,
                 "Height unit of .npy/.csv/.xyz values: um (default), nm, mm, m");
  // Reason for the flag: measurement labs exchange X3P/SDF; this converts a simulated height.npy.
  sub.add_option("--export", opts->export_path,
                 "Also save the heightmap as .npy, .csv, .xyz, .sdf or .x3p");
  // Reason for the flag: a two-column CSV is a stylus trace by the auto rule; a real grid two
  // cells wide (or a trace saved as .dat) needs a way to say so.
  sub.add_option("--layout", opts->layout,
                 "How a text file is read: auto (every row two numbers = an x, z trace), trace, "
                 "or grid")
      ->capture_default_str();
  add_common_flags(sub, opts->common);
  sub.callback([opts] { run_texture(*opts); });
}

}  // namespace cuspmap

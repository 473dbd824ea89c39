// `cuspmap simulate JOB.toml --out DIR` (or `--gcode FILE` with tool flags): runs the pipeline
// and writes height.npy, height.png, shaded.png, profile.png and report.json (+ an HTML page);
// a streamed floor writes height.npy only with --npy, band by band, after a free-space check.
// cli/ holds no computation: flags -> job/ -> run_job -> io/ encoders -> OutputDir.
#include <cstdint>
#include <cstdio>
#include <future>
#include <memory>
#include <optional>
#include <string>

#include "cli/command.h"
#include "cli/shop_flag.h"
#include "cli/output_dir.h"
#include "cli/progress_bar.h"
#include "cli/sim_flags.h"
#include "cli/texture_flags.h"
#include "core/free_space.h"
#include "core/input_error.h"
#include "core/stage_timer.h"
#include "core/write_file_atomic.h"
#include "cusp/kinematic_limits.h"
#include "report/html_report.h"
#include "report/path_svg.h"
#include "io/npy.h"
#include "io/moves_csv.h"
#include "io/npy_band_writer.h"
#include "core/display_quantity.h"
#include "report/simulation_pictures.h"
#include "job/job.h"
#include "job/run_job.h"
#include "job/validate_cutter.h"
#include "path/gcode_d_radius.h"

namespace cuspmap {
namespace {

struct SimulateOptions {
  CommonOptions common;
  ShopFlag shop;  ///< --shop profile
  SimFlags sim;
  TextureFlags texture;
  std::string job_file;
  std::string out;
  std::string report_html;
  // G-code mode: the program plus the tool described by flags.
  std::string gcode;
  std::string tool = "ball";
  std::string diameter;
  std::string corner_radius = "0";
  std::string dish = "0";
  int teeth = 2;
  std::string cell = "0.01mm";
  std::string floor_z = "0";
  double rpm = 10000.0;
  bool tooth_marks = false;
  bool units_given = false;
  bool stream = false;
  bool npy = false;
  std::string block_delete = "on";
  std::string d_radius;  ///< --d-radius "1=3mm,2=2.5": the D-word table of G41/G42
};

// A Job from --gcode and the tool flags (no job file).
Job gcode_job(const SimulateOptions& o) {
  const LengthUnit unit = o.common.length_unit();
  Job job;
  job.source = o.gcode;
  job.name = o.gcode.substr(o.gcode.find_last_of('/') + 1);
  job.units = unit;
  if (o.tool == "ball") {
    job.cutter.shape = CutterShape::Ball;
  } else if (o.tool == "bullnose") {
    job.cutter.shape = CutterShape::BullNose;
  } else if (o.tool == "flat") {
    job.cutter.shape = CutterShape::Flat;
  } else {
    throw InputError("--tool '" + o.tool + "': allowed values are ball, bullnose, flat");
  }
  if (o.diameter.empty()) throw InputError("--diameter is required with --gcode");
  job.cutter.diameter_mm = parse_length_mm(o.diameter, unit, "--diameter");
  job.cutter.corner_radius_mm = parse_length_mm(o.corner_radius, unit, "--corner-radius");
  job.cutter.dish_deg = parse_angle_deg(o.dish, "--dish");
  job.cutter.teeth = o.teeth;
  validate_cutter(job.cutter, NameStyle::Flag);
  job.patch.cell_mm = parse_positive_length_mm(o.cell, unit, "--cell");
  job.patch.floor_z_mm = parse_length_mm(o.floor_z, unit, "--floor-z");
  job.patch_from_program = true;
  if (!(o.rpm > 0)) throw InputError("--rpm " + format_number(o.rpm) + ": must be > 0");
  job.cut.rpm = o.rpm;
  job.path.kind = PathKind::Gcode;
  job.path.file = o.gcode;
  job.sim.tooth_marks = o.tooth_marks;
  return job;
}

void print_summary(const Job& job, const JobRun& run, const OutputDir& dir, LengthUnit units) {
  const auto& rough = run.texture.profile.roughness;
  const auto& areal = run.texture.areal.parameters;
  std::printf("%s\n", job.name.c_str());
  std::printf("  tool    %s\n  path    %s, %zu moves\n", describe_tool(job.cutter, units).c_str(),
              describe_path(job.path, units).c_str(), run.built.path.moves.size());
  std::printf("  Ra %s (ISO 1302:1992 %s)  Rz %s  cut-off %s\n",
              display_roughness(rough.a_um, units).c_str(),
              run.texture.profile.iso1302_grade.c_str(),
              display_roughness(rough.z_um, units).c_str(),
              display_cutoff(run.texture.profile.cutoff_mm, units).c_str());
  if (const std::string fine = fine_ra_caution(rough.a_um, units); !fine.empty()) {
    std::printf("  caution: %s\n", fine.c_str());
  }
  std::printf("  Sa %s  Sz %s  cusp %s\n", display_roughness(areal.sa_um, units).c_str(),
              display_roughness(areal.sz_um, units).c_str(),
              display_roughness(run.cusp_um, units).c_str());
  std::printf("  highest point %s above nominal, lowest %s\n",
              display_roughness(run.highest_point_um, units).c_str(),
              display_roughness(run.lowest_point_um, units).c_str());
  std::printf("  path %s, cycle %s\n", display_length(run.path_length_mm, units).c_str(),
              display_time(run.cycle_time_s).c_str());
  if (const std::string margin = margin_passes_note(run.built); !margin.empty()) {
    std::printf("  note: %s\n", margin.c_str());
  }
  for (const PathWarning& w : run.built.warnings) {
    std::printf("  warning: %s%s\n", w.line > 0 ? ("line " + std::to_string(w.line) + ": ").c_str() : "",
                w.message.c_str());
  }
  for (const std::string& w : run.texture.warnings) std::printf("  note: %s\n", w.c_str());
  if (run.streamed) {
    std::printf("  streamed: %d bands of %d rows, peak grid %s MiB; pictures show %d x %d cell "
                "block means\n",
                run.bands, run.band_rows,
                display_number(static_cast<double>(run.peak_grid_bytes) / (1 << 20), 0.0).c_str(),
                run.overview_cells_per_pixel, run.overview_cells_per_pixel);
  }
  for (const std::string& k : job.ignored_keys) std::printf("  ignored: %s\n", k.c_str());
  std::printf("  model: %s\n", kKinematicBestCase);
  std::printf("  wrote %zu files to %s/\n", dir.written().size(), dir.path().c_str());
  std::printf(
      "  Before cutting: prove the program on the machine as its maker instructs (guards, "
      "workholding, rotating tools); follow local codes and licensed practice.\n");
}

void run_simulate(const SimulateOptions& o, bool units_flag_given) {
  StageTimer total;
  ShopFlag shop = o.shop;
  shop.load();
  if (o.job_file.empty() == o.gcode.empty()) {
    throw InputError("give either a job file or --gcode FILE (with --tool and --diameter)");
  }
  Job job = o.gcode.empty() ? load_job(o.job_file) : gcode_job(o);
  job.path.block_delete = o.block_delete == "on";
  const LengthUnit units = units_flag_given ? o.common.length_unit() : job.units;
  if (!o.d_radius.empty()) {
    job.path.d_radius_mm = parse_d_radius_list(o.d_radius, units, "--d-radius");
  }
  RunOptions ropt;
  ropt.threads = o.sim.threads;
  ropt.stream = o.stream ? StreamMode::Always : StreamMode::Auto;
  if (!o.sim.max_memory.empty()) ropt.max_memory_bytes = parse_bytes(o.sim.max_memory, "--max-memory");
  ropt.texture = texture_options(o.texture, units);
  const auto range = parse_height_range(o.sim.range, units);
  OutputDir dir(o.out);  // created only once the inputs are known to be good
  // A streamed floor is never held whole: with --npy its height.npy is written band by band as
  // the first pass produces them, once the disk is known to have room for it.
  std::optional<NpyBandWriter> npy;
  if (o.npy) {
    ropt.stream_begin = [&](int nx, int ny) {
      require_free_space("--npy: height.npy", npy_file_bytes(ny, nx),
                         free_space_bytes(dir.path()), dir.path());
      npy.emplace(dir.path_of("height.npy"), nx, ny);
    };
    ropt.stream_band = [&](const Heightfield& band, int j0) { npy->append(band, j0); };
  }
  // An in-memory floor's pictures and height.npy need only the floor: they are made beside the
  // texture report. height.npy is the grid's own bytes behind a header, written to its temp
  // name while the pictures are drawn (the kernel's copy into the page cache overlaps them).
  // Above kBesideTextureMaxCells the pictures follow the texture report instead, so that their
  // grids (~6 bytes per cell) do not add to the report's peak (measured 14 bytes per cell).
  constexpr std::int64_t kBesideTextureMaxCells = std::int64_t{16} << 20;
  std::string npy_header, npy_swapped;
  std::optional<SimulationPictures> floor_pictures;
  ropt.beside_texture = [&](const Heightfield& floor) {
    if (floor.cells() > kBesideTextureMaxCells) return;
    std::future<void> npy_staged = std::async(std::launch::async, [&] {
      dir.stage("height.npy", npy_file_parts(floor, npy_header, npy_swapped));
    });
    floor_pictures = render_floor_pictures(floor, /*streamed=*/false, units, range);
    npy_staged.get();
  };
  // profile.png too, as soon as the report's profile side is done (beside its areal side).
  std::optional<std::string> profile_png;
  ropt.beside_profile = [&](const Heightfield& floor, const ProfileReport& profile) {
    if (floor.cells() > kBesideTextureMaxCells) return;
    profile_png = render_profile_png(floor, profile, units);
  };
  JobRun run;
  {
    ProgressBar bar("sweep");
    ropt.progress = bar.callback();
    ropt.before_sweep = forecast_printer(o.common.verbose);
    run = run_job(job, ropt);
  }
  print_stage(o.common.verbose, "path", run.path_s);
  print_stage(o.common.verbose, "sweep", run.sweep_s);
  print_stage(o.common.verbose, "texture", run.texture_s);
  StageTimer write;
  // No floor pictures yet means the beside work did not run (streamed, or above the cell
  // limit): height.npy was not staged either.
  if (!run.streamed && !floor_pictures) {
    dir.stage("height.npy", npy_file_parts(run.floor, npy_header, npy_swapped));
  }
  SimulationPictures pics = floor_pictures
                                ? std::move(*floor_pictures)
                                : render_floor_pictures(run.floor, run.streamed, units, range);
  if (profile_png) {
    set_profile_picture(std::move(*profile_png), pics);
  } else {
    add_profile_picture(run, units, pics);
  }
  // A streamed floor's pictures show the block-mean overview and its profile.png the centre
  // traces copied at full resolution from the bands; its height.npy (only with --npy) is
  // already on disk under a temp name and is published here.
  if (run.streamed && npy) {
    npy->commit();
    dir.add_committed("height.npy");
  }
  dir.stage("height.png", pics.height_png);
  dir.stage("shaded.png", pics.shaded_png);
  if (pics.has_detail) {
    dir.stage("detail.png", pics.detail_png);
    dir.stage("detail_shaded.png", pics.detail_shaded_png);
  }
  if (!pics.profile_png.empty()) dir.stage("profile.png", pics.profile_png);
  dir.stage("moves.csv", encode_moves_csv(run.built.path));
  dir.stage("path.svg", encode_path_svg(run.built.path, run.patch, job.path.boundary_mm,
                                        run.patch.floor_z_mm));
  if (!o.report_html.empty()) {
    write_file_atomic(o.report_html,
                      render_html_report(simulation_html_report(job, run, pics, units)));
  }
  const double write_s = write.seconds();
  std::vector<std::string> files = dir.written();
  files.push_back("report.json");
  nlohmann::json report =
      simulate_report_json(job, run, pics.facts, files, write_s, total.seconds());
  report["model"] = kKinematicBestCase;
  const std::string fine = fine_ra_caution(run.texture.profile.roughness.a_um);
  report["cautions"] = fine.empty() ? nlohmann::json::array() : nlohmann::json::array({fine});
  if (pics.has_detail) {
    const DetailWindow& w = pics.detail;
    report["detail"] = {{"x0_mm", w.x0_mm},         {"y0_mm", w.y0_mm},
                        {"size_x_mm", w.size_x_mm}, {"size_y_mm", w.size_y_mm},
                        {"Sq_um", w.sq_um},         {"zoom", pics.detail_shaded.zoom}};
  }
  report["memory"] = {{"mode", run.streamed ? "streamed" : "in-memory"},
                      {"peak_grid_bytes", run.peak_grid_bytes}};
  if (run.streamed) {
    report["cell_mm"] = run.patch.cell_mm;
    report["grid"]["nx"] = run.grid_nx;
    report["grid"]["ny"] = run.grid_ny;
    report["memory"]["bands"] = run.bands;
    report["memory"]["band_rows"] = run.band_rows;
    report["memory"]["overview_cells_per_pixel"] = run.overview_cells_per_pixel;
  }
  if (shop.active()) report["shop"] = shop_ra_json(shop, run.texture.profile.roughness.a_um);
  dir.stage("report.json", report.dump(2) + "\n");
  dir.publish();
  print_stage(o.common.verbose, "write", write.seconds());
  if (o.common.json) {
    print_json(report);
  } else {
    print_summary(job, run, dir, units);
    if (shop.active()) {
      std::printf("  %s\n", shop_ra_text(shop, run.texture.profile.roughness.a_um, units).c_str());
    }
  }
}

}  // namespace

void setup_simulate(CLI::App& sub) {
  auto o = std::make_shared<SimulateOptions>();
  sub.add_option("job", o->job_file, "Job file (TOML): [patch], [tool], [cut], [path], [sim]");
  sub.add_option("--out", o->out, "Output folder (created if missing; other files are left alone)")
      ->required();
  sub.add_option("--report", o->report_html, "Also write a self-contained HTML page here");
  // Reason for the G-code flags: users want to see their own program without writing a job file.
  sub.add_option("--gcode", o->gcode, "Simulate this RS-274 program instead of a job file");
  sub.add_option("--tool", o->tool, "With --gcode: ball, bullnose or flat")->capture_default_str();
  sub.add_option("--diameter", o->diameter, "With --gcode: tool diameter");
  sub.add_option("--corner-radius", o->corner_radius, "With --gcode: bull-nose corner radius");
  sub.add_option("--dish", o->dish, "With --gcode: end-face dish angle, deg");
  sub.add_option("--teeth", o->teeth, "With --gcode: number of teeth")->check(CLI::Range(1, 64));
  sub.add_option("--cell", o->cell, "With --gcode: grid cell size")->capture_default_str();
  sub.add_option("--floor-z", o->floor_z, "With --gcode: nominal floor Z in program coordinates")
      ->capture_default_str();
  sub.add_option("--rpm", o->rpm, "With --gcode: spindle speed, rev/min")->capture_default_str();
  sub.add_flag("--tooth-marks", o->tooth_marks, "With --gcode: sweep tooth by tooth");
  // Reason for the flag: a controller's block delete switch decides whether '/' lines run.
  sub.add_option("--block-delete", o->block_delete,
                 "G-code block delete switch: on skips lines starting with '/', off runs them")
      ->check(CLI::IsMember({"on", "off"}))
      ->capture_default_str();
  // Reason for the flag: G41/G42 D words name the control's tool offsets, which are not in the
  // program; with --gcode there is no job file to carry [path] d_radius.
  sub.add_option("--d-radius", o->d_radius,
                 "G-code D-word table for G41/G42: D=RADIUS pairs, e.g. 1=3mm,2=2.5 (replaces "
                 "[path] d_radius; default: every D but D0 is the tool radius)");
  sub.add_flag("--stream", o->stream,
               "Sweep in bands even when the grid fits the memory limit (automatic above it)");
  // Reason for the flag: a streamed floor's .npy can be tens of GB, so it is written on request.
  sub.add_flag("--npy", o->npy,
               "Also write height.npy when the floor is streamed (band by band; refused when the "
               "--out disk lacks room); in-memory runs always write it");
  add_sim_flags(sub, o->sim);
  add_texture_flags(sub, o->texture);
  add_common_flags(sub, o->common);
  add_shop_flag(sub, o->shop);
  sub.footer(cautions_help_text(standard_cautions()));
  CLI::App* app = &sub;
  sub.callback([o, app] { run_simulate(*o, app->count("--units") > 0); });
}

}  // namespace cuspmap

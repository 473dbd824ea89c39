// report.json for `simulate` (DESIGN.md contract keys, mm/um/s) with the settings used.
// Inputs: Job, JobRun, ImageFacts; output: nlohmann::json.
#include "io/simulate_report.h"

#include "io/texture_json.h"

namespace cuspmap {
namespace {

const char* shape_name(CutterShape s) {
  switch (s) {
    case CutterShape::Ball:
      return "ball";
    case CutterShape::BullNose:
      return "bullnose";
    case CutterShape::Flat:
      return "flat";
  }
  return "";
}

const char* kind_name(PathKind k) {
  switch (k) {
    case PathKind::Raster:
      return "raster";
    case PathKind::Offset:
      return "offset";
    case PathKind::Spiral:
      return "spiral";
    case PathKind::Trochoidal:
      return "trochoidal";
    case PathKind::Gcode:
      return "gcode";
  }
  return "";
}

nlohmann::json tool_json(const Cutter& c) {
  return {{"shape", shape_name(c.shape)},
          {"diameter_mm", c.diameter_mm},
          {"corner_radius_mm", c.effective_corner_mm()},
          {"dish_deg", c.dish_deg},
          {"teeth", c.teeth},
          {"tilt_deg", c.tilt_deg},
          {"tilt_toward_deg", c.tilt_toward_deg},
          {"runout_mm", c.runout_mm},
          {"axial_offsets_um", c.axial_offsets_um}};
}

nlohmann::json path_json(const Job& job, const JobRun& run) {
  const PathSpec& p = job.path;
  nlohmann::json j = {{"kind", kind_name(p.kind)},
                      {"moves", run.built.path.moves.size()},
                      {"feed_mm_per_min", job.cut.feed_mm_per_min},
                      {"rpm", job.cut.rpm},
                      {"spindle", run.built.spindle == SpindleDirection::Cw ? "cw" : "ccw"},
                      {"rapid_mm_per_min", job.cut.rapid_mm_per_min},
                      {"feed_per_tooth_mm", job.cut.feed_mm_per_min / (job.cut.rpm * job.cutter.teeth)}};
  if (p.kind == PathKind::Gcode) {
    j["file"] = p.file;
  } else {
    j["stepover_mm"] = p.stepover_mm;
    j["angle_deg"] = p.angle_deg;
    j["direction"] = p.direction == RasterDirection::OneWay ? "one-way" : "zigzag";
  }
  if (p.kind == PathKind::Raster) {
    j["margin_passes_each_side"] = run.built.margin_passes;
    j["program_moves"] = program_moves(run.built).moves.size();
  }
  nlohmann::json warnings = nlohmann::json::array();
  for (const PathWarning& w : run.built.warnings) {
    warnings.push_back({{"line", w.line}, {"message", w.message}});
  }
  j["warnings"] = warnings;
  return j;
}

}  // namespace

nlohmann::json simulate_report_json(const Job& job, const JobRun& run, const ImageFacts& images,
                                    const std::vector<std::string>& files, double write_s,
                                    double elapsed_s) {
  const Heightfield& hf = run.floor;
  nlohmann::json r;
  r["job"] = job.name;
  r["cell_mm"] = hf.cell_mm;
  r["size_mm"] = {run.patch.size_x_mm, run.patch.size_y_mm};
  r["grid"] = {{"nx", hf.nx},
               {"ny", hf.ny},
               {"origin_mm", {hf.origin_x_mm, hf.origin_y_mm}},
               {"floor_z_mm", run.patch.floor_z_mm},
               {"cell_centres", "((i + 0.5) cell, (j + 0.5) cell) from the origin; rows along Y"},
               {"reached_cells", run.texture.reached_cells}};
  r["areal"] = areal_json(run.texture.areal);
  r["profile"] = profile_json(run.texture.profile);
  r["texture_warnings"] = run.texture.warnings;
  r["path_length_mm"] = run.path_length_mm;
  r["cycle_time_s"] = run.cycle_time_s;
  r["cusp_um"] = run.cusp_um;
  r["cusp_crests"] = run.cusp_crests;
  r["highest_point_um"] = run.highest_point_um;
  r["lowest_point_um"] = run.lowest_point_um;
  if (run.walled) {
    r["walls"] = {{"rule", "cells within R of the wall (outside the tool-centre region) are left "
                           "out of the floor: NaN in height.npy, in no statistic"},
                  {"cells", run.walls.cells},
                  {"highest_point_um", run.walls.highest_point_um},
                  {"lowest_point_um", run.walls.lowest_point_um}};
  }
  r["tool"] = tool_json(job.cutter);
  r["path"] = path_json(job, run);
  r["sweep"] = {{"mode", job.sim.tooth_marks ? "tooth-resolved" : "envelope"},
                {"moves_swept", run.sweep.moves_swept},
                {"moves_skipped", run.sweep.moves_skipped},
                {"cell_updates", run.sweep.cell_updates}};
  r["images"] = {{"height_png",
                  {{"black_um", images.height_lo_um},
                   {"lightest_um", images.height_hi_um},
                   {"um_per_gray_level", images.um_per_level},
                   {"cells_per_pixel", images.cells_per_pixel}}},
                 {"shaded_png",
                  {{"light_azimuth_deg", images.light_azimuth_deg},
                   {"light_elevation_deg", images.light_elevation_deg},
                   {"vertical_exaggeration", images.exaggeration},
                   {"cells_per_pixel", images.cells_per_pixel}}}};
  r["ignored_keys"] = job.ignored_keys;
  r["files"] = files;
  r["elapsed_s"] = elapsed_s;
  r["timings"] = {{"path_s", run.path_s},
                  {"sweep_s", run.sweep_s},
                  {"texture_s", run.texture_s},
                  {"write_s", write_s}};
  return r;
}

}  // namespace cuspmap

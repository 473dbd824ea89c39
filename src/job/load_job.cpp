// Reads a TOML job file into a validated Job: schema (known keys per table, nearest-key hints),
// units (bare numbers in `units`, strings with suffixes), defaults and range checks.
// Inputs: job text (TOML); output: Job in mm/deg/mm-per-min. Method: the schema in docs/job-file.md.
#include <algorithm>
#include <array>
#include <cmath>
#include <filesystem>
#include <fstream>
#include <map>

#include "core/input_error.h"
#include "job/job.h"
#include "job/nearest_key.h"
#include "job/toml_fields.h"
#include "job/validate_cutter.h"
#include "path/gcode_d_radius.h"

namespace cuspmap {
namespace {

// Keys each table knows; anything else is an error with a suggestion.
const std::map<std::string, std::vector<std::string>>& known_keys() {
  static const std::map<std::string, std::vector<std::string>> keys = {
      {"", {"units", "name", "patch", "tool", "cut", "path", "sim"}},
      {"patch", {"size", "cell", "origin", "floor_z"}},
      {"tool",
       {"shape", "diameter", "corner_radius", "dish_deg", "teeth", "tilt_deg", "tilt_toward_deg",
        "runout", "runout_phase_deg", "axial_offsets"}},
      {"cut", {"rpm", "feed", "depth", "spindle", "rapid_feed", "retract"}},
      {"path",
       {"kind", "stepover", "angle_deg", "direction", "file", "boundary", "edge", "milling", "outward",
        "loop_diameter", "advance", "d_radius"}},
      {"sim", {"tooth_marks", "threads"}},
  };
  return keys;
}

// Every known key, table-qualified ("tool.diameter"), for suggestions across tables.
std::vector<std::string> qualified() {
  std::vector<std::string> out;
  for (const auto& [t, keys] : known_keys()) {
    if (t.empty()) {
      for (const auto& k : keys) out.push_back(k);
    } else {
      for (const auto& k : keys) out.push_back(t + "." + k);
    }
  }
  return out;
}

void check_keys(const toml::table& table, const std::string& table_name, const TomlFields& f) {
  const auto& keys = known_keys().at(table_name);
  for (const auto& [key, node] : table) {
    const std::string k(key.str());
    if (std::find(keys.begin(), keys.end(), k) != keys.end()) continue;
    const std::string full = table_name.empty() ? k : table_name + "." + k;
    const std::string hint = nearest_key(full, qualified());
    const auto& at = key.source().begin;
    const std::string where = at.line == 0 ? f.where(node)
                                           : f.source() + ":" + std::to_string(at.line) + ":" +
                                                 std::to_string(at.column) + ": ";
    throw InputError(where + "unknown key '" + full + "'" +
                     (hint.empty() ? "" : "; did you mean '" + hint + "'?"));
  }
}

const toml::table& sub_table(const toml::table& root, const std::string& name,
                             const TomlFields& f, bool required) {
  static const toml::table kEmpty;
  const toml::node* node = root.get(name);
  if (node == nullptr) {
    if (required) throw InputError(f.source() + ": missing table [" + name + "]");
    return kEmpty;
  }
  const toml::table* t = node->as_table();
  if (t == nullptr) throw InputError(f.where(*node) + "'" + name + "' must be a table [" + name + "]");
  check_keys(*t, name, f);
  return *t;
}

double require(std::optional<double> v, const std::string& source, const std::string& name) {
  if (!v) throw InputError(source + ": missing required key " + name);
  return *v;
}

void read_patch(const toml::table& t, const TomlFields& f, Job& job) {
  if (auto size = f.lengths_mm(t, "patch", "size", 2)) {
    job.patch.size_x_mm = (*size)[0];
    job.patch.size_y_mm = (*size)[1];
  } else if (job.path.kind == PathKind::Gcode) {
    job.patch_from_program = true;
  } else {
    throw InputError(f.source() + ": missing required key patch.size");
  }
  job.patch.cell_mm = require(f.length_mm(t, "patch", "cell"), f.source(), "patch.cell");
  if (auto origin = f.lengths_mm(t, "patch", "origin", 2)) {
    job.patch.origin_x_mm = (*origin)[0];
    job.patch.origin_y_mm = (*origin)[1];
  }
  job.patch.floor_z_mm = f.length_mm(t, "patch", "floor_z").value_or(0.0);
}

void read_tool(const toml::table& t, const TomlFields& f, Job& job) {
  const auto shape = f.choice(t, "tool", "shape", {"ball", "bullnose", "flat"});
  if (!shape) throw InputError(f.source() + ": missing required key tool.shape");
  Cutter& c = job.cutter;
  c.shape = *shape == "ball" ? CutterShape::Ball
            : *shape == "bullnose" ? CutterShape::BullNose : CutterShape::Flat;
  c.diameter_mm = require(f.length_mm(t, "tool", "diameter"), f.source(), "tool.diameter");
  c.corner_radius_mm = f.length_mm(t, "tool", "corner_radius").value_or(0.0);
  if (c.shape == CutterShape::BullNose && !t.contains("corner_radius")) {
    throw InputError(f.source() + ": missing required key tool.corner_radius (bullnose)");
  }
  c.dish_deg = f.angle_deg(t, "tool", "dish_deg").value_or(0.0);
  if (const auto teeth = f.integer(t, "tool", "teeth")) {
    if (*teeth < 1 || *teeth > 64) {
      f.fail(*t.get("teeth"), "tool", "teeth",
             std::to_string(*teeth) + ": must be a whole number from 1 to 64");
    }
    c.teeth = static_cast<int>(*teeth);
  }
  c.tilt_deg = f.angle_deg(t, "tool", "tilt_deg").value_or(0.0);
  c.tilt_toward_deg = f.angle_deg(t, "tool", "tilt_toward_deg").value_or(0.0);
  c.runout_mm = f.length_mm(t, "tool", "runout").value_or(0.0);
  c.runout_phase_deg = f.angle_deg(t, "tool", "runout_phase_deg").value_or(0.0);
  if (auto offsets = f.lengths_mm(t, "tool", "axial_offsets", 0)) {
    for (double mm : *offsets) c.axial_offsets_um.push_back(mm * kUmPerMm);
  }
  if (c.shape == CutterShape::Ball) {
    for (const char* k : {"corner_radius", "dish_deg"}) {
      if (t.contains(k)) job.ignored_keys.push_back(std::string("tool.") + k + " (ball)");
    }
  }
  if (c.shape == CutterShape::Flat && t.contains("corner_radius")) {
    job.ignored_keys.push_back("tool.corner_radius (flat)");
  }
}

void read_cut(const toml::table& t, const TomlFields& f, Job& job) {
  CutSpec& cut = job.cut;
  cut.rpm = require(f.number(t, "cut", "rpm"), f.source(), "cut.rpm");
  cut.feed_mm_per_min = require(f.length_mm(t, "cut", "feed"), f.source(), "cut.feed");
  cut.depth_mm = f.length_mm(t, "cut", "depth").value_or(0.0);
  if (auto s = f.choice(t, "cut", "spindle", {"cw", "ccw"})) {
    cut.spindle = *s == "cw" ? SpindleDirection::Cw : SpindleDirection::Ccw;
  }
  cut.rapid_mm_per_min = f.length_mm(t, "cut", "rapid_feed").value_or(cut.rapid_mm_per_min);
  cut.retract_mm = f.length_mm(t, "cut", "retract").value_or(cut.retract_mm);
  if (!(cut.rpm > 0)) f.fail(*t.get("rpm"), "cut", "rpm", format_number(cut.rpm) + ": must be > 0");
  if (!(cut.feed_mm_per_min > 0)) {
    f.fail(*t.get("feed"), "cut", "feed", format_number(cut.feed_mm_per_min) + " mm/min: must be > 0");
  }
  if (!(cut.rapid_mm_per_min > 0)) {
    f.fail(*t.get("rapid_feed"), "cut", "rapid_feed", "must be > 0");
  }
  if (!(cut.retract_mm > 0)) f.fail(*t.get("retract"), "cut", "retract", "must be > 0");
}

void read_path(const toml::table& t, const TomlFields& f, Job& job, const std::string& base_dir) {
  PathSpec& p = job.path;
  const auto kind = f.choice(t, "path", "kind", {"raster", "offset", "spiral", "trochoidal", "gcode"});
  if (!kind) throw InputError(f.source() + ": missing required key path.kind");
  p.kind = *kind == "raster"     ? PathKind::Raster
           : *kind == "offset"   ? PathKind::Offset
           : *kind == "spiral"   ? PathKind::Spiral
           : *kind == "trochoidal" ? PathKind::Trochoidal : PathKind::Gcode;
  if (p.kind == PathKind::Gcode) {
    const auto file = f.choice(t, "path", "file", {});
    if (!file) throw InputError(f.source() + ": missing required key path.file (gcode)");
    const std::filesystem::path fp(*file);
    p.file = fp.is_absolute() ? *file : (std::filesystem::path(base_dir) / fp).string();
    for (const char* k : {"stepover", "angle_deg", "direction", "boundary", "edge", "milling", "outward",
                          "loop_diameter", "advance"}) {
      if (t.contains(k)) job.ignored_keys.push_back(std::string("path.") + k + " (gcode)");
    }
    // The D-word table of G41/G42 (docs/gcode.md): D number -> tool radius.
    if (const auto table = f.numbered_lengths_mm(t, "path", "d_radius")) {
      for (const auto& entry : *table) {
        check_d_radius(entry.number, entry.mm, entry.where);
        p.d_radius_mm[static_cast<int>(entry.number)] = entry.mm;
      }
    }
    return;
  }
  const auto stepover = f.length_mm(t, "path", "stepover");
  if (!stepover) throw InputError(f.source() + ": missing required key path.stepover");
  p.stepover_mm = *stepover;
  if (!(p.stepover_mm > 0)) {
    f.fail(*t.get("stepover"), "path", "stepover", format_number(p.stepover_mm) + " mm: must be > 0");
  }
  p.angle_deg = f.angle_deg(t, "path", "angle_deg").value_or(0.0);
  if (auto d = f.choice(t, "path", "direction", {"one-way", "zigzag"})) {
    p.direction = *d == "one-way" ? RasterDirection::OneWay : RasterDirection::Zigzag;
  }
  if (auto m = f.choice(t, "path", "milling", {"climb", "conventional"})) p.climb = *m == "climb";
  p.outward = f.boolean(t, "path", "outward").value_or(true);
  p.loop_diameter_mm = f.length_mm(t, "path", "loop_diameter").value_or(0.0);
  p.advance_mm = f.length_mm(t, "path", "advance").value_or(0.0);
  if (auto e = f.choice(t, "path", "edge", {"open", "wall"})) {
    p.edge = *e == "wall" ? OffsetEdge::Wall : OffsetEdge::Open;
  }
  if (auto pts = f.points_mm(t, "path", "boundary")) {
    if (pts->size() < 3) f.fail(*t.get("boundary"), "path", "boundary", "needs at least 3 points");
    for (const auto& [x, y] : *pts) p.boundary_mm.emplace_back(x, y);
  }
  if (p.kind == PathKind::Trochoidal) {
    if (p.loop_diameter_mm < 0) f.fail(*t.get("loop_diameter"), "path", "loop_diameter", "must be >= 0");
    if (p.advance_mm < 0) f.fail(*t.get("advance"), "path", "advance", "must be >= 0");
  }
  const auto applies = [&](const char* key, bool ok, const char* kinds) {
    if (t.contains(key) && !ok) job.ignored_keys.push_back(std::string("path.") + key + " (" + kinds + ")");
  };
  const bool lanes = p.kind == PathKind::Raster || p.kind == PathKind::Trochoidal;
  applies("angle_deg", lanes || p.kind == PathKind::Spiral, "raster, trochoidal and spiral only");
  applies("direction", lanes, "raster and trochoidal only");
  applies("boundary", p.kind == PathKind::Offset, "offset only");
  applies("edge", p.kind == PathKind::Offset, "offset only");
  applies("milling", p.kind != PathKind::Raster, "offset, spiral and trochoidal only");
  applies("outward", p.kind == PathKind::Spiral, "spiral only");
  applies("loop_diameter", p.kind == PathKind::Trochoidal, "trochoidal only");
  applies("advance", p.kind == PathKind::Trochoidal, "trochoidal only");
  applies("file", false, "gcode only");
  applies("d_radius", false, "gcode only");
}

// Geometry the sweep would compute silently wrong: passes that leave uncut strips between them,
// passes finer than the grid can resolve, a boundary that encloses nothing.
void check_path_geometry(const toml::table& t, const TomlFields& f, const Job& job) {
  const PathSpec& p = job.path;
  if (p.kind == PathKind::Gcode) return;
  const double diameter_mm = job.cutter.diameter_mm;
  // Trochoidal lanes are as wide as the loop plus the tool (loop 0 = half the tool diameter).
  const double loop_mm = p.loop_diameter_mm > 0 ? p.loop_diameter_mm : 0.5 * diameter_mm;
  const double width_mm = p.kind == PathKind::Trochoidal ? diameter_mm + loop_mm : diameter_mm;
  if (p.stepover_mm >= width_mm) {
    f.fail(*t.get("stepover"), "path", "stepover",
           format_number(p.stepover_mm) + " mm: must be smaller than the cut width " +
               format_number(width_mm) + " mm so that neighbouring passes overlap");
  }
  if (!job.patch_from_program && p.stepover_mm < job.patch.cell_mm) {
    f.fail(*t.get("stepover"), "path", "stepover",
           format_number(p.stepover_mm) + " mm: must be at least patch.cell " +
               format_number(job.patch.cell_mm) + " mm; the grid cannot resolve finer passes");
  }
  // Trochoidal loops advancing by less than a cell add moves (a 10 mm lane at 1 nm per loop would
  // be 1e7 loops) without any detail the grid can show.
  if (p.kind == PathKind::Trochoidal && p.advance_mm > 0 && !job.patch_from_program &&
      p.advance_mm < job.patch.cell_mm) {
    f.fail(*t.get("advance"), "path", "advance",
           format_number(p.advance_mm) + " mm: must be 0 (automatic) or at least patch.cell " +
               format_number(job.patch.cell_mm) + " mm");
  }
  if (!p.boundary_mm.empty()) {
    double twice_area = 0.0;  // shoelace formula
    for (size_t k = 0; k < p.boundary_mm.size(); ++k) {
      const Eigen::Vector2d& a = p.boundary_mm[k];
      const Eigen::Vector2d& b = p.boundary_mm[(k + 1) % p.boundary_mm.size()];
      twice_area += a.x() * b.y() - b.x() * a.y();
    }
    // Less than one cell of area cannot be simulated (and 0 means collinear points).
    if (!(std::abs(0.5 * twice_area) >= job.patch.cell_mm * job.patch.cell_mm)) {
      f.fail(*t.get("boundary"), "path", "boundary",
             "encloses no area: needs at least 3 points that are not on one line");
    }
  }
}

}  // namespace

Job parse_job(std::string_view text, const std::string& source_name, const std::string& base_dir) {
  toml::table root;
  try {
    root = toml::parse(text, source_name);
  } catch (const toml::parse_error& e) {
    const auto& b = e.source().begin;
    throw InputError(source_name + ":" + std::to_string(b.line) + ":" + std::to_string(b.column) +
                     ": " + std::string(e.description()));
  }
  Job job;
  job.source = source_name;
  job.name = std::filesystem::path(source_name).stem().string();
  {
    const TomlFields plain(source_name, LengthUnit::Millimetre);
    check_keys(root, "", plain);
    if (auto u = plain.choice(root, "", "units", {"mm", "in"})) {
      job.units = *u == "in" ? LengthUnit::Inch : LengthUnit::Millimetre;
    }
    if (auto n = plain.choice(root, "", "name", {})) job.name = *n;
  }
  const TomlFields f(source_name, job.units);
  const toml::table& path_table = sub_table(root, "path", f, true);
  read_path(path_table, f, job, base_dir);
  read_patch(sub_table(root, "patch", f, true), f, job);
  read_tool(sub_table(root, "tool", f, true), f, job);
  read_cut(sub_table(root, "cut", f, true), f, job);
  const toml::table& sim = sub_table(root, "sim", f, false);
  job.sim.tooth_marks = f.boolean(sim, "sim", "tooth_marks").value_or(false);
  if (auto threads = f.integer(sim, "sim", "threads")) {
    if (*threads < 0 || *threads > 1024) {
      f.fail(*sim.get("threads"), "sim", "threads", "must be from 0 (all cores) to 1024");
    }
    job.sim.threads = static_cast<int>(*threads);
  }
  try {
    validate_cutter(job.cutter, NameStyle::JobKey);
    if (!job.patch_from_program) validate_patch(job.patch, NameStyle::JobKey);
  } catch (const InputError& e) {
    throw InputError(source_name + ": " + e.what());
  }
  check_path_geometry(path_table, f, job);
  return job;
}

Job load_job(const std::string& path) {
  std::error_code ec;
  if (std::filesystem::is_directory(path, ec)) {
    throw InputError(path + ": is a folder; expected a job file (.toml)");
  }
  std::ifstream in(path, std::ios::binary);
  if (!in) throw InputError(path + ": cannot read the job file");
  // Job files are a few kB; refuse anything absurd instead of reading it all into memory. Read in
  // bounded chunks rather than trusting the reported size: a pipe or a device (/dev/zero) has none.
  constexpr std::size_t kMaxJobBytes = std::size_t{1} << 20;
  std::string text;
  std::array<char, 65536> chunk{};
  while (in.read(chunk.data(), chunk.size()) || in.gcount() > 0) {
    text.append(chunk.data(), static_cast<std::size_t>(in.gcount()));
    if (text.size() > kMaxJobBytes) throw InputError(path + ": job file larger than 1 MiB");
  }
  if (in.bad()) throw InputError(path + ": cannot read the job file");
  const std::string base = std::filesystem::path(path).parent_path().string();
  return parse_job(text, path, base.empty() ? "." : base);
}

}  // namespace cuspmap

// Flags of `cuspmap plan` -> PlanRequest (see plan_flags.h). Units are parsed here, at the edge.
#include <algorithm>
#include <optional>
#include <string>
#include <utility>
#include <vector>

#include "cli/plan_flags.h"

#include "cli/command.h"
#include "cli/finish_flags.h"
#include "core/height_units.h"
#include "core/input_error.h"
#include "finish/plan_stepover.h"
#include "finish/simulated_cusp_heights.h"
#include "job/job.h"
#include "job/validate_cutter.h"

namespace cuspmap {
namespace {

// Splits "a,b,c" (also "a x b" for sizes) into trimmed non-empty items.
std::vector<std::string> split(std::string_view text, char sep) {
  std::vector<std::string> items;
  std::size_t start = 0;
  while (start <= text.size()) {
    const std::size_t end = std::min(text.find(sep, start), text.size());
    std::string_view item = text.substr(start, end - start);
    while (!item.empty() && item.front() == ' ') item.remove_prefix(1);
    while (!item.empty() && item.back() == ' ') item.remove_suffix(1);
    if (!item.empty()) items.emplace_back(item);
    start = end + 1;
  }
  return items;
}

// A target height, as `stepover` reads it: bare numbers in um (--units mm) or uin (--units in),
// suffixes as for any length, and ISO 1302:1992 grades for Ra ("N6").
double target_height_um(const std::string& text, LengthUnit units, const char* what) {
  const double um = std::string_view(what) == "--target-ra" ? parse_ra_target_um(text, units, what)
                                                            : parse_height_um(text, units, what);
  if (!(um > 0.0))
    throw InputError(std::string(what) + " " + format_number(um) + " um: must be > 0");
  return um;
}

double parse_rate(const std::string& text, const char* what) {
  if (text.empty()) {
    throw InputError(std::string(what) + " is missing: give the cost of one hour (any currency)");
  }
  const double v = parse_number(text, what);
  if (v < 0.0) throw InputError(std::string(what) + " " + text + ": must be >= 0 per hour");
  return v;
}

double parse_positive_length(const std::string& text, LengthUnit units, const char* what,
                             const char* allowed) {
  std::string t = text;
  if (t.size() > 4 && t.substr(t.size() - 4) == "/min") t.resize(t.size() - 4);
  const double mm = parse_length_mm(t, units, what);
  if (!(mm > 0.0)) throw InputError(std::string(what) + " " + text + ": " + allowed);
  return mm;
}

std::vector<PlanTool> tools_from_flags(const PlanOptions& o, LengthUnit units) {
  std::vector<PlanTool> tools;
  if (o.tools.empty()) {
    const Cutter c = tool_from_flags(o.tool, units);
    tools.push_back({describe_tool(c, units), c, {}});
  } else {
    for (const std::string& item : split(o.tools, ',')) {
      const std::vector<std::string> f = split(item, ':');
      ToolFlags t = o.tool;
      if (f.size() < 2 || f.size() > 3) {
        throw InputError("--tools " + item +
                         ": expected shape:diameter or bullnose:diameter:corner "
                         "(e.g. ball:6mm,flat:0.5in,bullnose:10:1)");
      }
      t.tool = f[0];
      t.diameter = f[1];
      t.corner_radius = f.size() == 3 ? f[2] : "";
      const Cutter c = tool_from_flags(t, units);
      tools.push_back({describe_tool(c, units), c, {}});
    }
  }
  if (!o.stepovers.empty()) {
    std::vector<double> all;
    for (const std::string& s : split(o.stepovers, ',')) {
      all.push_back(parse_positive_length(s, units, "--stepovers", "must be > 0"));
    }
    for (PlanTool& t : tools) {
      for (const double s : all) {
        if (s <= t.cutter.diameter_mm) t.stepovers_mm.push_back(s);
      }
      if (t.stepovers_mm.empty()) {
        throw InputError("--stepovers " + o.stepovers + ": none is <= the diameter of the " +
                         t.label);
      }
    }
  }
  return tools;
}

// The tool, floor, feed and pass direction from the flags.
void floor_from_flags(const PlanOptions& o, LengthUnit units, PlanRequest& r) {
  r.tools = tools_from_flags(o, units);
  if (o.size.empty()) throw InputError("--size is missing: give the floor size, e.g. 120x80");
  std::vector<std::string> xy = split(o.size, o.size.find('x') != std::string::npos ? 'x' : ',');
  if (xy.size() != 2) throw InputError("--size " + o.size + ": expected two lengths, e.g. 120x80");
  r.patch.size_x_mm = parse_positive_length(xy[0], units, "--size", "must be > 0");
  r.patch.size_y_mm = parse_positive_length(xy[1], units, "--size", "must be > 0");
  if (std::max(r.patch.size_x_mm, r.patch.size_y_mm) > kMaxJobLengthMm) {
    throw InputError("--size " + o.size + ": each side must be <= " +
                     format_number(kMaxJobLengthMm) + " mm (1 km)");
  }
  if (o.feed.empty())
    throw InputError("--feed is missing: give the cutting feed, e.g. 1500 (mm/min)");
  r.cut.feed_mm_per_min = parse_positive_length(o.feed, units, "--feed", "must be > 0 per minute");
  r.cut.rapid_mm_per_min =
      parse_positive_length(o.rapid, units, "--rapid", "must be > 0 per minute");
  r.cut.retract_mm = parse_positive_length(o.retract, units, "--retract", "must be > 0");
  if (o.pass_direction == "one-way") {
    r.direction = RasterDirection::OneWay;
  } else if (o.pass_direction == "zigzag") {
    r.direction = RasterDirection::Zigzag;
  } else {
    throw InputError("--pass-direction " + o.pass_direction + ": must be one-way or zigzag");
  }
}

// The tool, floor, feed and pass direction of a raster job, so that each option is swept as
// `simulate` sweeps that job (tooth marks when it asks for them). The window's passes run along
// X, so the tilt direction is taken relative to the job's raster angle.
void floor_from_job(const PlanOptions& o, const Job& job, LengthUnit units, PlanRequest& r) {
  const std::pair<const char*, const std::string*> from_job[] = {{"--tools", &o.tools},
                                                                 {"--diameter", &o.tool.diameter},
                                                                 {"--size", &o.size},
                                                                 {"--feed", &o.feed}};
  for (const auto& [flag, value] : from_job) {
    if (!value->empty()) {
      throw InputError(std::string(flag) + " " + *value + ": --job " + o.job +
                       " gives the tool, floor and feed; drop " + flag + " or --job");
    }
  }
  if (job.path.kind != PathKind::Raster || job.patch_from_program) {
    throw InputError("--job " + o.job +
                     ": plan varies the stepover of a raster over a given patch; this job's "
                     "path is " +
                     describe_path(job.path, units));
  }
  Cutter cutter = job.cutter;
  cutter.tilt_toward_deg -= job.path.angle_deg;
  PlanTool tool{describe_tool(cutter, units), cutter, {}};
  r.tools.push_back(tool);
  if (!o.stepovers.empty()) {
    for (const std::string& s : split(o.stepovers, ',')) {
      const double mm = parse_positive_length(s, units, "--stepovers", "must be > 0");
      if (mm <= cutter.diameter_mm) r.tools.front().stepovers_mm.push_back(mm);
    }
    if (r.tools.front().stepovers_mm.empty()) {
      throw InputError("--stepovers " + o.stepovers + ": none is <= the diameter of the " +
                       tool.label);
    }
  }
  r.patch.size_x_mm = job.patch.size_x_mm;
  r.patch.size_y_mm = job.patch.size_y_mm;
  r.cut = job.cut;
  r.direction = job.path.direction;
}

}  // namespace

PlanRequest request_from_flags(const PlanOptions& o, LengthUnit units) {
  PlanRequest r;
  std::optional<Job> job;
  if (o.job.empty()) {
    floor_from_flags(o, units, r);
  } else {
    job = load_job(o.job);
    floor_from_job(o, *job, units, r);
  }
  if (!(o.pass_overhead_s >= 0.0)) {
    throw InputError("--pass-overhead " + format_number(o.pass_overhead_s) + ": must be >= 0 s");
  }
  r.pass_overhead_s = o.pass_overhead_s;
  PlanSpec& spec = r.spec;
  spec.machine_rate_per_hour = parse_rate(o.machine_rate, "--machine-rate");
  spec.bench_rate_per_hour = parse_rate(o.bench_rate, "--bench-rate");
  if (!o.target_ra.empty()) {
    spec.target_ra_um = target_height_um(o.target_ra, units, "--target-ra");
  }
  if (!o.target_scallop.empty()) {
    spec.target_scallop_um = target_height_um(o.target_scallop, units, "--target-scallop");
  }
  if (o.sand == "when-needed") {
    spec.sanding = SandingMode::WhenNeeded;
  } else if (o.sand == "always") {
    spec.sanding = SandingMode::Always;
  } else {
    throw InputError("--sand " + o.sand + ": must be when-needed or always");
  }
  if (!spec.target_ra_um && !spec.target_scallop_um && spec.sanding == SandingMode::WhenNeeded) {
    throw InputError(
        "plan needs a finish spec: --target-ra or --target-scallop (or --sand always)");
  }
  if (!o.tolerance.empty()) {
    spec.tolerance_um =
        parse_positive_length(o.tolerance, units, "--tolerance", "must be > 0 (the +- band)") *
        kUmPerMm;
  }
  const GritChoice g = grit_choice_from_flags(o.grits);
  spec.grit_table = g.table;
  spec.grits = g.sequence;
  if (job) {
    // The job's own sweep: envelope or tooth by tooth, at its spindle speed and feed.
    const RasterDirection direction = r.direction;
    const WindowSweep sweep{job->sim.tooth_marks, job->cut};
    r.simulate = [direction, sweep](const Cutter& cutter, double stepover_mm) {
      return simulated_cusp_heights(cutter, stepover_mm, direction, sweep);
    };
  } else if (!o.simulate) {
    for (const PlanTool& t : r.tools) require_tilt_along_feed(t.cutter, "add --simulate");
  } else {
    const RasterDirection direction = r.direction;
    r.simulate = [direction](const Cutter& cutter, double stepover_mm) {
      return simulated_cusp_heights(cutter, stepover_mm, direction);
    };
  }
  return r;
}

}  // namespace cuspmap

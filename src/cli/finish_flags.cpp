// Shared flags of `allowance` and `plan`: tool, abrasives, area, and text formatting.
// Parsing only (std::from_chars/to_chars through core/units); the library does the computing.
#include "cli/finish_flags.h"

#include <charconv>
#include <cmath>
#include <cstdio>

#include "core/input_error.h"
#include "io/read_grit_table.h"
#include "report/html_report.h"
#include "job/validate_cutter.h"

namespace cuspmap {

void add_tool_flags(CLI::App& sub, ToolFlags& flags) {
  sub.add_option("--tool", flags.tool, "Cutter shape: ball, bullnose or flat")
      ->capture_default_str();
  sub.add_option("--diameter", flags.diameter, "Cutter diameter (length, e.g. 6mm, 0.25in)");
  sub.add_option("--corner-radius", flags.corner_radius, "Bull-nose corner radius (length)");
  sub.add_option("--dish", flags.dish, "End-face dish angle, deg (flat and bull-nose)")
      ->capture_default_str();
  sub.add_option("--tilt", flags.tilt,
                 "Axis tilt (tram error), deg, |tilt| <= 1; a flat end's is taken along the feed")
      ->capture_default_str();
  sub.add_option("--tilt-toward", flags.tilt_toward,
                 "Direction of the end face's lowest point, deg from +X (the passes run along +X)")
      ->capture_default_str();
}

CutterShape parse_cutter_shape(std::string_view name, std::string_view what) {
  if (name == "ball") return CutterShape::Ball;
  if (name == "bullnose" || name == "bull-nose") return CutterShape::BullNose;
  if (name == "flat") return CutterShape::Flat;
  throw InputError(std::string(what) + " " + std::string(name) +
                   ": must be ball, bullnose or flat");
}

Cutter tool_from_flags(const ToolFlags& flags, LengthUnit units) {
  Cutter c;
  c.shape = parse_cutter_shape(flags.tool, "--tool");
  if (flags.diameter.empty()) throw InputError("--diameter is missing: give the cutter diameter");
  c.diameter_mm = parse_length_mm(flags.diameter, units, "--diameter");
  if (c.shape == CutterShape::BullNose) {
    if (flags.corner_radius.empty()) {
      throw InputError("--corner-radius is missing: a bullnose tool needs its corner radius");
    }
    c.corner_radius_mm = parse_length_mm(flags.corner_radius, units, "--corner-radius");
  }
  c.dish_deg = parse_angle_deg(flags.dish, "--dish");
  c.tilt_deg = parse_angle_deg(flags.tilt, "--tilt");
  c.tilt_toward_deg = parse_angle_deg(flags.tilt_toward, "--tilt-toward");
  validate_cutter(c, NameStyle::Flag);
  return c;
}

void require_tilt_along_feed(const Cutter& cutter, const std::string& hint) {
  // Along the feed within this angle: a tenth of a degree of direction changes the cusp by under
  // 2e-6 relative (cos 0.1 deg), far below the model's other approximations.
  constexpr double kAlongFeedDeg = 0.1;
  if (cutter.shape != CutterShape::Flat || cutter.tilt_deg == 0.0) return;
  const double off = std::remainder(cutter.tilt_toward_deg, 180.0);
  if (std::abs(off) > kAlongFeedDeg) {
    throw InputError("--tilt-toward " + format_number(cutter.tilt_toward_deg) +
                     " deg: the closed-form cusp of a tilted flat end takes the tilt along the "
                     "passes (0 or 180 deg); " +
                     hint);
  }
}

void add_grit_flags(CLI::App& sub, GritFlags& flags) {
  sub.add_option(
      "--grit-table", flags.table_file,
      "Abrasive grade table (TOML; see tests/data/grits_default.toml); default built-in");
  sub.add_option("--grits", flags.grits,
                 "Grades to sand with, coarse to fine, e.g. P180,P240,P320,P400 (default: the "
                 "table's sequence)");
}

GritChoice grit_choice_from_flags(const GritFlags& flags) {
  GritChoice choice;
  choice.table =
      flags.table_file.empty() ? default_grit_table() : read_grit_table(flags.table_file);
  choice.sequence = flags.grits.empty() ? choice.table.sequence
                                        : parse_grit_sequence(flags.grits, choice.table, "--grits");
  return choice;
}

double parse_area_mm2(std::string_view text, LengthUnit units, std::string_view what) {
  const std::string name(what);
  const std::size_t x = text.find('x');
  double area = 0.0;
  if (x != std::string_view::npos) {
    area = parse_length_mm(text.substr(0, x), units, what) *
           parse_length_mm(text.substr(x + 1), units, what);
  } else {
    struct Suffix {
      std::string_view text;
      double mm2;
    };
    static constexpr Suffix kSuffixes[] = {
        {"mm2", 1.0}, {"cm2", 100.0}, {"in2", kMmPerInch * kMmPerInch}};
    double factor = units == LengthUnit::Inch ? kMmPerInch * kMmPerInch : 1.0;
    std::string_view number = text;
    for (const Suffix& s : kSuffixes) {
      if (text.size() > s.text.size() && text.substr(text.size() - s.text.size()) == s.text) {
        number = text.substr(0, text.size() - s.text.size());
        factor = s.mm2;
      }
    }
    area = parse_number(number, what) * factor;
  }
  if (!(area > 0.0)) {
    throw InputError(name + " " + std::string(text) +
                     ": must be > 0 (an area such as 9600, 96cm2, 120x80 or 4.7inx3.1in)");
  }
  if (!(area <= kMaxJobLengthMm * kMaxJobLengthMm)) {
    throw InputError(name + " " + std::string(text) + ": must be <= " +
                     format_number(kMaxJobLengthMm * kMaxJobLengthMm) + " mm2 (1 km2)");
  }
  return area;
}

std::string fixed(double value, int decimals) {
  char buf[64];
  const auto result =
      std::to_chars(buf, buf + sizeof buf, value, std::chars_format::fixed, decimals);
  return std::string(buf, result.ptr);
}

std::string height_text(double um, LengthUnit units) {
  if (units == LengthUnit::Inch) {
    const double uin = um * kUinPerUm;
    return fixed(uin, uin < 100.0 ? 1 : 0) + " uin";
  }
  return fixed(um, um < 10.0 ? 3 : 2) + " um";
}

std::string duration_text(double seconds) {
  if (seconds < 120.0) return fixed(seconds, 0) + " s";
  if (seconds < 7200.0) return fixed(seconds / 60.0, 1) + " min";
  return fixed(seconds / 3600.0, 2) + " h";
}

nlohmann::json grits_json(const GritSequence& sequence) {
  nlohmann::json steps = nlohmann::json::array();
  for (const GritStep& s : sequence.steps) {
    steps.push_back({{"grit", s.grit},
                     {"particle_um", s.particle_um},
                     {"scratch_um", s.scratch_um},
                     {"remove_um", s.remove_um},
                     {"removal_mm3_per_min", s.removal_mm3_per_min},
                     {"volume_mm3", s.volume_mm3},
                     {"time_s", s.time_s},
                     {"Ra_after_um", s.ra_after_um}});
  }
  return steps;
}

void print_cautions() { std::printf("\n%s\n", kShortCaution); }

}  // namespace cuspmap

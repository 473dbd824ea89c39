// One-line descriptions of a job's tool and path for labels, tables and reports.
// Inputs: Cutter/PathSpec (mm, deg); output: short text in the chosen units.
#include <string>

#include "core/display_quantity.h"
#include "job/job.h"

namespace cuspmap {
namespace {

std::string length_text(double mm, LengthUnit units) { return display_length(mm, units); }

}  // namespace

std::string describe_tool(const Cutter& c, LengthUnit units) {
  std::string s = length_text(c.diameter_mm, units);
  switch (c.shape) {
    case CutterShape::Ball:
      s += " ball";
      break;
    case CutterShape::BullNose:
      s += " bull-nose r" + length_text(c.corner_radius_mm, units);
      break;
    case CutterShape::Flat:
      s += " flat";
      break;
  }
  if (c.shape != CutterShape::Ball && c.dish_deg > 0) s += ", " + format_number(c.dish_deg) + " deg dish";
  if (c.tilt_deg != 0) s += ", tilt " + format_number(c.tilt_deg) + " deg";
  if (c.runout_mm > 0) s += ", runout " + display_roughness(c.runout_mm * kUmPerMm, units);
  return s;
}

std::string describe_path(const PathSpec& p, LengthUnit units) {
  const std::string step = length_text(p.stepover_mm, units);
  const std::string dir = p.direction == RasterDirection::OneWay ? "one-way" : "zigzag";
  switch (p.kind) {
    case PathKind::Raster:
      return "raster " + dir + " " + step + " @ " + format_number(p.angle_deg) + " deg";
    case PathKind::Offset:
      return std::string("offset ") + (p.climb ? "climb " : "conventional ") + step;
    case PathKind::Spiral:
      return std::string("spiral ") + (p.outward ? "outward " : "inward ") + step;
    case PathKind::Trochoidal:
      return "trochoidal " + step + " lanes";
    case PathKind::Gcode:
      return "G-code " + p.file.substr(p.file.find_last_of('/') + 1);
  }
  return "";
}

}  // namespace cuspmap

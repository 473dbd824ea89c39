// Range checks of cutter and patch values, with messages that name the value and its limits.
// Inputs: Cutter/Patch in mm and deg; output: nothing, or InputError.
// Method: the model's stated limits (tool/cutter.h); see DESIGN.md "Geometry".
#include "job/validate_cutter.h"

#include <cmath>
#include <string>

#include "core/input_error.h"
#include "core/units.h"

namespace cuspmap {
namespace {

// Dish steeper than this is no longer "slightly concave": the cone model would describe a
// different tool (common practice, no source; real dish angles are 0.5-3 deg, from memory).
constexpr double kMaxDishDeg = 45.0;

[[noreturn]] void reject(const std::string& name, double value, const char* unit,
                         const std::string& allowed) {
  throw InputError(name + " " + format_number(value) + unit + ": " + allowed);
}

void require_finite(const std::string& name, double value) {
  if (!std::isfinite(value)) throw InputError(name + ": must be a finite number");
}

}  // namespace

std::string value_name(NameStyle style, std::string_view table, std::string_view key_job,
                       std::string_view key_flag) {
  if (style == NameStyle::Flag) return "--" + std::string(key_flag);
  return std::string(table) + "." + std::string(key_job);
}

void validate_cutter(const Cutter& c, NameStyle style) {
  const std::string diameter = value_name(style, "tool", "diameter", "diameter");
  const std::string corner = value_name(style, "tool", "corner_radius", "corner-radius");
  const std::string dish = value_name(style, "tool", "dish_deg", "dish");
  const std::string teeth = value_name(style, "tool", "teeth", "teeth");
  const std::string tilt = value_name(style, "tool", "tilt_deg", "tilt");
  const std::string runout = value_name(style, "tool", "runout", "runout");
  require_finite(diameter, c.diameter_mm);
  require_finite(corner, c.corner_radius_mm);
  require_finite(dish, c.dish_deg);
  require_finite(tilt, c.tilt_deg);
  require_finite(value_name(style, "tool", "tilt_toward_deg", "tilt-toward"), c.tilt_toward_deg);
  require_finite(runout, c.runout_mm);
  require_finite(value_name(style, "tool", "runout_phase_deg", "runout-phase"),
                 c.runout_phase_deg);
  if (c.diameter_mm <= 0.0) reject(diameter, c.diameter_mm, " mm", "must be > 0");
  if (c.diameter_mm > kMaxJobLengthMm) {
    reject(diameter, c.diameter_mm, " mm", "must be <= " + format_number(kMaxJobLengthMm) + " mm");
  }
  const double big_r = c.radius_mm();
  if (c.shape == CutterShape::BullNose &&
      (c.corner_radius_mm <= 0.0 || c.corner_radius_mm > big_r)) {
    reject(corner, c.corner_radius_mm, " mm",
           "must be > 0 and <= the tool radius " + format_number(big_r) + " mm");
  }
  if (c.dish_deg < 0.0 || c.dish_deg >= kMaxDishDeg) {
    reject(dish, c.dish_deg, " deg", "must be >= 0 and < 45 deg");
  }
  if (c.teeth < 1) reject(teeth, c.teeth, "", "must be a whole number >= 1");
  if (std::abs(c.tilt_deg) > kMaxTiltDeg) {
    reject(tilt, c.tilt_deg, " deg",
           "must be within +-1 deg (the first-order tilt model's limit)");
  }
  if (c.runout_mm < 0.0 || c.runout_mm >= big_r) {
    reject(runout, c.runout_mm, " mm", "must be >= 0 and smaller than the tool radius");
  }
  if (!c.axial_offsets_um.empty() &&
      c.axial_offsets_um.size() != static_cast<size_t>(c.teeth)) {
    throw InputError(value_name(style, "tool", "axial_offsets", "axial-offsets") + ": has " +
                     std::to_string(c.axial_offsets_um.size()) + " values, needs one per tooth (" +
                     std::to_string(c.teeth) + ")");
  }
  for (double v : c.axial_offsets_um) {
    require_finite(value_name(style, "tool", "axial_offsets", "axial-offsets"), v);
  }
}

void validate_patch(const Patch& p, NameStyle style) {
  const std::string size = value_name(style, "patch", "size", "size");
  const std::string cell = value_name(style, "patch", "cell", "cell");
  require_finite(size, p.size_x_mm);
  require_finite(size, p.size_y_mm);
  require_finite(cell, p.cell_mm);
  const std::string origin = value_name(style, "patch", "origin", "origin");
  const std::string floor_z = value_name(style, "patch", "floor_z", "floor-z");
  require_finite(origin, p.origin_x_mm);
  require_finite(origin, p.origin_y_mm);
  require_finite(floor_z, p.floor_z_mm);
  const std::string within = "must be within +-" + format_number(kMaxJobLengthMm) + " mm";
  const std::string at_most = "must be <= " + format_number(kMaxJobLengthMm) + " mm";
  if (std::abs(p.origin_x_mm) > kMaxJobLengthMm) {
    reject(origin + "[0]", p.origin_x_mm, " mm", within);
  }
  if (std::abs(p.origin_y_mm) > kMaxJobLengthMm) {
    reject(origin + "[1]", p.origin_y_mm, " mm", within);
  }
  if (std::abs(p.floor_z_mm) > kMaxJobLengthMm) reject(floor_z, p.floor_z_mm, " mm", within);
  if (p.size_x_mm > kMaxJobLengthMm) reject(size + "[0]", p.size_x_mm, " mm", at_most);
  if (p.size_y_mm > kMaxJobLengthMm) reject(size + "[1]", p.size_y_mm, " mm", at_most);
  if (p.size_x_mm <= 0.0) reject(size + "[0]", p.size_x_mm, " mm", "must be > 0");
  if (p.size_y_mm <= 0.0) reject(size + "[1]", p.size_y_mm, " mm", "must be > 0");
  if (p.cell_mm <= 0.0) reject(cell, p.cell_mm, " mm", "must be > 0");
  if (p.cell_mm > std::min(p.size_x_mm, p.size_y_mm)) {
    reject(cell, p.cell_mm, " mm", "must not exceed the patch size");
  }
}

}  // namespace cuspmap

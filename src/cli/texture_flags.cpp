// Texture-measurement flags shared by texture, simulate and compare, parsed to TextureOptions.
#include "cli/texture_flags.h"

#include "core/input_error.h"
#include "io/simulate_sidecar.h"

namespace cuspmap {
void add_texture_flags(CLI::App& sub, TextureFlags& flags) {
  sub.add_option("--cutoff", flags.cutoff,
                 "Profile cut-off lambda-c: auto (ISO 4288 rules) or a length")
      ->capture_default_str();
  // Reason for the flag: instruments are often set to a lambda-s other than ISO 3274's pairing.
  sub.add_option("--lambda-s", flags.lambda_s,
                 "Short-wave cut-off: auto (ISO 3274 pairing), 0 (none) or a length")
      ->capture_default_str();
  sub.add_option("--direction", flags.direction,
                 "Profile direction: across (the lay), along, or an angle in deg from +X")
      ->capture_default_str();
  // Reason for the flag: the lay is known from the toolpath when the surface is too isotropic to
  // detect it.
  sub.add_option("--lay", flags.lay,
                 "Lay direction in deg from +X when known (default: detected from the spectrum)");
  sub.add_option("--s-filter", flags.s_filter,
                 "Areal S-filter nesting index (Gaussian, ISO 16610-61); default none");
  sub.add_option("--l-filter", flags.l_filter,
                 "Areal L-filter nesting index (Gaussian); default none (plane removal only)");
}

TextureOptions texture_options(const TextureFlags& o, LengthUnit unit) {
  TextureOptions t;
  if (o.direction == "across") {
    t.direction = ProfileDirection::Across;
  } else if (o.direction == "along") {
    t.direction = ProfileDirection::Along;
  } else {
    t.direction = ProfileDirection::Angle;
    try {
      t.direction_deg = parse_angle_deg(o.direction, "--direction");
    } catch (const InputError&) {
      throw InputError("--direction '" + o.direction +
                       "': allowed are across, along or an angle in deg");
    }
  }
  if (!o.lay.empty()) t.lay_deg = parse_angle_deg(o.lay, "--lay");
  if (o.cutoff != "auto") t.cutoff_mm = parse_positive_length_mm(o.cutoff, unit, "--cutoff");
  if (o.lambda_s != "auto") {
    const double mm = parse_length_mm(o.lambda_s, unit, "--lambda-s");
    if (mm < 0.0)
      throw InputError("--lambda-s " + o.lambda_s + ": must be >= 0 (0 = no short-wave filter)");
    t.lambda_s_um = mm * kUmPerMm;
  }
  if (!o.s_filter.empty()) t.s_filter_mm = parse_positive_length_mm(o.s_filter, unit, "--s-filter");
  if (!o.l_filter.empty()) t.l_filter_mm = parse_positive_length_mm(o.l_filter, unit, "--l-filter");
  return t;
}

TextureOptions texture_options_for_file(const TextureFlags& flags, LengthUnit unit,
                                        const std::string& file, std::string& note) {
  TextureOptions t = texture_options(flags, unit);
  note.clear();
  // The spectrum cannot see the lay of a dished flat's rim arcs; simulate knew it from the path.
  const SimulateSidecar side = read_simulate_sidecar(file);
  std::string taken;
  if (flags.lay.empty() && side.lay_deg) {
    t.lay_deg = side.lay_deg;
    taken = "lay " + format_number(*side.lay_deg) + " deg";
  }
  if (flags.cutoff == "auto" && side.cutoff_mm) {
    t.cutoff_mm = *side.cutoff_mm;
    taken += (taken.empty() ? "" : ", ") + ("cut-off " + format_number(*side.cutoff_mm) + " mm");
  }
  if (!taken.empty()) {
    note = taken + " from " + side.file + ", as simulate measured this floor (--lay/--cutoff "
           "override)";
  }
  return t;
}

}  // namespace cuspmap

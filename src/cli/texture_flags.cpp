// Texture-measurement flags shared by texture, simulate and compare, parsed to TextureOptions.
#include "cli/texture_flags.h"

#include "core/input_error.h"

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

}  // namespace cuspmap

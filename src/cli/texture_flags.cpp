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
  // Reason for the flag: a stylus profilometer's tip bridges narrow valleys; predicted and
  // measured profiles compare only through the same tip (ISO 3274, ISO 16610-41).
  sub.add_option("--stylus-tip", flags.stylus_tip,
                 "Stylus tip radius (ISO 3274 nominal 2, 5 or 10 um): profiles are closed by it "
                 "before the filters; default none");
}

double parse_stylus_tip_um(const std::string& text, LengthUnit unit) {
  // A bare "5" in mm would be a 5 mm tip: refuse radii no stylus has rather than guess.
  constexpr double kLargestTipUm = 50.0;  // 5x ISO 3274's largest nominal 10 um (derived bound)
  const double tip_um = parse_positive_length_mm(text, unit, "--stylus-tip") * kUmPerMm;
  if (tip_um > kLargestTipUm) {
    throw InputError("--stylus-tip " + text + ": " + format_number(tip_um) +
                     " um is larger than any stylus tip; allowed up to 50 um, e.g. 5um (ISO "
                     "3274 nominal 2, 5, 10 um)");
  }
  return tip_um;
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
  if (!o.stylus_tip.empty()) t.stylus_tip_um = parse_stylus_tip_um(o.stylus_tip, unit);
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

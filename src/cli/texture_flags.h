// Flags that choose how texture is measured (cut-off, lambda-s, trace direction, lay, areal
// filters), shared by `texture`, `simulate` and `compare`, and their conversion to TextureOptions.
#pragma once

#include <CLI/CLI.hpp>
#include <string>

#include "core/units.h"
#include "texture/texture_report.h"

namespace cuspmap {

/// The texture flags as typed.
struct TextureFlags {
  std::string cutoff = "auto";       ///< auto (ISO 4288) or a length
  std::string lambda_s = "auto";     ///< auto (ISO 3274 pairing), 0 (none) or a length
  std::string direction = "across";  ///< across | along | angle in deg
  std::string lay;                   ///< known lay direction, deg (else detected)
  std::string s_filter;              ///< areal S-filter nesting index (length)
  std::string l_filter;              ///< areal L-filter nesting index (length)
  std::string stylus_tip;            ///< stylus tip radius (length); empty = no tip
};

/// Adds --cutoff, --lambda-s, --direction, --lay, --s-filter, --l-filter, --stylus-tip.
void add_texture_flags(CLI::App& sub, TextureFlags& flags);

/// Parses a --stylus-tip value to um (bare numbers in `unit`).
/// @throws InputError naming the value when it is not a length in (0, 50] um
double parse_stylus_tip_um(const std::string& text, LengthUnit unit);

/// Parses the flags (lengths in `unit` when bare).
/// @throws InputError naming the flag and value when one is malformed or out of range.
TextureOptions texture_options(const TextureFlags& flags, LengthUnit unit);

/// texture_options() for a heightmap file: where the flags leave them open (--lay not given,
/// --cutoff auto), the lay and fixed cut-off `simulate` used, from the report.json beside the
/// file, so `texture`/`allowance` on a simulated height.npy measure it as `simulate` did.
/// @param[out] note  one line naming what was taken from report.json, or empty
TextureOptions texture_options_for_file(const TextureFlags& flags, LengthUnit unit,
                                        const std::string& file, std::string& note);

}  // namespace cuspmap

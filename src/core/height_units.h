// Parses heights at the edge of the program: cusp and roughness targets in micrometres, with the
// trade's bare units (um with --units mm, uin with --units in: prints say Ra 0.8 or Ra 32) and
// ISO 1302:1992 grade numbers (N1-N12) as Ra targets. Lengths keep core/units.h's suffixes and
// fractions (1/4, 1-1/4in). Method: 1 uin = 0.0254 um exactly; grades from core/iso1302_table.h.
#pragma once

#include <string_view>

#include "core/units.h"

namespace cuspmap {

/// Parses a height (a cusp or roughness target) into micrometres: a length with its suffix
/// ("0.8um", "32uin", "0.2thou", "0.001mm", "1/2thou"), or a bare number in the unit heights are
/// shown in: um with --units mm, uin with --units in.
/// @return micrometres; finite, sign kept (callers check ranges).
/// @throws InputError as parse_length_mm.
double parse_height_um(std::string_view text, LengthUnit bare_unit, std::string_view what);

/// parse_height_um that also reads an ISO 1302:1992 grade number as an Ra target: "N6" is the
/// grade's Ra in micrometres (0.8 um; the table's 32 uin is its rounded inch equivalent).
/// @throws InputError for "N0", "N13" and the like, naming the grades allowed.
double parse_ra_target_um(std::string_view text, LengthUnit bare_unit, std::string_view what);

}  // namespace cuspmap

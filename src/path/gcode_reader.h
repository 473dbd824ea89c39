// Reads the user's RS-274 finishing program into Moves: G0/G1 lines (Z changes become ramps),
// G2/G3 arcs and helices kept as arcs (I/J or R form, full circles, P turns), modal state,
// inch/mm, absolute/incremental, spindle direction; refuses anything else with file:line, the
// word and why. Inputs: a file (streamed, never slurped); outputs mm, mm/min. Cost O(bytes).
// Method: RS274NGC v3 (Kramer, Proctor & Messina, NIST IR 6556, 2000) §3.3-3.8, Table 8 order
// of execution; G90.1/G91.1 and the G2/G3 P word as common controls extend it.
#pragma once

#include <string>
#include <string_view>

#include "core/heightfield.h"
#include "path/build_toolpath.h"
#include "path/move.h"
#include "path/path_spec.h"
#include "tool/cutter.h"

namespace cuspmap {

/// Most "rapid reaches the floor" warnings listed one by one; further ones are counted in one
/// closing warning so a program that rapids across the floor everywhere gives a short report.
inline constexpr int kMaxRapidWarnings = 20;

/// Reads a G-code program file.
///
/// What is read (RS274NGC v3 section in brackets): G0, G1, G2, G3 (§3.5.1-3; centre format with
/// I/J incremental by default, absolute after G90.1, back with G91.1; radius format with the
/// sign rule of §3.5.3.1; full circles in centre format; a P word on G2/G3 adds P - 1 turns),
/// G17 (G18/G19 may be selected, but an arc in them is refused), G20/G21 (1 in = 25.4 mm
/// exactly), G90/G91, G94, F (length units per minute), S, M3/M4/M5, comments "( )" and ";",
/// N line numbers, an O program number alone on its line, '%' lines (§3.1: a leading '%'
/// needs a closing '%' or M2/M30; the program ends at the closing one), block delete '/' (the
/// line is skipped, as with the switch on), numbers without a decimal point at face value
/// (X10 = 10 units). No-ops: M0, M1, M60, M6 and T (one warning: the job's [tool] is used
/// throughout), M7-M9, M48/M49, G4 with its P time (one warning: not counted in cycle time),
/// G40, G43 (with H), G49, G54-G59.3 (one system per program), G61, G61.1, G64 (with P, Q),
/// G80, G98, G99. M2/M30 end the program: later lines are not read (§3.6.1).
///
/// Start position: unknown on every axis until an absolute (G90) word sets it. A G0 whose
/// start is not fully known is a positioning move from an unknown place: it is not emitted
/// (nothing to sweep from). A G1/G2/G3 with an unknown start axis, or a G91 word on an unknown
/// axis, is an error ("position of Z unknown").
/// Units: G21 (mm) until G20/G21 appears; a warning says so when the first move comes first.
/// Feed: F must be set before the first G1/G2/G3 (error otherwise). Rapids carry
/// cut.rapid_mm_per_min and rapid = true; moves above the floor are kept (the sweep skips them
/// quickly; path length and cycle time need them). Zero-length lines are dropped.
/// Spindle: the M3/M4 in force at the first feed move sets BuiltPath::spindle (cw = M3); with
/// no M3/M4 before it, cut.spindle is used and a warning says so; a change of direction between
/// feed moves is an error (one direction per simulated program); feed moves under M5 warn once.
/// Warnings: each rapid that reaches the floor (path/floor_reach.h), with its line number, except
/// a rapid straight up (a retract), which only leaves the floor as the previous move left it.
/// Limits: kMaxGcodeLineChars per line, kMaxGcodeLines lines, kMaxPathMoves moves.
///
/// @param[in] path    G-code file; its name as given starts every message
/// @param[in] cut     rapid rate, fallback spindle direction, rpm (a differing S warns once)
/// @param[in] patch   floor region and floor Z (rapid warnings)
/// @param[in] cutter  validated cutter (its reach, for rapid warnings)
/// @return moves in program order with their line numbers, warnings, spindle direction
/// @throws InputError "<file>:<line>: '<word>': <why>" on the first unsupported or malformed
///         item, an unreadable file, an empty program or one without moves.
BuiltPath read_gcode_file(const std::string& path, const CutSpec& cut, const Patch& patch,
                          const Cutter& cutter);

/// As read_gcode_file, from text in memory (tests, benchmarks); `name` stands for the file.
BuiltPath read_gcode_text(std::string_view text, const std::string& name, const CutSpec& cut,
                          const Patch& patch, const Cutter& cutter);

}  // namespace cuspmap

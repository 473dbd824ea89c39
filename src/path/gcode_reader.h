// Reads the user's RS-274 program into Moves as a controller runs it: modal state, parameters
// and expressions, O-word and M98 subprograms and loops, offsets, canned cycles as plunges;
// reads past codes that move nothing (one warning each) and refuses, with file:line, the word
// and why, what a floor simulation cannot model. Inputs: a file (held in memory to jump between
// lines); outputs mm, mm/min. Cost O(bytes + lines run).
// Method: RS274NGC v3 (Kramer, Proctor & Messina, NIST IR 6556, 2000) §3.3-3.8, Table 8 order
// of execution; G90.1/G91.1, the G2/G3 P word, O-words and M98/M99 as common controls extend it.
#pragma once

#include <map>
#include <string>
#include <string_view>

#include "core/heightfield.h"
#include "path/build_toolpath.h"
#include "path/move.h"
#include "path/path_limits.h"
#include "path/path_spec.h"
#include "tool/cutter.h"

namespace cuspmap {

/// Most "rapid reaches the floor" warnings listed one by one; further ones are counted in one
/// closing warning so a program that rapids across the floor everywhere gives a short report.
inline constexpr int kMaxRapidWarnings = 20;

/// How the program is read.
struct GcodeReadOptions {
  /// The block delete switch (RS274NGC v3 §3.3 item 1): on, lines starting with '/' are skipped;
  /// off, they run. On is the state the NIST interpreter starts in, and what controls ship with
  /// (from memory).
  bool block_delete = true;
  /// Most lines run, loops and calls counted again (kMaxGcodeLinesRun; fuzzing sets fewer).
  long long max_lines_run = kMaxGcodeLinesRun;
  /// D-word table for G41/G42: D number -> tool radius, mm (>= 0). Empty: D0 is 0 and every
  /// other D is the cutter's radius (one warning); a D not in a non-empty table is refused.
  std::map<int, double> d_radius_mm;
};

/// Reads a G-code program file. docs/gcode.md lists what is read, warned and refused.
///
/// Read (RS274NGC v3 section in brackets): G0-G3 (§3.5.1-3) in any plane G17/G18/G19 (G17 arcs
/// stay arcs; G18/G19 arcs become chords within kPlaneArcChordToleranceMm), helices, full circles
/// by I/J/K alone, P turns, R and centre formats; a motion mode with no axis words moves nothing;
/// G80 beside a motion code is dropped; G20/G21 (feeds keep their physical rate), G90/G91,
/// G90.1/G91.1, G94, G4 P or X (seconds); G54-G59.3 with offsets set by G10 L2/L20, G92/G92.1-3;
/// G28/G30/G53 as retracts (warning); G41/G42/G40 cutter radius compensation in G17 with the
/// radius of options.d_radius_mm or the cutter (RS274NGC v3 entry moves and outside-corner arcs,
/// inside corners cut where the offset moves meet); canned cycles G73, G74, G81-G86, G89 as plunges; numbered
/// and named parameters, [..] expressions (§3.3.2-3.3.3); O-word sub/call/return, if/elseif/
/// else, while/do/repeat/break/continue; M98/M99 subprograms of the same file; F, S, M3/M4/M5.
/// Read past with one warning per code: coolant, outputs, orient, overrides, path blending,
/// user and unknown M-codes, messages, M6 and T, G4 times, pauses.
/// Start position: unknown on every axis until an absolute word sets it; a move from an unknown
/// start is not emitted (a feed move warns): the path begins at its end point.
/// Feed: F must be set before the first G1/G2/G3. Spindle: M3/M4 at the first feed move set
/// BuiltPath::spindle, one direction per program. Lines after the first M2/M30 (subprograms
/// excepted) and block-delete lines are counted in one warning each. A program whose feed moves
/// go below patch.floor_z warns with the Z they imply.
/// Limits: kMaxGcodeLineChars per line, kMaxGcodeLines lines, kMaxGcodeLinesRun lines run,
/// kMaxPathMoves moves, kMaxGcodeCallDepth nested calls.
///
/// @param[in] path     G-code file; its name as given starts every message
/// @param[in] cut      rapid rate, fallback spindle direction, rpm (a differing S warns once)
/// @param[in] patch    floor region and floor Z (rapid and floor warnings)
/// @param[in] cutter   validated cutter (its reach, for rapid warnings)
/// @param[in] options  block delete switch
/// @return moves in program order with their line numbers, warnings, spindle direction
/// @throws InputError "<file>:<line>: '<word>': <why>" on the first unsupported or malformed
///         item, an unreadable file, an empty program or one without moves.
BuiltPath read_gcode_file(const std::string& path, const CutSpec& cut, const Patch& patch,
                          const Cutter& cutter, const GcodeReadOptions& options = {});

/// As read_gcode_file, from text in memory (tests, benchmarks); `name` stands for the file.
BuiltPath read_gcode_text(std::string_view text, const std::string& name, const CutSpec& cut,
                          const Patch& patch, const Cutter& cutter,
                          const GcodeReadOptions& options = {});

}  // namespace cuspmap

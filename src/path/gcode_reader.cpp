// RS-274 program -> Moves (see gcode_reader.h): the program is held and indexed, then run line
// by line as the control flow directs; each line is lexed against the parameters, its settings
// applied, sorted into a block and executed in the standard's order. Cost O(bytes + lines run).
// Method: RS274NGC v3 (Kramer, Proctor & Messina 2000) §3.1 (% lines), §3.3.3 (settings after
// the line), §3.6.1 (M2/M30), Table 8 order of execution.
#include "path/gcode_reader.h"

#include <cmath>

#include "core/units.h"
#include "path/gcode_control_flow.h"
#include "path/gcode_interpreter.h"
#include "path/gcode_program.h"
#include "path/path_limits.h"

namespace cuspmap {
namespace {

// A program that cuts below floor_z by more than this warns (1 um: below any cusp reported).
constexpr double kBelowFloorToleranceMm = 0.001;

BuiltPath run_program(GcodeLineReader& reader, const CutSpec& cut, const Patch& patch,
                      const Cutter& cutter, const GcodeReadOptions& options) {
  const GcodeProgram program(reader);
  const std::string& name = program.name();
  if (program.size() == 0) throw_gcode_error(name, 1, "", "empty file: no G-code program in it");
  GcodeParameters parameters;
  GcodeControlFlow flow(program, parameters);
  GcodeInterpreter interp(name, cut, patch, cutter, options.d_radius_mm);
  GcodeLine lexed;
  GcodeBlock block;
  bool seen_words = false, percent_open = false, ended = false;
  std::size_t k = 0, end_line = 0;
  std::string end_word;
  long long run = 0, slashed = 0;
  while (!ended && flow.next(k)) {
    const long long line = static_cast<long long>(k) + 1;
    if (++run > options.max_lines_run) {
      throw_gcode_error(name, line, "", "more than " + std::to_string(options.max_lines_run) +
                                            " lines run: a loop that never ends?");
    }
    lex_gcode_line(program.line(k), name, line, &parameters, options.block_delete, lexed);
    if (lexed.slash) ++slashed;
    // RS274NGC v3 §3.3.3: settings take effect after the whole line is read.
    for (const GcodeAssignment& a : lexed.assignments) {
      if (a.target.number >= 0) {
        parameters.set_numbered(a.target.number, a.value);
      } else {
        parameters.set_named(a.target.name, a.value);
      }
    }
    // A message comment warns once, on a line of its own (the usual form) or beside words.
    if (lexed.message) {
      interp.at_line(line);
      interp.warn_once("MSG", "program messages (MSG, DEBUG, PRINT) read past");
    }
    switch (lexed.kind) {
      case GcodeLineKind::Blank:
      case GcodeLineKind::Deleted: break;
      case GcodeLineKind::Percent:
        if (!seen_words && !percent_open) {
          percent_open = true;
        } else {
          ended = true;  // the closing '%': nothing after it is read (§3.1)
        }
        break;
      case GcodeLineKind::ProgramNumber:
        // The main program running into a subprogram's number has ended (ISO layout).
        if (seen_words && flow.depth() == 0 && program.in_subprogram(k)) {
          ended = true;
          end_line = k;
          end_word = "O" + lexed.oword.label;
        }
        break;
      case GcodeLineKind::OWord: flow.oword(lexed.oword, k); break;
      case GcodeLineKind::Words:
        seen_words = true;
        sort_gcode_block(lexed, name, line, block);
        interp.execute(block, line);
        if (block.call_program) {
          const GcodeValue& p = block['P'];
          if (!p.present || p.value < 0 || std::abs(p.value - std::round(p.value)) > 1e-4) {
            throw_gcode_error(name, line, "M98", "M98 needs P with the subprogram's number");
          }
          const int count = block['L'].present ? static_cast<int>(std::lround(block['L'].value)) : 1;
          flow.call_program(std::to_string(std::llround(p.value)), count, k, "M98 " + p.text);
        } else if (block.return_program && !flow.return_program(k)) {
          interp.warn("M99 in the main program (a jump back to its start on many controls) "
                      "ends it here");
          ended = true;
          end_line = k;
          end_word = "M99";
        }
        if (block.stop == GcodeStop::End) {
          ended = true;
          end_line = k;
          end_word = block.stop_word;
        }
        break;
    }
  }
  if (percent_open && !ended) {
    throw_gcode_error(name, static_cast<long long>(program.size()), "%",
                      "the program opens with a % line but has no closing % line or M2/M30 "
                      "(RS274NGC v3 section 3.1); the file may be cut short");
  }
  if (!end_word.empty()) {
    long long after = 0;
    for (std::size_t j = end_line + 1; j < program.size(); ++j) {
      const std::string_view s = program.line(j);
      const std::size_t first = s.find_first_not_of(" \t");
      if (first != std::string_view::npos && s[first] == '%') break;
      if (!program.blank(j) && !program.in_subprogram(j)) ++after;
    }
    if (after > 0) {
      interp.note(std::to_string(after) + " line" + (after == 1 ? "" : "s") + " after " +
                  end_word + " on line " + std::to_string(end_line + 1) +
                  (after == 1 ? " is" : " are") + " not run (RS274NGC v3 section 3.6.1)");
    }
  }
  if (slashed > 0) {
    interp.note(std::to_string(slashed) + " block-delete line" + (slashed == 1 ? "" : "s") +
                " ('/') " + (options.block_delete ? "skipped: block delete is on (--block-delete "
                                                    "off runs them)"
                                                  : "run: block delete is off"));
  }
  BuiltPath out = interp.finish();
  if (out.path.moves.empty()) {
    throw_gcode_error(name, static_cast<long long>(program.size()), "",
                      "the program has no moves (G0, G1, G2, G3) to simulate");
  }
  return out;
}

}  // namespace

BuiltPath GcodeInterpreter::finish() {
  std::vector<Move> held;
  comp_.flush(held);  // compensation still on at the end: the held move ends at its offset
  emit_all(held);
  line_ = 0;
  if (rapid_warnings_ > kMaxRapidWarnings) {
    warn(std::to_string(rapid_warnings_ - kMaxRapidWarnings) +
         " more rapids (G0) reach the floor; only the first " +
         std::to_string(kMaxRapidWarnings) + " are listed");
  }
  if (any_cut_ && lowest_cut_z_mm_ < patch_.floor_z_mm - kBelowFloorToleranceMm) {
    out_.warnings.push_back(
        {static_cast<int>(lowest_cut_line_),
         "the program cuts down to Z=" + format_number(lowest_cut_z_mm_) + " mm, " +
             format_number(patch_.floor_z_mm - lowest_cut_z_mm_) + " mm below floor_z " +
             format_number(patch_.floor_z_mm) + ": its lowest feed moves imply floor_z = " +
             format_number(lowest_cut_z_mm_)});
  }
  return std::move(out_);
}

BuiltPath read_gcode_file(const std::string& path, const CutSpec& cut, const Patch& patch,
                          const Cutter& cutter, const GcodeReadOptions& options) {
  GcodeLineReader reader = GcodeLineReader::from_file(path);
  return run_program(reader, cut, patch, cutter, options);
}

BuiltPath read_gcode_text(std::string_view text, const std::string& name, const CutSpec& cut,
                          const Patch& patch, const Cutter& cutter,
                          const GcodeReadOptions& options) {
  GcodeLineReader reader = GcodeLineReader::from_text(text, name);
  return run_program(reader, cut, patch, cutter, options);
}

}  // namespace cuspmap

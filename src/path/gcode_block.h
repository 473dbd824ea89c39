// One block (line) of an RS-274 program sorted into what it asks for: the G-codes of each modal
// group, the M-codes, and the value words (X Y Z I J K R F S T P Q H L D). Codes that move
// nothing are listed to be read past; codes that change the geometry or its timing in ways a
// floor simulation cannot model are refused with the word and why, as is every repeat the
// standard forbids.
// Method: RS274NGC v3 (Kramer, Proctor & Messina 2000) §3.3.5 item repeats, §3.4 modal groups
// (Table 4), §3.5 G-codes (Table 5), §3.6 M-codes; G90.1/G91.1 and the G2/G3 P word as common
// controls extend it.
#pragma once

#include <array>
#include <string>
#include <string_view>
#include <vector>

#include "path/gcode_lexer.h"

namespace cuspmap {

/// Motion modes (modal group 1) the reader supports.
enum class GcodeMotion {
  None,    ///< no motion mode yet, or G80 (cancel)
  Rapid,   ///< G0
  Linear,  ///< G1
  ArcCw,   ///< G2
  ArcCcw,  ///< G3
  Cycle,   ///< a canned cycle G73, G74, G81-G86, G89 (GcodeBlock::cycle says which)
};

/// Arc planes (modal group 2).
enum class GcodePlane {
  XY,  ///< G17
  XZ,  ///< G18
  YZ,  ///< G19
};

/// Spindle commands (modal group 7 of the M-codes).
enum class GcodeSpindle {
  Unchanged,  ///< no M3/M4/M5 on the line
  Cw,         ///< M3
  Ccw,        ///< M4
  Stop,       ///< M5
};

/// Program stops (M-code group 4).
enum class GcodeStop {
  None,     ///< no stop on the line
  Pause,    ///< M0, M1, M60: no effect on the path
  End,      ///< M2, M30: nothing after the line is read (§3.6.1)
};

/// A value word's presence, number and text (for messages).
struct GcodeValue {
  bool present = false;  ///< the word is on the line
  double value = 0.0;    ///< its number as written (program units)
  std::string text;      ///< as written, e.g. "X-1.5"
};

/// A block sorted by function. Codes absent from the line keep their "not given" defaults.
struct GcodeBlock {
  // Group 1 motion, with the word that set it (for messages).
  bool has_motion = false;                     ///< a G0/G1/G2/G3/G80 is on the line
  GcodeMotion motion = GcodeMotion::None;      ///< which (None = G80)
  std::string motion_word;                     ///< e.g. "G2"
  bool has_plane = false;                      ///< G17/G18/G19 on the line
  GcodePlane plane = GcodePlane::XY;           ///< which plane
  std::string plane_word;                      ///< e.g. "G18"
  int distance = 0;                            ///< G90 -> +1, G91 -> -1, absent 0
  int arc_distance = 0;                        ///< G90.1 -> +1, G91.1 -> -1, absent 0
  int units = 0;                               ///< G21 (mm) -> +1, G20 (inch) -> -1, absent 0
  int cycle = 0;                               ///< canned cycle number (81 for G81), 0 = none
  bool dwell = false;                          ///< G4 (non-modal): ignored, with its P or X time
  int home = 0;                                ///< G28 -> 28, G30 -> 30, absent 0
  bool machine_coords = false;                 ///< G53 on the line
  bool set_offsets = false;                    ///< G10 on the line (L2 / L20 used)
  int origin_offset = 0;                       ///< G92 -> 920, G92.1 -> 921, G92.2, G92.3
  int cutter_comp = 0;                         ///< G40 -> 40, G41 -> 41, G42 -> 42, absent 0
  std::string cutter_comp_word;                ///< e.g. "G41"
  int retract_mode = 0;                        ///< G98 -> 98, G99 -> 99, absent 0
  bool call_program = false;                   ///< M98 on the line
  bool return_program = false;                 ///< M99 on the line
  bool output_words = false;                   ///< M62-M68 on the line (their P/Q/L words)
  bool override_words = false;                 ///< M48-M53 on the line (M50-M53 take a P word)
  std::vector<std::string> read_past;          ///< codes that move nothing, as "M8: coolant"

  int work_offset_tenths = 0;                  ///< G54..G59.3 x 10 (540..593), 0 = absent
  std::string work_offset_word;                ///< e.g. "G55"
  bool path_control = false;                   ///< G61/G61.1/G64 on the line (P, Q allowed)
  bool tool_length = false;                    ///< G43 on the line (H allowed)
  GcodeSpindle spindle = GcodeSpindle::Unchanged;  ///< M3/M4/M5
  bool tool_change = false;                    ///< M6
  GcodeStop stop = GcodeStop::None;            ///< M0/M1/M60 or M2/M30
  std::string stop_word;                       ///< e.g. "M30"
  // Value words, indexed by letter - 'A'. Only X Y Z I J K R F S T P Q H L D can be present.
  std::array<GcodeValue, 26> values;
  /// The value word for a letter.
  const GcodeValue& operator[](char letter) const { return values[letter - 'A']; }
  /// True when any of X, Y, Z is on the line.
  bool has_axis_words() const { return (*this)['X'].present || (*this)['Y'].present ||
                                       (*this)['Z'].present; }
};

/// Sorts the words of one line into a block.
/// @param[in]  line   a lexed line of kind Words
/// @param[in]  file, line_number  for messages
/// @param[out] block  reset and filled
/// @throws InputError "<file>:<n>: '<word>': <why>" for: G-codes that change the geometry or
///         its timing beyond what cuspmap models (G93/G95 feed modes, G87/G88/G76 cycles,
///         probing, splines, threading, scaling, rotation, polar coordinates, unknown codes),
///         letters other than D F G H I J K L M P Q R S T X Y Z (A B C U V W axes included), two
///         G-codes of one modal group (except G80 beside a motion code: G80 is dropped), two
///         M-codes of one group, a letter repeated, non-integer M/T codes, G codes not a
///         multiple of 0.1, negative S/T/F.
void sort_gcode_block(const GcodeLine& line, std::string_view file, long long line_number,
                      GcodeBlock& block);

}  // namespace cuspmap

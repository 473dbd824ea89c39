// Sorts the words of one RS-274 line into a GcodeBlock (see gcode_block.h), rejecting what the
// reader does not support with the word and the reason. Cost O(words).
// Method: RS274NGC v3 (Kramer, Proctor & Messina 2000) §3.3.2.1 (codes within 0.0001 of an
// integer), §3.3.5 item repeats, §3.4 Table 4 modal groups, §3.5 Table 5, §3.6 M-codes.
#include "path/gcode_block.h"

#include <cmath>
#include <string_view>

#include "path/path_limits.h"

namespace cuspmap {
namespace {

// §3.3.2.1: "a decimal number which is supposed be close to an integer is considered close
// enough if it is within 0.0001 of an integer" (G-codes are compared after multiplying by 10).
constexpr double kCodeIntegerTolerance = 1e-4;

// Modal groups that can appear at most once per line (§3.3.5), by Table 4 group number.
enum Group {
  kNonModal, kMotion, kPlane, kDistance, kArcDistance, kFeedMode, kUnits, kCutterComp,
  kToolLength, kRetract, kCoordSystem, kPathControl, kMStop, kMToolChange, kMSpindle, kMCoolant,
  kMOverride, kGroupCount
};

class BlockSorter {
 public:
  BlockSorter(std::string_view file, long long line_number, GcodeBlock& block)
      : file_(file), line_number_(line_number), b_(block) {}

  void run(const GcodeLine& line) {
    b_ = GcodeBlock{};
    int m_words = 0;
    for (const GcodeWord& w : line.words) {
      switch (w.letter) {
        case 'G': g_code(w); break;
        case 'M':
          if (++m_words > 4) fail(w.text, "more than four M words on one line (RS274NGC allows four)");
          m_code(w);
          break;
        case 'D': case 'F': case 'H': case 'I': case 'J': case 'K': case 'L': case 'P': case 'Q':
        case 'R': case 'S': case 'T': case 'X': case 'Y': case 'Z':
          value_word(w);
          break;
        case 'A': case 'B': case 'C': case 'U': case 'V': case 'W':
          fail(w.text, "rotary and extra axes (A B C U V W) are not supported: cuspmap "
                       "simulates X, Y and Z only");
        default:
          fail(w.text, std::string("unknown or unsupported word ") + w.letter);
      }
    }
    if (b_.dwell && !b_['P'].present && !b_['X'].present) {
      fail(dwell_word_, "a dwell needs a time: P or X (seconds)");
    }
    if (b_.dwell && b_['P'].present && b_['X'].present) {
      fail(b_['X'].text, "a dwell takes its time from P or X, not both");
    }
    const GcodeValue& t = b_['P'].present ? b_['P'] : b_['X'];
    if (b_.dwell && t.value < 0.0) fail(t.text, "a dwell time must be >= 0 s");
    const bool cycle = b_.has_motion && b_.motion == GcodeMotion::Cycle;
    if (b_['H'].present && !b_.tool_length) fail(b_['H'].text, "H is used only with G43");
    if (b_['Q'].present && !b_.path_control && !cycle && !b_.output_words) {
      fail(b_['Q'].text, "Q is used only with G64 and canned cycles (G73, G83)");
    }
    if (b_['L'].present && !b_.set_offsets && !cycle && !b_.call_program && !b_.output_words) {
      fail(b_['L'].text, "L is used only with G10, canned cycles and M98");
    }
  }

 private:
  [[noreturn]] void fail(std::string_view word, std::string_view why) const {
    throw_gcode_error(file_, line_number_, word, why);
  }

  void claim(Group g, const std::string& word) {
    std::string& holder = group_word_[g];
    if (!holder.empty()) {
      fail(word, "two codes of one modal group on one line ('" + holder + "' and '" + word +
                     "'); RS274NGC allows one");
    }
    holder = word;
  }

  void motion(int t, const std::string& word) {
    // G80 beside a motion code (the safe-start line "G0 G80 ..."): G80 is dropped, as
    // interpreters do, whichever comes first; the motion code stands.
    if (t == 800 && b_.has_motion) return;
    if (b_.has_motion && b_.motion == GcodeMotion::None) group_word_[kMotion].clear();
    claim(kMotion, word);
    b_.has_motion = true;
    b_.motion_word = word;
    b_.cycle = 0;
    switch (t) {
      case 0: b_.motion = GcodeMotion::Rapid; break;
      case 10: b_.motion = GcodeMotion::Linear; break;
      case 20: b_.motion = GcodeMotion::ArcCw; break;
      case 30: b_.motion = GcodeMotion::ArcCcw; break;
      case 800: b_.motion = GcodeMotion::None; break;
      default:
        b_.motion = GcodeMotion::Cycle;
        b_.cycle = t / 10;
    }
  }

  // Codes read past are named canonically ("M8" for "M08"), so each warns once.
  void read_past(const GcodeWord& w, const char* what) {
    const int tenths = static_cast<int>(std::lround(w.value * 10.0));
    std::string code(1, w.letter);
    code += std::to_string(tenths / 10);
    if (tenths % 10 != 0) {
      code += '.';
      code += std::to_string(tenths % 10);
    }
    code += ": ";
    code += what;
    b_.read_past.push_back(std::move(code));
  }

  void g_code(const GcodeWord& w) {
    const double tenths_real = w.value * 10.0;
    const double tenths_round = std::round(tenths_real);
    if (std::abs(tenths_real - tenths_round) > 10.0 * kCodeIntegerTolerance || w.value < 0.0 ||
        tenths_round > 10000.0) {
      fail(w.text, "unknown or unsupported G-code");
    }
    const int t = static_cast<int>(tenths_round);
    switch (t) {
      case 0: case 10: case 20: case 30: case 800: case 730: case 740: case 810: case 820:
      case 830: case 840: case 850: case 860: case 890:
        motion(t, w.text);
        return;
      case 40:
        claim(kNonModal, w.text);
        b_.dwell = true;
        dwell_word_ = w.text;
        return;
      case 170: case 180: case 190:
        claim(kPlane, w.text);
        b_.has_plane = true;
        b_.plane = t == 170 ? GcodePlane::XY : t == 180 ? GcodePlane::XZ : GcodePlane::YZ;
        b_.plane_word = w.text;
        return;
      case 200: case 210: claim(kUnits, w.text); b_.units = t == 210 ? 1 : -1; return;
      case 400: case 410: case 420:
        claim(kCutterComp, w.text);
        b_.cutter_comp = t / 10;
        b_.cutter_comp_word = w.text;
        return;
      case 411: case 421:
        fail(w.text, "dynamic cutter compensation (G41.1/G42.1) is not supported; use G41/G42 "
                     "with a D word or post the program with compensation off");
      case 430: claim(kToolLength, w.text); b_.tool_length = true; return;
      case 490: claim(kToolLength, w.text); return;
      case 540: case 550: case 560: case 570: case 580: case 590: case 591: case 592: case 593:
        claim(kCoordSystem, w.text);
        b_.work_offset_tenths = t;
        b_.work_offset_word = w.text;
        return;
      case 610: case 611: case 640:
        claim(kPathControl, w.text);
        b_.path_control = true;
        read_past(w, "path blending (exact stop / tolerance) does not change the "
                          "programmed path");
        return;
      case 900: case 910: claim(kDistance, w.text); b_.distance = t == 900 ? 1 : -1; return;
      case 901: case 911: claim(kArcDistance, w.text); b_.arc_distance = t == 901 ? 1 : -1; return;
      case 940: claim(kFeedMode, w.text); return;
      case 970: return;  // spindle speed in rev/min, the only mode cuspmap reads
      case 690: return;  // rotation off: none is ever on
      case 930:
        fail(w.text, "inverse-time feed (G93) is not supported; post the program with feed per "
                     "minute (G94)");
      case 950:
        fail(w.text, "feed per revolution (G95) is not supported; post the program with feed "
                     "per minute (G94)");
      case 980: case 990: claim(kRetract, w.text); b_.retract_mode = t / 10; return;
      case 760: case 870: case 880:
        fail(w.text, "this canned cycle is not modelled (back boring, manual retract or "
                     "threading); post it expanded into G0/G1 moves");
      case 280: case 300:
        claim(kNonModal, w.text);
        b_.home = t / 10;
        return;
      case 281: case 301:
        claim(kNonModal, w.text);
        read_past(w, "stores a machine home position; no motion");
        return;
      case 530: b_.machine_coords = true; return;
      case 100: claim(kNonModal, w.text); b_.set_offsets = true; return;
      case 920: case 921: case 922: case 923:
        claim(kNonModal, w.text);
        b_.origin_offset = t;
        return;
      case 382: case 383: case 384: case 385:
        fail(w.text, "probing moves are not supported: their end depends on the part");
      case 50: case 51: case 52:
        fail(w.text, "spline moves are not supported; post the program as lines and arcs");
      case 330: case 331:
        fail(w.text, "spindle-synchronized motion (threading) is not supported");
      case 150: case 160:
        fail(w.text, "polar coordinates (G15/G16) are not supported; post the program in "
                     "X/Y coordinates");
      case 500: case 510: case 680:
        fail(w.text, "scaling and rotation (G50/G51/G68) are not supported; post the program "
                     "with them applied");
      case 431: fail(w.text, "dynamic tool length offset is not supported");
      default: fail(w.text, "unknown or unsupported G-code");
    }
  }

  void m_code(const GcodeWord& w) {
    const double r = std::round(w.value);
    if (std::abs(w.value - r) > kCodeIntegerTolerance || w.value < 0.0 || r > 1000.0) {
      fail(w.text, "unknown or unsupported M-code: M codes are whole numbers");
    }
    const int m = static_cast<int>(r);
    switch (m) {
      case 0: case 1: case 60:
        claim(kMStop, w.text);
        b_.stop = GcodeStop::Pause;
        b_.stop_word = w.text;
        read_past(w, "program pause; not counted in cycle_time_s");
        return;
      case 2: case 30:
        claim(kMStop, w.text);
        b_.stop = GcodeStop::End;
        b_.stop_word = w.text;
        return;
      case 3: case 4: case 5:
        claim(kMSpindle, w.text);
        b_.spindle = m == 3 ? GcodeSpindle::Cw : m == 4 ? GcodeSpindle::Ccw : GcodeSpindle::Stop;
        return;
      case 6: claim(kMToolChange, w.text); b_.tool_change = true; return;
      case 7: case 8: case 9:
        claim(kMCoolant, w.text);
        read_past(w, "coolant");
        return;
      case 19: read_past(w, "spindle orient"); return;
      case 48: case 49: case 50: case 51: case 52: case 53:
        claim(kMOverride, w.text);
        b_.override_words = true;
        read_past(w, "feed/speed override switch; programmed feeds are used");
        return;
      case 62: case 63: case 64: case 65: case 66: case 67: case 68:
        b_.output_words = true;
        read_past(w, "digital/analog output or input wait");
        return;
      case 70: case 71: case 72: case 73: read_past(w, "modal state save/restore"); return;
      case 98: claim(kMStop, w.text); b_.call_program = true; return;
      case 99: claim(kMStop, w.text); b_.return_program = true; return;
      default:
        read_past(w, m >= 100 && m <= 199 ? "user M-code" : "M-code cuspmap does not know; "
                                                                  "assumed to move nothing");
    }
  }

  void value_word(const GcodeWord& w) {
    GcodeValue& v = b_.values[w.letter - 'A'];
    if (v.present) {
      fail(w.text, std::string("a second ") + w.letter + " word on the line ('" + v.text +
                       "' came first); RS274NGC allows one per letter");
    }
    v.present = true;
    v.value = w.value;
    v.text = w.text;
    if (w.letter == 'F' && !(w.value > 0.0)) fail(w.text, "feed rate must be > 0 (per minute, G94)");
    if (w.letter == 'S' && w.value < 0.0) fail(w.text, "spindle speed must be >= 0 rev/min");
    static_assert(kMaxGcodeCoordinate == 1e6, "the message below states the bound");
    if (std::string_view("XYZIJKRQ").find(w.letter) != std::string_view::npos &&
        !(std::abs(w.value) <= kMaxGcodeCoordinate)) {
      fail(w.text, "coordinates must lie within +-1000000 program units (1 km in mm); a larger "
                   "number is a corrupt or mis-scaled program");
    }
    if ((w.letter == 'T' || w.letter == 'D' || w.letter == 'L') && (w.value < 0.0 || std::abs(w.value - std::round(w.value)) >
                                                 kCodeIntegerTolerance)) {
      fail(w.text, w.letter == 'T' ? "a tool number is a whole number >= 0"
                   : w.letter == 'D' ? "a D number (tool radius entry) is a whole number >= 0"
                                     : "an L number is a whole number >= 0");
    }
  }

  std::string_view file_;
  long long line_number_;
  GcodeBlock& b_;
  std::array<std::string, kGroupCount> group_word_;
  std::string dwell_word_;
};

}  // namespace

void sort_gcode_block(const GcodeLine& line, std::string_view file, long long line_number,
                      GcodeBlock& block) {
  BlockSorter(file, line_number, block).run(line);
}

}  // namespace cuspmap

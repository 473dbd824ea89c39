// RS-274 program -> Moves (see gcode_reader.h): one pass over the lines, each lexed, sorted into
// a block and executed in the standard's order against the modal state. Cost O(bytes).
// Method: RS274NGC v3 (Kramer, Proctor & Messina 2000) §3.3-3.8 (Table 8 order of execution).
#include "path/gcode_reader.h"

#include <array>
#include <cmath>
#include <optional>

#include "core/units.h"
#include "path/floor_reach.h"
#include "path/gcode_arc.h"
#include "path/gcode_block.h"
#include "path/gcode_line_reader.h"
#include "path/path_limits.h"

namespace cuspmap {
namespace {

// An S word within half a rev/min of [cut] rpm is the same speed (S is written as an integer).
constexpr double kRpmMatchTolerance = 0.5;

const char* motion_name(GcodeMotion m) {
  switch (m) {
    case GcodeMotion::Rapid: return "G0";
    case GcodeMotion::Linear: return "G1";
    case GcodeMotion::ArcCw: return "G2";
    case GcodeMotion::ArcCcw: return "G3";
    case GcodeMotion::None: break;
  }
  return "G80";
}

class GcodeInterpreter {
 public:
  GcodeInterpreter(const std::string& name, const CutSpec& cut, const Patch& patch,
                   const Cutter& cutter)
      : name_(name), cut_(cut), patch_(patch), cutter_(cutter) {
    out_.spindle = cut.spindle;
  }

  BuiltPath run(GcodeLineReader& reader) {
    GcodeLine lexed;
    GcodeBlock block;
    std::string_view text;
    bool seen_content = false, percent_open = false, ended = false;
    while (!ended && reader.next(text)) {
      line_ = reader.line_number();
      lex_gcode_line(text, name_, line_, lexed);
      switch (lexed.kind) {
        case GcodeLineKind::Blank: break;
        case GcodeLineKind::Percent:
          if (!seen_content && !percent_open) {
            percent_open = true;
          } else {
            ended = true;  // the closing '%': nothing after it is read (§3.1)
          }
          break;
        case GcodeLineKind::Deleted:
        case GcodeLineKind::ProgramNumber: seen_content = true; break;
        case GcodeLineKind::Words:
          seen_content = true;
          sort_gcode_block(lexed, name_, line_, block);
          execute(block);
          ended = block.stop == GcodeStop::End;
          break;
      }
    }
    if (reader.line_number() == 0) {
      throw_gcode_error(name_, 1, "", "empty file: no G-code program in it");
    }
    if (percent_open && !ended) {
      throw_gcode_error(name_, reader.line_number(), "%",
                        "the program opens with a % line but has no closing % line or M2/M30 "
                        "(RS274NGC v3 section 3.1); the file may be cut short");
    }
    if (out_.path.moves.empty()) {
      throw_gcode_error(name_, reader.line_number(), "",
                        "the program has no moves (G0, G1, G2, G3) to simulate");
    }
    if (rapid_warnings_ > kMaxRapidWarnings) {
      out_.warnings.push_back({0, std::to_string(rapid_warnings_ - kMaxRapidWarnings) +
                                      " more rapids (G0) reach the floor; only the first " +
                                      std::to_string(kMaxRapidWarnings) + " are listed"});
    }
    return std::move(out_);
  }

 private:
  [[noreturn]] void fail(std::string_view word, std::string_view why) const {
    throw_gcode_error(name_, line_, word, why);
  }
  void warn(std::string message) { out_.warnings.push_back({static_cast<int>(line_), std::move(message)}); }
  double unit_mm() const { return inch_ ? kMmPerInch : 1.0; }

  // Table 8 order: feed, speed, tool, M6, spindle, coolant, dwell, plane, units, compensation,
  // length offset, coordinate system, path control, distance mode, retract mode, motion, stop.
  void execute(const GcodeBlock& b) {
    if (b['F'].present) feed_ = b['F'].value;
    if (b['S'].present && !warned_rpm_ && b['S'].value > 0.0 &&
        std::abs(b['S'].value - cut_.rpm) > kRpmMatchTolerance) {
      warned_rpm_ = true;
      warn("program speed " + b['S'].text + " differs from [cut] rpm " + format_number(cut_.rpm) +
           ": the tooth-resolved sweep uses [cut] rpm");
    }
    if (b.tool_change && !warned_tool_) {
      warned_tool_ = true;
      warn("tool change (M6) ignored: every move is simulated with the job's [tool]");
    }
    if (b.spindle != GcodeSpindle::Unchanged) {
      spindle_ = b.spindle;
      spindle_line_ = line_;
    }
    if (b.dwell && !warned_dwell_) {
      warned_dwell_ = true;
      warn("dwell (G4) ignored: dwell times are not counted in cycle_time_s");
    }
    if (b.has_plane) {
      plane_ = b.plane;
      plane_word_ = b.plane_word;
    }
    if (b.units != 0) {
      inch_ = b.units < 0;
      units_given_ = true;
    }
    if (b.work_offset_tenths != 0) {
      if (work_offset_ != 0 && work_offset_ != b.work_offset_tenths) {
        fail(b.work_offset_word, "the program switches work coordinate systems ('" +
                                     work_offset_word_ + "' before): cuspmap reads one system "
                                     "per program");
      }
      work_offset_ = b.work_offset_tenths;
      work_offset_word_ = b.work_offset_word;
    }
    if (b.distance != 0) absolute_ = b.distance > 0;
    if (b.arc_distance != 0) arc_absolute_ = b.arc_distance > 0;
    if (b.has_motion) motion_ = b.motion;
    motion(b);
  }

  void motion(const GcodeBlock& b) {
    const bool arc_mode = motion_ == GcodeMotion::ArcCw || motion_ == GcodeMotion::ArcCcw;
    const bool arc_words = b['I'].present || b['J'].present || b['K'].present || b['R'].present;
    const bool moves = b.has_axis_words();
    if (arc_words && !(arc_mode && moves)) {
      const GcodeValue& w = b['I'].present ? b['I'] : b['J'].present ? b['J']
                            : b['K'].present ? b['K'] : b['R'];
      fail(w.text, "I, J, K and R are used only with G2/G3 moves");
    }
    if (b['P'].present && !b.dwell && !b.path_control && !(arc_mode && moves)) {
      fail(b['P'].text, "P is used only with G4, G64 or G2/G3 here");
    }
    if (!moves) {
      if (b.has_motion && motion_ != GcodeMotion::None) {
        fail(b.motion_word, "a move needs at least one axis word (X, Y or Z)");
      }
      return;
    }
    if (motion_ == GcodeMotion::None) {
      const GcodeValue& w = b['X'].present ? b['X'] : b['Y'].present ? b['Y'] : b['Z'];
      fail(w.text, "axis words with no motion mode in effect (none yet, or G80): program G0, "
                   "G1, G2 or G3");
    }
    const std::string mode_word = b.has_motion ? b.motion_word : motion_name(motion_);
    // Target: absolute words set an axis; incremental words need the axis known.
    std::array<double, 3> target = pos_;
    std::array<bool, 3> known = known_;
    bool start_known = true;
    for (int a = 0; a < 3; ++a) {
      start_known = start_known && known_[a];
      const GcodeValue& w = b[static_cast<char>('X' + a)];
      if (!w.present) continue;
      const double v = w.value * unit_mm();
      if (absolute_) {
        target[a] = v;
      } else if (known_[a]) {
        target[a] = pos_[a] + v;
      } else {
        fail(w.text, std::string("position of ") + static_cast<char>('X' + a) +
                         " unknown: an incremental (G91) move needs an earlier absolute " +
                         static_cast<char>('X' + a));
      }
      known[a] = true;
    }
    if (!start_known) {
      if (motion_ != GcodeMotion::Rapid) {
        int a = 0;
        while (known_[a]) ++a;
        fail(mode_word, std::string("position of ") + static_cast<char>('X' + a) +
                            " unknown: a feed move needs a known start; give X, Y and Z in "
                            "absolute (G90) words on an earlier move");
      }
      pos_ = target;  // positioning rapid from an unknown place: nothing to sweep
      known_ = known;
      return;
    }
    if (!units_given_ && !warned_units_) {
      warned_units_ = true;
      warn("no G20/G21 before the first move: lengths read as millimetres (G21)");
    }
    Move m;
    m.start_mm = {pos_[0], pos_[1], pos_[2]};
    m.end_mm = {target[0], target[1], target[2]};
    m.source_line = static_cast<int>(line_);
    if (motion_ == GcodeMotion::Rapid) {
      m.rapid = true;
      m.feed_mm_per_min = cut_.rapid_mm_per_min;
    } else {
      if (!(feed_ > 0.0)) fail(mode_word, "no feed rate: program F before the first G1, G2 or G3");
      m.feed_mm_per_min = feed_ * unit_mm();
      check_spindle(mode_word);
    }
    if (arc_mode) {
      arc(b, mode_word, m);
    } else if ((m.end_mm - m.start_mm).norm() == 0.0) {
      return;  // a zero-length line moves nothing
    }
    emit(m);
    pos_ = target;
  }

  void arc(const GcodeBlock& b, const std::string& mode_word, Move& m) {
    if (plane_ != GcodePlane::XY) {
      fail(mode_word, "arcs in the " + plane_word_ + " plane are not supported (selected on an "
                      "earlier line); only G17 (XY) arcs are");
    }
    if (!b['X'].present && !b['Y'].present) {
      fail(mode_word, "an arc needs X or Y (RS274NGC v3 section 3.5.3)");
    }
    if (b['K'].present) fail(b['K'].text, "K has no use in a G17 (XY) arc: I and J give its centre");
    const bool has_ij = b['I'].present || b['J'].present;
    if (b['R'].present && has_ij) fail(b['R'].text, "give either R or I/J for an arc, not both");
    if (!b['R'].present && !has_ij) fail(mode_word, "an arc needs I/J (its centre) or R (its radius)");
    m.kind = MoveKind::Arc;
    m.ccw = motion_ == GcodeMotion::ArcCcw;
    const double tol_mm = inch_ ? kArcEndToleranceInch * kMmPerInch : kArcEndToleranceMm;
    const std::string tol_text = inch_ ? "0.0002 in" : "0.002 mm";
    const Eigen::Vector2d start = m.start_mm.head<2>(), end = m.end_mm.head<2>();
    if (b['R'].present) {
      if (b['R'].value == 0.0) fail(b['R'].text, "an arc radius must not be 0");
      const ArcCentre c = arc_centre_from_radius(start, end, b['R'].value * unit_mm(), m.ccw, tol_mm);
      if (c.status == ArcCentreStatus::EndAtStart) {
        fail(b['R'].text, "an R-form arc cannot end where it starts; program a full circle with I/J");
      }
      if (c.status == ArcCentreStatus::RadiusTooSmall) {
        fail(b['R'].text, "radius " + format_number(std::abs(b['R'].value * unit_mm())) +
                              " mm is smaller than half the chord " +
                              format_number(c.half_chord_mm) +
                              " mm: the end point cannot be reached");
      }
      m.centre_mm = c.centre_mm;
    } else {
      if (arc_absolute_ && !(b['I'].present && b['J'].present)) {
        fail(mode_word, "absolute arc centres (G90.1) need both I and J");
      }
      const Eigen::Vector2d ij(b['I'].value * unit_mm(), b['J'].value * unit_mm());
      const ArcCentre c = arc_centre_from_offsets(start, end, arc_absolute_ ? ij : Eigen::Vector2d(start + ij), tol_mm);
      if (c.status == ArcCentreStatus::ZeroRadius) {
        fail(mode_word, "the arc's centre is at its start point (radius 0)");
      }
      if (c.status == ArcCentreStatus::EndOffCircle) {
        fail(mode_word, "end point is not on the arc: radius " + format_number(c.start_radius_mm) +
                            " mm at the start, " + format_number(c.end_radius_mm) +
                            " mm at the end; RS274NGC v3 allows " + tol_text + " difference");
      }
      m.centre_mm = c.centre_mm;
    }
    if (b['P'].present) {
      const double p = b['P'].value;
      if (p < 1.0 || std::abs(p - std::round(p)) > 1e-4 || p > 1e6) {
        fail(b['P'].text, "arc turns (P) must be a whole number >= 1");
      }
      m.extra_turns = static_cast<int>(std::round(p)) - 1;
    }
  }

  void check_spindle(const std::string& mode_word) {
    if (spindle_ == GcodeSpindle::Cw || spindle_ == GcodeSpindle::Ccw) {
      const SpindleDirection dir =
          spindle_ == GcodeSpindle::Cw ? SpindleDirection::Cw : SpindleDirection::Ccw;
      if (!spindle_fixed_) {
        spindle_fixed_ = true;
        out_.spindle = dir;
        fixed_line_ = spindle_line_;
      } else if (dir != out_.spindle) {
        fail(mode_word, "the spindle direction changed (line " + std::to_string(spindle_line_) +
                            ") after cutting under the one set on line " +
                            std::to_string(fixed_line_) +
                            ": cuspmap simulates one direction per program");
      }
      return;
    }
    if (spindle_ == GcodeSpindle::Stop) {
      if (!warned_stopped_) {
        warned_stopped_ = true;
        warn("feed move with the spindle stopped (M5); simulated as if it turned");
      }
      return;
    }
    if (!spindle_fixed_) {
      spindle_fixed_ = true;
      warn(std::string("no M3/M4 before the first feed move: the [cut] spindle direction (") +
           (cut_.spindle == SpindleDirection::Cw ? "cw" : "ccw") + ") is used");
    }
  }

  void emit(const Move& m) {
    if (out_.path.moves.size() >= kMaxPathMoves) {
      fail("", "more than " + std::to_string(kMaxPathMoves) +
                   " moves: split the program or simulate a smaller patch");
    }
    out_.path.moves.push_back(m);
    // A rapid straight up leaves the floor where the last move left it: nothing new is cut.
    const bool straight_up = m.start_mm.head<2>() == m.end_mm.head<2>() && m.end_mm.z() >= m.start_mm.z();
    if (m.rapid && !straight_up && move_reaches_floor(m, patch_, cutter_)) {
      if (++rapid_warnings_ <= kMaxRapidWarnings) {
        warn("rapid (G0) comes within the cutter's reach (" +
             format_number(cutter_reach_mm(cutter_)) + " mm) of the floor over the patch "
             "(tip down to Z=" + format_number(std::min(m.start_mm.z(), m.end_mm.z())) +
             " mm): it is swept like a cut");
      }
    }
  }

  const std::string& name_;
  const CutSpec& cut_;
  const Patch& patch_;
  const Cutter& cutter_;
  BuiltPath out_;
  long long line_ = 0;
  // Modal state (RS274NGC defaults, G21 assumed until G20/G21).
  bool inch_ = false, units_given_ = false, absolute_ = true, arc_absolute_ = false;
  GcodePlane plane_ = GcodePlane::XY;
  std::string plane_word_ = "G17";
  GcodeMotion motion_ = GcodeMotion::None;
  double feed_ = 0.0;  // F as written, length units per minute; 0 = not set
  GcodeSpindle spindle_ = GcodeSpindle::Unchanged;
  long long spindle_line_ = 0, fixed_line_ = 0;
  bool spindle_fixed_ = false;
  int work_offset_ = 0;
  std::string work_offset_word_;
  std::array<double, 3> pos_{0.0, 0.0, 0.0};
  std::array<bool, 3> known_{false, false, false};
  bool warned_rpm_ = false, warned_tool_ = false, warned_dwell_ = false, warned_units_ = false,
       warned_stopped_ = false;
  int rapid_warnings_ = 0;
};

}  // namespace

BuiltPath read_gcode_file(const std::string& path, const CutSpec& cut, const Patch& patch,
                          const Cutter& cutter) {
  GcodeLineReader reader = GcodeLineReader::from_file(path);
  return GcodeInterpreter(reader.name(), cut, patch, cutter).run(reader);
}

BuiltPath read_gcode_text(std::string_view text, const std::string& name, const CutSpec& cut,
                          const Patch& patch, const Cutter& cutter) {
  GcodeLineReader reader = GcodeLineReader::from_text(text, name);
  return GcodeInterpreter(reader.name(), cut, patch, cutter).run(reader);
}

}  // namespace cuspmap

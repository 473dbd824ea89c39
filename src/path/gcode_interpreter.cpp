// Modal steps of the RS-274 interpreter (see gcode_interpreter.h): Table 8 order, units, work
// systems and G10 L2/L20, G92 offsets, G28/G30/G53 read as retracts. Cost O(1) per block.
// Method: RS274NGC v3 (Kramer, Proctor & Messina 2000) Table 8, §3.5.5 (G10), §3.5.8 (G28/
// G30), §3.5.12 (G53), §3.5.18 (G92).
#include "path/gcode_interpreter.h"

#include <cmath>

#include "core/units.h"
#include "path/floor_reach.h"

namespace cuspmap {
namespace {

// An S word within half a rev/min of [cut] rpm is the same speed (S is written as an integer).
constexpr double kRpmMatchTolerance = 0.5;

// G10 L2/L20 P1..P9 name G54..G59.3 (RS274NGC v3 §3.5.5); P0 is the system in use.
int system_of_p(double p, int active) {
  static constexpr int kSystems[] = {540, 550, 560, 570, 580, 590, 591, 592, 593};
  const int n = static_cast<int>(std::lround(p));
  if (n == 0) return active;
  return (n >= 1 && n <= 9) ? kSystems[n - 1] : -1;
}

}  // namespace

GcodeInterpreter::GcodeInterpreter(const std::string& name, const CutSpec& cut,
                                   const Patch& patch, const Cutter& cutter,
                                   const std::map<int, double>& d_radius_mm)
    : name_(name), cut_(cut), patch_(patch), cutter_(cutter), d_radius_table_mm_(d_radius_mm),
      comp_(name) {
  out_.spindle = cut.spindle;
}

void GcodeInterpreter::fail(std::string_view word, std::string_view why) const {
  throw_gcode_error(name_, line_, word, why);
}

void GcodeInterpreter::warn(std::string message) {
  out_.warnings.push_back({static_cast<int>(line_), std::move(message)});
}

void GcodeInterpreter::warn_once(const std::string& key, std::string message) {
  if (warned_.insert(key).second) warn(std::move(message));
}

// Table 8 order: feed, speed, tool, M6, spindle, coolant, dwell, plane, units, compensation,
// length offset, coordinate system, path control, distance mode, retract mode, home/G10/G92,
// motion, stop.
void GcodeInterpreter::execute(const GcodeBlock& b, long long line) {
  line_ = line;
  for (const std::string& r : b.read_past) {
    const std::string code = r.substr(0, r.find(':'));
    warn_once(code, code + " read past (" + r.substr(code.size() + 2) + "): it moves nothing");
  }
  // F on the line of a G20/G21 is read in the units that line selects (what the program means);
  // a feed set earlier keeps its physical rate across the change.
  if (b.units != 0) set_units(b);
  if (b['F'].present) feed_mm_per_min_ = b['F'].value * unit_mm();
  if (b['S'].present && !warned_rpm_ && b['S'].value > 0.0 &&
      std::abs(b['S'].value - cut_.rpm) > kRpmMatchTolerance) {
    warned_rpm_ = true;
    warn("program speed " + b['S'].text + " differs from [cut] rpm " + format_number(cut_.rpm) +
         ": the tooth-resolved sweep uses [cut] rpm");
  }
  if (b.tool_change) {
    warn_once("M6", "tool change (M6) ignored: every move is simulated with the job's [tool]");
  }
  if (b.spindle != GcodeSpindle::Unchanged) {
    spindle_ = b.spindle;
    spindle_line_ = line_;
  }
  if (b.dwell) warn_once("G4", "dwell (G4) ignored: dwell times are not counted in cycle_time_s");
  if (b.has_plane) {
    if (comp_.active() && b.plane != GcodePlane::XY) {
      fail(b.plane_word, "the plane cannot leave G17 while cutter radius compensation is on "
                         "(G41/G42): program G40 first");
    }
    plane_ = b.plane;
    plane_word_ = b.plane_word;
    plane_line_ = line_;
  }
  if (b.cutter_comp != 0 || b['D'].present) cutter_comp(b);
  if (b.work_offset_tenths != 0) select_work_system(b);
  if (b.distance != 0) absolute_ = b.distance > 0;
  if (b.arc_distance != 0) arc_absolute_ = b.arc_distance > 0;
  if (b.retract_mode != 0) retract_to_r_ = b.retract_mode == 99;
  if (b.set_offsets) {
    set_offsets(b);
    return;
  }
  if (b.origin_offset != 0) {
    origin_offset(b);
    return;
  }
  if (b.home != 0) {
    go_home(b);
    return;
  }
  if (b.has_motion) {
    motion_ = b.motion;
    motion_word_ = b.motion_word;
    if (b.motion == GcodeMotion::Cycle && cycle_ != b.cycle) {
      cycle_r_set_ = cycle_z_set_ = false;  // a new cycle starts without sticky R and Z
    }
    cycle_ = b.cycle;
  }
  if (b.dwell) return;  // G4's X is its time, not an axis
  if (b.machine_coords) {
    machine_move(b);
    return;
  }
  motion(b);
}

void GcodeInterpreter::set_units(const GcodeBlock& b) {
  inch_ = b.units < 0;
  units_given_ = true;
}

double GcodeInterpreter::shift_mm(int system, int axis, bool& known) const {
  known = true;
  const auto rel = system_rel_mm_.find(system);
  if (rel != system_rel_mm_.end() && system_rel_known_.at(system)[axis]) return rel->second[axis];
  const auto abs = system_abs_mm_.find(system);
  const bool abs_known = abs != system_abs_mm_.end() && system_abs_known_.at(system)[axis];
  if (system == base_system_ || base_system_ == 0) {
    if (!abs_known || !base_abs_known_[axis]) return 0.0;  // the base frame itself
    return abs->second[axis] - base_abs_mm_[axis];
  }
  if (abs_known && base_abs_known_[axis]) return abs->second[axis] - base_abs_mm_[axis];
  known = false;
  return 0.0;
}

void GcodeInterpreter::select_work_system(const GcodeBlock& b) {
  const int prev = active_system_;
  active_system_ = b.work_offset_tenths;
  std::string prev_word = active_word_;
  active_word_ = b.work_offset_word;
  if (base_system_ == 0 || active_system_ == prev) return;
  for (int a = 0; a < 3; ++a) {
    bool known = false;
    const double s = shift_mm(active_system_, a, known);
    if (!known) {
      fail(b.work_offset_word, "the program switches work coordinate systems ('" + prev_word +
                                   "' before) and their offsets are not set in the program "
                                   "(G10 L2): cuspmap reads one system per program otherwise");
    }
    origin_mm_[a] = s + g92_mm_[a];
  }
}

void GcodeInterpreter::set_offsets(const GcodeBlock& b) {
  const int l = b['L'].present ? static_cast<int>(std::lround(b['L'].value)) : -1;
  if (l == 1 || l == 10 || l == 11) {
    warn_once("G10 L" + std::to_string(l),
              "G10 L" + std::to_string(l) + " (tool table) read past: the job's [tool] is used");
    return;
  }
  if (l != 2 && l != 20) fail("G10", "G10 needs L2 or L20 (work offsets) here, or L1/L10/L11");
  if (!b['P'].present) fail("G10", "G10 L" + std::to_string(l) + " needs P (0 or 1..9)");
  const int sys = system_of_p(b['P'].value, active_system_);
  if (sys < 0) fail(b['P'].text, "P must be 0 (the system in use) or 1..9 (G54..G59.3)");
  if (base_system_ == 0) base_system_ = active_system_;
  for (int a = 0; a < 3; ++a) {
    const GcodeValue& w = b[static_cast<char>('X' + a)];
    if (!w.present) continue;
    const double v = w.value * unit_mm();
    if (l == 2) {
      const bool first_base = sys == base_system_ && !base_abs_known_[a] && !any_cut_ &&
                              out_.path.moves.empty();
      if (first_base) {  // the base system's offset, set before any move: defines it
        base_abs_mm_[a] = v;
        base_abs_known_[a] = true;
      } else if (sys == base_system_ && !base_abs_known_[a]) {
        fail(w.text, "G10 L2 changes the offset of the first work system after moves, from a "
                     "value the program does not give: set it before the first move");
      }
      system_abs_mm_[sys][a] = v;
      system_abs_known_[sys][a] = true;
      system_rel_known_[sys][a] = false;
    } else {
      if (!known_[a]) {
        fail(w.text, std::string("G10 L20 needs the position of ") + static_cast<char>('X' + a) +
                         " known: give an absolute move first");
      }
      system_rel_mm_[sys][a] = pos_[a] - v - g92_mm_[a];
      system_rel_known_[sys][a] = true;
    }
  }
  if (sys == active_system_) {
    for (int a = 0; a < 3; ++a) {
      bool known = false;
      origin_mm_[a] = shift_mm(active_system_, a, known) + g92_mm_[a];
    }
  }
}

void GcodeInterpreter::origin_offset(const GcodeBlock& b) {
  if (b.origin_offset == 921 || b.origin_offset == 922) {
    if (b.origin_offset == 922) g92_saved_mm_ = g92_mm_;
    g92_mm_ = {0, 0, 0};
  } else if (b.origin_offset == 923) {
    g92_mm_ = g92_saved_mm_;
  } else {
    if (!b.has_axis_words()) fail("G92", "G92 needs at least one axis word (X, Y or Z)");
    for (int a = 0; a < 3; ++a) {
      const GcodeValue& w = b[static_cast<char>('X' + a)];
      if (!w.present) continue;
      if (!known_[a]) {
        fail(w.text, std::string("G92 needs the position of ") + static_cast<char>('X' + a) +
                         " known: give an absolute move first");
      }
      bool known = false;
      // RS274NGC v3 §3.5.18: the current point gets the given coordinates.
      g92_mm_[a] = pos_[a] - shift_mm(active_system_, a, known) - w.value * unit_mm();
    }
  }
  for (int a = 0; a < 3; ++a) {
    bool known = false;
    origin_mm_[a] = shift_mm(active_system_, a, known) + g92_mm_[a];
  }
}

bool GcodeInterpreter::clear_of_floor() const {
  return !known_[2] || pos_[2] >= patch_.floor_z_mm + cutter_reach_mm(cutter_);
}

void GcodeInterpreter::go_home(const GcodeBlock& b) {
  const std::string word = b.home == 28 ? "G28" : "G30";
  refuse_under_comp(word, "a return to home");
  warn_once(word, word + " (return to home) read as a retract: the machine's home is not in "
                         "the program, so axes sent home are unknown until the next absolute move");
  std::array<double, 3> via = pos_;
  std::array<bool, 3> via_known = known_;
  if (b.has_axis_words()) {
    if (!target(b, via, via_known)) return;
    const bool xy_moves = (known_[0] && via[0] != pos_[0]) || (known_[1] && via[1] != pos_[1]);
    const bool down = known_[2] && via[2] < pos_[2];
    if ((xy_moves || down) && !clear_of_floor()) {
      fail(word, "the intermediate point moves X/Y or down with the tool within its reach of the "
                 "floor; retract Z first");
    }
    if (known_[0] && known_[1] && known_[2] && via_known[2]) {
      line_to(via, true, word);
    } else {
      pos_ = via;
      known_ = via_known;
    }
  }
  // Axes named go home; none named: all (Z first, as controls home it).
  const bool all = !b.has_axis_words();
  if ((all || b['Z'].present)) known_[2] = false;
  for (int a = 0; a < 2; ++a) {
    if (!all && !b[static_cast<char>('X' + a)].present) continue;
    if (!clear_of_floor()) {
      fail(word, "sends X/Y to the machine's home with the tool within its reach of the floor; "
                 "retract Z first");
    }
    known_[a] = false;
  }
}

void GcodeInterpreter::machine_move(const GcodeBlock& b) {
  if (!b.has_axis_words()) return;
  refuse_under_comp("G53", "a move in machine coordinates");
  if (motion_ != GcodeMotion::Rapid && motion_ != GcodeMotion::Linear) {
    fail("G53", "G53 needs G0 or G1 in force");
  }
  warn_once("G53", "G53 (machine coordinates) read as a retract: machine positions are not in "
                   "the program, so axes it moves are unknown until the next absolute move");
  if (b['Z'].present) {
    // A machine-coordinate Z move is a retract only when it goes up from where the tool is.
    known_[2] = false;
  }
  for (int a = 0; a < 2; ++a) {
    if (!b[static_cast<char>('X' + a)].present) continue;
    if (!clear_of_floor()) {
      fail("G53", "moves X/Y in machine coordinates with the tool within its reach of the "
                  "floor; retract Z first");
    }
    known_[a] = false;
  }
}

}  // namespace cuspmap

// The RS-274 interpreter's state and the steps that run one sorted block against it: modal
// state (units, distance modes, plane, feed, spindle), coordinate offsets (G54-G59.3 set by G10
// L2/L20, G92), home and machine-coordinate retracts (G28/G30/G53), motion (lines, arcs in any
// plane, helices, full circles), cutter radius compensation (G41/G42, gcode_cutter_comp) and
// canned cycles as plunges. Internal to path/ (gcode_reader).
// Lengths mm in the frame of the first work system used (floor_z is read in it), feeds mm/min.
// Method: RS274NGC v3 (Kramer, Proctor & Messina, NIST IR 6556, 2000) §3.5 (G codes), §3.6 (M
// codes), Table 8 order of execution, §3.5.16 canned cycles, §3.5.18 G92 offsets.
#pragma once

#include <array>
#include <map>
#include <set>
#include <string>

#include "core/heightfield.h"
#include "core/units.h"
#include "path/build_toolpath.h"
#include "path/gcode_block.h"
#include "path/gcode_cutter_comp.h"
#include "path/path_spec.h"
#include "tool/cutter.h"

namespace cuspmap {

/// Sagitta (chord error) allowed when an arc in the G18/G19 plane becomes straight moves, mm:
/// a tenth of a micrometre-level cusp keeps the swept floor within 0.5 um of the true arc
/// (derived: sagitta = r (1 - cos(step/2))), far below the 3 significant figures reported.
inline constexpr double kPlaneArcChordToleranceMm = 0.0005;

/// Interpreter state and block execution; gcode_reader.cpp drives it line by line.
class GcodeInterpreter {
 public:
  /// @param[in] d_radius_mm  D-word table (D number -> tool radius, mm); empty: every D but D0
  ///            is the cutter's radius
  GcodeInterpreter(const std::string& name, const CutSpec& cut, const Patch& patch,
                   const Cutter& cutter, const std::map<int, double>& d_radius_mm);

  /// Runs one sorted block of line `line` (1-based), in the order of RS274NGC v3 Table 8.
  void execute(const GcodeBlock& b, long long line);

  /// Makes `line` (1-based) the current line for warnings on a line without words.
  void at_line(long long line) { line_ = line; }
  /// Adds a warning for the current line.
  void warn(std::string message);
  /// Adds a warning about the whole program (no line).
  void note(std::string message) { out_.warnings.push_back({0, std::move(message)}); }
  /// Warns once per key (a code such as "M8"), at its first line.
  void warn_once(const std::string& key, std::string message);
  /// Closing warnings (counts, the floor below floor_z) and the result.
  BuiltPath finish();

 private:
  [[noreturn]] void fail(std::string_view word, std::string_view why) const;
  double unit_mm() const { return inch_ ? kMmPerInch : 1.0; }
  // Modal steps (gcode_interpreter.cpp).
  void set_units(const GcodeBlock& b);
  void select_work_system(const GcodeBlock& b);
  void set_offsets(const GcodeBlock& b);
  void origin_offset(const GcodeBlock& b);
  void go_home(const GcodeBlock& b);
  void machine_move(const GcodeBlock& b);
  double shift_mm(int system, int axis, bool& known) const;
  bool clear_of_floor() const;
  // Motion (gcode_motion.cpp).
  void motion(const GcodeBlock& b);
  bool target(const GcodeBlock& b, std::array<double, 3>& to, std::array<bool, 3>& known);
  void line_to(const std::array<double, 3>& to, bool rapid, const std::string& word);
  void arc(const GcodeBlock& b, const std::string& word, const std::array<double, 3>& to);
  void emit(const Move& m);
  // Cutter radius compensation (gcode_cutter_comp_steps.cpp).
  void cutter_comp(const GcodeBlock& b);
  double d_radius_mm(const GcodeValue& d);
  void compensate(Move m, const std::string& word);
  void emit_all(const std::vector<Move>& moves);
  void refuse_under_comp(std::string_view word, std::string_view what) const;
  void check_spindle(const std::string& word);
  double feed_mm_per_min(const std::string& word) const;
  // Canned cycles (gcode_canned_cycle.cpp).
  void canned_cycle(const GcodeBlock& b, const std::string& word);

  const std::string& name_;
  const CutSpec& cut_;
  const Patch& patch_;
  const Cutter& cutter_;
  const std::map<int, double>& d_radius_table_mm_;
  GcodeCutterComp comp_;
  BuiltPath out_;
  long long line_ = 0;
  // Modal state (RS274NGC defaults, G21 assumed until G20/G21).
  bool inch_ = false, units_given_ = false, absolute_ = true, arc_absolute_ = false;
  GcodePlane plane_ = GcodePlane::XY;
  std::string plane_word_ = "G17";
  long long plane_line_ = 0;
  GcodeMotion motion_ = GcodeMotion::None;
  int cycle_ = 0;                   // canned cycle in force (81 for G81)
  std::string motion_word_ = "G80";  // word that set motion_
  double feed_mm_per_min_ = 0.0;    // 0 = not set; kept in mm/min across G20/G21
  GcodeSpindle spindle_ = GcodeSpindle::Unchanged;
  long long spindle_line_ = 0, fixed_line_ = 0;
  bool spindle_fixed_ = false;
  // Canned cycle sticky words (program units as written) and retract mode.
  bool retract_to_r_ = false;  // G99 (true) or G98 (false, RS274NGC v3 default)
  double cycle_r_ = 0.0, cycle_z_ = 0.0;
  bool cycle_r_set_ = false, cycle_z_set_ = false;
  // Offsets: work systems by G-code x 10 (540..593); shifts are relative to the first system.
  int active_system_ = 540, base_system_ = 0;  // base 0 = none used yet
  std::string active_word_ = "G54";
  std::map<int, std::array<double, 3>> system_abs_mm_;  // G10 L2: offsets from machine zero
  std::map<int, std::array<bool, 3>> system_abs_known_;
  std::map<int, std::array<double, 3>> system_rel_mm_;  // G10 L20: shifts from the base frame
  std::map<int, std::array<bool, 3>> system_rel_known_;
  std::array<double, 3> base_abs_mm_{0, 0, 0};
  std::array<bool, 3> base_abs_known_{false, false, false};
  std::array<double, 3> g92_mm_{0, 0, 0}, g92_saved_mm_{0, 0, 0};
  std::array<double, 3> origin_mm_{0, 0, 0};  // program -> base frame: base = program + origin
  bool origin_known_ = true;
  // Position in the base frame.
  std::array<double, 3> pos_{0.0, 0.0, 0.0};
  std::array<bool, 3> known_{false, false, false};
  // Findings.
  std::set<std::string> warned_;
  bool warned_rpm_ = false, warned_units_ = false, warned_stopped_ = false;
  int rapid_warnings_ = 0;
  double lowest_cut_z_mm_ = 0.0;  // lowest Z of feed moves other than cycle plunges
  long long lowest_cut_line_ = 0;
  bool any_cut_ = false, in_cycle_ = false;
};

}  // namespace cuspmap

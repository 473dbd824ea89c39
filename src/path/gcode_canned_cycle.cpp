// Canned drilling cycles of the RS-274 interpreter (see gcode_interpreter.h), modelled as
// plunges: per hole a rapid in XY, a rapid down to the R plane, a feed to the bottom Z (pecks
// and dwells of G73/G83/G82/G89 are not separate moves), and the retract of the cycle (rapid,
// or feed for G85/G89/G84/G74) to R (G99) or to the starting Z (G98). Cost O(holes).
// Method: RS274NGC v3 (Kramer, Proctor & Messina 2000) §3.5.16 (G81-G89, sticky R and Z, L
// repeats, incremental R relative to the starting Z and Z relative to R); G73/G74 as common
// controls extend it.
#include <cmath>

#include "core/units.h"
#include "path/gcode_interpreter.h"

namespace cuspmap {

void GcodeInterpreter::canned_cycle(const GcodeBlock& b, const std::string& word) {
  refuse_under_comp(word, "a canned cycle");
  if (plane_ != GcodePlane::XY) {
    fail(word, "canned cycles are modelled in the G17 (XY) plane only; " + plane_word_ +
                   " is in force");
  }
  if (b['R'].present) {
    cycle_r_ = b['R'].value;
    cycle_r_set_ = true;
  }
  if (b['Z'].present) {
    cycle_z_ = b['Z'].value;
    cycle_z_set_ = true;
  }
  if (!cycle_z_set_) fail(word, "a canned cycle needs its bottom Z (Z word)");
  if (!cycle_r_set_) fail(word, "a canned cycle needs its retract plane (R word)");
  if (!known_[0] || !known_[1] || !known_[2]) {
    const int a = !known_[0] ? 0 : !known_[1] ? 1 : 2;
    fail(word, std::string("position of ") + static_cast<char>('X' + a) +
                   " unknown: a canned cycle starts from a known point; give X, Y and Z in "
                   "absolute (G90) words on an earlier move");
  }
  const int repeats = b['L'].present ? static_cast<int>(std::lround(b['L'].value)) : 1;
  const double u = unit_mm();
  const double old_z = pos_[2];
  const double r_mm = absolute_ ? cycle_r_ * u + origin_mm_[2] : old_z + cycle_r_ * u;
  const double bottom_mm = absolute_ ? cycle_z_ * u + origin_mm_[2] : r_mm + cycle_z_ * u;
  if (bottom_mm > r_mm) {
    fail(b['Z'].present ? b['Z'].text : word,
         "the cycle's bottom Z lies above its R plane (Z must be at or below R)");
  }
  const double clear_mm = retract_to_r_ ? r_mm : std::max(old_z, r_mm);
  const bool feed_out = cycle_ == 85 || cycle_ == 89 || cycle_ == 84 || cycle_ == 74;
  std::string code = "G";
  code += std::to_string(cycle_);
  if (cycle_ == 73 || cycle_ == 83) {
    std::string message = code;
    message += " pecks modelled as one plunge to the bottom: cycle_time_s leaves out the peck "
               "retracts";
    warn_once(code, message);
  }
  if (cycle_ == 82 || cycle_ == 89) {
    std::string message = code;
    message += " dwell at the bottom not counted in cycle_time_s";
    warn_once(code + " dwell", message);
  }
  in_cycle_ = true;
  // RS274NGC v3 §3.5.16: "if the current Z position is below the R position, the Z-axis is
  // traversed to the R position".
  if (pos_[2] < r_mm) line_to({pos_[0], pos_[1], r_mm}, true, word);
  for (int k = 0; k < repeats; ++k) {
    std::array<double, 3> hole = pos_;
    for (int a = 0; a < 2; ++a) {
      const GcodeValue& w = b[static_cast<char>('X' + a)];
      if (!w.present) continue;
      hole[a] = absolute_ ? w.value * u + origin_mm_[a] : pos_[a] + w.value * u;
    }
    line_to({hole[0], hole[1], pos_[2]}, true, word);
    line_to({hole[0], hole[1], r_mm}, true, word);
    line_to({hole[0], hole[1], bottom_mm}, false, word);
    if (feed_out) line_to({hole[0], hole[1], r_mm}, false, word);
    line_to({hole[0], hole[1], clear_mm}, true, word);
  }
  in_cycle_ = false;
}

}  // namespace cuspmap

// Cutter radius compensation steps of the RS-274 interpreter (see gcode_interpreter.h): G41/G42
// with the tool radius from D (the D-word table, or the job's cutter), G40, and the routing of
// programmed moves through GcodeCutterComp. Lengths mm. Cost O(1) per block.
// Method: RS274NGC v3 (Kramer, Proctor & Messina 2000) §3.5.10 (G40/G41/G42 and D), Table 8
// (compensation is set after the plane and before motion).
#include <cmath>

#include "core/units.h"
#include "path/gcode_arc.h"
#include "path/gcode_d_radius.h"
#include "path/gcode_interpreter.h"

namespace cuspmap {

void GcodeInterpreter::refuse_under_comp(std::string_view word, std::string_view what) const {
  if (!comp_.active()) return;
  fail(word, std::string(what) + " cannot run with cutter radius compensation on (G41/G42): "
                                 "program G40 before it");
}

double GcodeInterpreter::d_radius_mm(const GcodeValue& d) {
  const double tool_radius_mm = 0.5 * cutter_.diameter_mm;
  if (!d.present) return comp_.active() ? comp_.radius_mm() : tool_radius_mm;
  if (!(d.value <= kMaxDNumber)) {
    fail(d.text, "a D number is a whole number from 0 to " + std::to_string(kMaxDNumber));
  }
  const int n = static_cast<int>(std::lround(d.value));
  std::string d_name = "D";  // appended: GCC 12's -Wrestrict false positive on "D" + string
  d_name += std::to_string(n);
  const auto it = d_radius_table_mm_.find(n);
  if (it != d_radius_table_mm_.end()) return it->second;
  // D0 is the zero offset of controls' tables (from memory): the path as programmed.
  if (n == 0) return 0.0;
  if (!d_radius_table_mm_.empty()) {
    std::string known;
    for (const auto& [number, radius_mm] : d_radius_table_mm_) {
      known += known.empty() ? "D" : ", D";
      known += std::to_string(number);
    }
    fail(d.text, d_name + " is not in the D-word table (" + known +
                     "): add it to [path] d_radius (or --d-radius)");
  }
  warn_once("D", d_name + " read as the job's tool radius " +
                     format_number(tool_radius_mm) + " mm (no D-word table: [path] d_radius or "
                     "--d-radius gives other radii)");
  return tool_radius_mm;
}

// Table 8: compensation is set after the plane and before the motion of the same line, so the
// move on a G41/G42 line is the entry move and the move on a G40 line starts where the tool is.
void GcodeInterpreter::cutter_comp(const GcodeBlock& b) {
  const GcodeValue& d = b['D'];
  if (b.cutter_comp == 40) {
    if (d.present) fail(d.text, "D is used only with G41/G42 (cutter radius compensation)");
    if (!comp_.active()) return;
    std::vector<Move> ready;
    comp_.stop(ready);
    emit_all(ready);
    // RS274NGC v3: no exit move; the next move starts where the tool stands.
    pos_ = {comp_.tool_mm().x(), comp_.tool_mm().y(), comp_.tool_mm().z()};
    return;
  }
  if (b.cutter_comp == 0 && !comp_.active()) {
    fail(d.text, "D is used only with G41/G42 or while cutter radius compensation is on");
  }
  const std::string word = b.cutter_comp != 0 ? b.cutter_comp_word : d.text;
  if (plane_ != GcodePlane::XY) {
    fail(word, "cutter radius compensation is modelled in the G17 (XY) plane only; " +
                   plane_word_ + " is in force: select G17 or post the program with "
                   "compensation off");
  }
  const CompSide side = b.cutter_comp == 41   ? CompSide::Left
                        : b.cutter_comp == 42 ? CompSide::Right
                                              : comp_.side();
  const double radius_mm = d_radius_mm(d);
  std::vector<Move> ready;
  comp_.start(side, radius_mm, {pos_[0], pos_[1], pos_[2]}, ready);
  emit_all(ready);
}

void GcodeInterpreter::compensate(Move m, const std::string& word) {
  m.source_line = static_cast<int>(line_);
  const double tol_mm = inch_ ? kArcEndToleranceInch * kMmPerInch : kArcEndToleranceMm;
  std::vector<Move> ready;
  comp_.add(m, word, tol_mm, ready);
  emit_all(ready);
}

void GcodeInterpreter::emit_all(const std::vector<Move>& moves) {
  const long long line = line_;
  for (const Move& m : moves) {
    line_ = m.source_line;  // a held move keeps its own line for warnings
    emit(m);
  }
  line_ = line;
}

}  // namespace cuspmap

// Motion steps of the RS-274 interpreter (see gcode_interpreter.h): targets from axis words in
// G90/G91 through the work offsets, lines, arcs in G17 kept as arcs, arcs in G18/G19 as chords
// within kPlaneArcChordToleranceMm, helices, full circles, P turns. Cost O(1) per move (O(chords)
// for G18/G19 arcs). Method: RS274NGC v3 (Kramer, Proctor & Messina 2000) §3.5.1-3.5.3.
#include <cmath>
#include <numbers>

#include "core/units.h"
#include "path/floor_reach.h"
#include "path/gcode_arc.h"
#include "path/gcode_interpreter.h"
#include "path/gcode_reader.h"
#include "path/path_limits.h"

namespace cuspmap {
namespace {

// Plane axes (RS274NGC v3 §3.5.3): G17 X,Y (I,J), G18 Z,X (K,I), G19 Y,Z (J,K); the third axis
// is the helix axis. Counter-clockwise (G3) is seen from the third axis' positive end.
struct PlaneAxes {
  int u, v, w;
};
PlaneAxes axes_of(GcodePlane p) {
  switch (p) {
    case GcodePlane::XZ: return {2, 0, 1};
    case GcodePlane::YZ: return {1, 2, 0};
    case GcodePlane::XY: break;
  }
  return {0, 1, 2};
}
char axis_letter(int a) { return static_cast<char>('X' + a); }
char offset_letter(int a) { return static_cast<char>('I' + a); }

}  // namespace

double GcodeInterpreter::feed_mm_per_min(const std::string& word) const {
  if (!(feed_mm_per_min_ > 0.0)) fail(word, "no feed rate: program F before the first G1, G2 or G3");
  return feed_mm_per_min_;
}

bool GcodeInterpreter::target(const GcodeBlock& b, std::array<double, 3>& to,
                              std::array<bool, 3>& known) {
  if (base_system_ == 0) base_system_ = active_system_;
  to = pos_;
  known = known_;
  for (int a = 0; a < 3; ++a) {
    const GcodeValue& w = b[axis_letter(a)];
    if (!w.present) continue;
    const double v = w.value * unit_mm();
    if (absolute_) {
      to[a] = v + origin_mm_[a];
    } else if (known_[a]) {
      to[a] = pos_[a] + v;
    } else {
      fail(w.text, std::string("position of ") + axis_letter(a) +
                       " unknown: an incremental (G91) move needs an earlier absolute " +
                       axis_letter(a));
    }
    known[a] = true;
  }
  return true;
}

void GcodeInterpreter::motion(const GcodeBlock& b) {
  const bool arc_mode = motion_ == GcodeMotion::ArcCw || motion_ == GcodeMotion::ArcCcw;
  const bool arc_words = b['I'].present || b['J'].present || b['K'].present;
  const bool moves = b.has_axis_words() || (arc_mode && arc_words);
  if ((arc_words || b['R'].present) && !(arc_mode && moves) &&
      !(motion_ == GcodeMotion::Cycle && !arc_words)) {
    const GcodeValue& w = b['I'].present ? b['I'] : b['J'].present ? b['J']
                          : b['K'].present ? b['K'] : b['R'];
    fail(w.text, "I, J, K and R are used only with G2/G3 moves (R also with canned cycles)");
  }
  if (b['P'].present && !b.dwell && !b.path_control && !(arc_mode && moves) &&
      motion_ != GcodeMotion::Cycle && !b.call_program && !b.set_offsets &&
      !b.output_words && !b.override_words) {
    fail(b['P'].text, "P is used only with G4, G10, G64, M50-M53, M62-M68, M98, canned cycles or "
                      "G2/G3 here");
  }
  // A motion mode with no axis words moves nothing (RS274NGC v3 §3.3.7: the mode is executed
  // again only when axis words are on the line).
  if (!moves) return;
  if (motion_ == GcodeMotion::None) {
    const GcodeValue& w = b['X'].present ? b['X'] : b['Y'].present ? b['Y'] : b['Z'];
    fail(w.text, "axis words with no motion mode in effect (none yet, or G80): program G0, "
                 "G1, G2 or G3");
  }
  const std::string word = b.has_motion ? b.motion_word : motion_word_;
  if (motion_ == GcodeMotion::Cycle) {
    canned_cycle(b, word);
    return;
  }
  std::array<double, 3> to{};
  std::array<bool, 3> to_known{};
  target(b, to, to_known);
  const bool start_known = known_[0] && known_[1] && known_[2];
  if (!start_known) {
    if (motion_ != GcodeMotion::Rapid) {
      int a = 0;
      while (known_[a]) ++a;
      warn(word + " from an unknown start (" + axis_letter(a) + " not yet set): the path begins "
           "at its end point, as after a rapid");
    }
    pos_ = to;  // positioning from an unknown place: nothing to sweep
    known_ = to_known;
    if (comp_.active() && known_[0] && known_[1] && known_[2]) {
      std::vector<Move> ready;
      comp_.restart_at({to[0], to[1], to[2]}, ready);  // the next X/Y move enters again
      emit_all(ready);
    }
    return;
  }
  if (arc_mode) {
    arc(b, word, to);
  } else {
    line_to(to, motion_ == GcodeMotion::Rapid, word);
  }
}

void GcodeInterpreter::line_to(const std::array<double, 3>& to, bool rapid,
                               const std::string& word) {
  Move m;
  m.start_mm = {pos_[0], pos_[1], pos_[2]};
  m.end_mm = {to[0], to[1], to[2]};
  m.rapid = rapid;
  m.feed_mm_per_min = rapid ? cut_.rapid_mm_per_min : feed_mm_per_min(word);
  if (!rapid) check_spindle(word);
  pos_ = to;
  known_ = {true, true, true};
  if ((m.end_mm - m.start_mm).norm() == 0.0) return;  // a zero-length line moves nothing
  if (comp_.active()) {
    compensate(m, word);
    return;
  }
  emit(m);
}

void GcodeInterpreter::arc(const GcodeBlock& b, const std::string& word,
                           const std::array<double, 3>& to) {
  const PlaneAxes ax = axes_of(plane_);
  const char* plane_name = plane_ == GcodePlane::XY ? " (XY)" : plane_ == GcodePlane::XZ ? " (XZ)" : " (YZ)";
  const std::string plane_at = plane_line_ > 0 && plane_line_ != line_
                                   ? " (plane selected on line " + std::to_string(plane_line_) + ")"
                                   : "";
  // Centre letters in alphabetical order for messages (I/J, I/K, J/K).
  const char first = std::min(offset_letter(ax.u), offset_letter(ax.v));
  const char second = std::max(offset_letter(ax.u), offset_letter(ax.v));
  const GcodeValue& off_w = b[offset_letter(ax.w)];
  if (off_w.present) {
    fail(off_w.text, std::string(1, offset_letter(ax.w)) + " has no use in a " + plane_word_ +
                         plane_name + " arc" + plane_at + ": " + first + " and " + second +
                         " give its centre");
  }
  const GcodeValue& ou = b[offset_letter(ax.u)];
  const GcodeValue& ov = b[offset_letter(ax.v)];
  const bool has_offsets = ou.present || ov.present;
  if (b['R'].present && has_offsets) fail(b['R'].text, "give either R or I/J/K for an arc, not both");
  if (!b['R'].present && !has_offsets) {
    fail(word, std::string("an arc needs its centre (") + first + "/" + second +
                   ") or its radius (R)");
  }
  const double feed = feed_mm_per_min(word);
  check_spindle(word);
  const bool ccw = motion_ == GcodeMotion::ArcCcw;
  const double tol_mm = inch_ ? kArcEndToleranceInch * kMmPerInch : kArcEndToleranceMm;
  const std::string tol_text = inch_ ? "0.0002 in" : "0.002 mm";
  const Eigen::Vector2d start(pos_[ax.u], pos_[ax.v]), end(to[ax.u], to[ax.v]);
  Eigen::Vector2d centre;
  if (b['R'].present) {
    if (b['R'].value == 0.0) fail(b['R'].text, "an arc radius must not be 0");
    if (comp_.entry_pending()) {
      fail(b['R'].text, "an R-form arc cannot be the first move after G41/G42: give its centre "
                        "with " + std::string(1, first) + "/" + second + " or enter with a "
                        "straight move");
    }
    const ArcCentre c = arc_centre_from_radius(start, end, b['R'].value * unit_mm(), ccw, tol_mm);
    if (c.status == ArcCentreStatus::EndAtStart) {
      fail(b['R'].text, std::string("an R-form arc cannot end where it starts; program a full "
                                    "circle with ") + first + "/" + second);
    }
    if (c.status == ArcCentreStatus::RadiusTooSmall) {
      fail(b['R'].text, "radius " + format_number(std::abs(b['R'].value * unit_mm())) +
                            " mm is smaller than half the chord " + format_number(c.half_chord_mm) +
                            " mm: the end point cannot be reached");
    }
    centre = c.centre_mm;
  } else {
    if (arc_absolute_ && !(ou.present && ov.present)) {
      fail(word, std::string("absolute arc centres (G90.1) need both ") + first + " and " + second);
    }
    const Eigen::Vector2d uv(ou.value * unit_mm(), ov.value * unit_mm());
    const Eigen::Vector2d abs_uv(uv.x() + origin_mm_[ax.u], uv.y() + origin_mm_[ax.v]);
    const ArcCentre c = arc_centre_from_offsets(start, end, arc_absolute_ ? abs_uv : Eigen::Vector2d(start + uv), tol_mm);
    if (c.status == ArcCentreStatus::ZeroRadius) {
      fail(word, "the arc's centre is at its start point (radius 0)");
    }
    // An entry arc under G41/G42 starts one tool radius off its circle: GcodeCutterComp checks it.
    if (c.status == ArcCentreStatus::EndOffCircle && !comp_.entry_pending()) {
      fail(word, "end point is not on the arc: radius " + format_number(c.start_radius_mm) +
                     " mm at the start, " + format_number(c.end_radius_mm) +
                     " mm at the end; RS274NGC v3 allows " + tol_text + " difference");
    }
    centre = c.centre_mm;
  }
  int extra_turns = 0;
  if (b['P'].present) {
    const double p = b['P'].value;
    if (p < 1.0 || std::abs(p - std::round(p)) > 1e-4 || p > 1e6) {
      fail(b['P'].text, "arc turns (P) must be a whole number >= 1");
    }
    extra_turns = static_cast<int>(std::round(p)) - 1;
  }
  Move m;
  m.kind = MoveKind::Arc;
  m.start_mm = {pos_[0], pos_[1], pos_[2]};
  m.end_mm = {to[0], to[1], to[2]};
  m.ccw = ccw;
  m.extra_turns = extra_turns;
  m.feed_mm_per_min = feed;
  pos_ = to;
  if (plane_ == GcodePlane::XY) {
    m.centre_mm = centre;
    if (comp_.active()) {
      compensate(m, word);
      return;
    }
    emit(m);
    return;
  }
  // G18/G19: the sweep models arcs in XY only, so the arc becomes chords whose sagitta stays
  // within kPlaneArcChordToleranceMm; the helix axis advances linearly with the angle.
  m.kind = MoveKind::Line;
  Move in_plane = m;
  in_plane.kind = MoveKind::Arc;
  in_plane.start_mm = {start.x(), start.y(), m.start_mm[ax.w]};
  in_plane.end_mm = {end.x(), end.y(), m.end_mm[ax.w]};
  in_plane.centre_mm = centre;
  const double sweep = arc_sweep_rad(in_plane);
  const double r = (start - centre).norm();
  const double step = r > kPlaneArcChordToleranceMm
                          ? 2.0 * std::acos(1.0 - kPlaneArcChordToleranceMm / r)
                          : std::numbers::pi / 2;
  const double chords = std::ceil(std::abs(sweep) / step);
  if (chords > static_cast<double>(kMaxPathMoves - out_.path.moves.size())) {
    fail(word, "this " + plane_word_ + " arc needs more than " + std::to_string(kMaxPathMoves) +
                   " chords: split the program or simulate a smaller patch");
  }
  const int n = std::max(1, static_cast<int>(chords));
  Eigen::Vector3d prev = m.start_mm;
  for (int k = 1; k <= n; ++k) {
    const Eigen::Vector3d p = move_point_mm(in_plane, static_cast<double>(k) / n);
    Eigen::Vector3d q;
    q[ax.u] = p.x();
    q[ax.v] = p.y();
    q[ax.w] = p.z();
    if (k == n) q = m.end_mm;
    Move c = m;
    c.start_mm = prev;
    c.end_mm = q;
    prev = q;
    emit(c);
  }
}

void GcodeInterpreter::check_spindle(const std::string& word) {
  if (spindle_ == GcodeSpindle::Cw || spindle_ == GcodeSpindle::Ccw) {
    const SpindleDirection dir =
        spindle_ == GcodeSpindle::Cw ? SpindleDirection::Cw : SpindleDirection::Ccw;
    if (!spindle_fixed_) {
      spindle_fixed_ = true;
      out_.spindle = dir;
      fixed_line_ = spindle_line_;
    } else if (dir != out_.spindle) {
      fail(word, "the spindle direction changed (line " + std::to_string(spindle_line_) +
                     ") after cutting under the one set on line " + std::to_string(fixed_line_) +
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

void GcodeInterpreter::emit(const Move& move) {
  if (out_.path.moves.size() >= kMaxPathMoves) {
    fail("", "more than " + std::to_string(kMaxPathMoves) +
                 " moves: split the program or simulate a smaller patch");
  }
  if (!units_given_ && !warned_units_) {
    warned_units_ = true;
    warn("no G20/G21 before the first move: lengths read as millimetres (G21)");
  }
  Move m = move;
  m.source_line = static_cast<int>(line_);
  out_.path.moves.push_back(m);
  if (!m.rapid && !in_cycle_) {
    const double z = std::min(m.start_mm.z(), m.end_mm.z());
    if (!any_cut_ || z < lowest_cut_z_mm_) {
      lowest_cut_z_mm_ = z;
      lowest_cut_line_ = line_;
    }
    any_cut_ = true;
  }
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

}  // namespace cuspmap

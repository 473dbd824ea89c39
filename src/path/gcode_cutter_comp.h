// Cutter radius compensation of the RS-274 reader (G41 left, G42 right, G40 off): the tool-centre
// path of programmed XY lines and arcs offset by the tool radius to one side of the direction of
// travel, with the standard entry move, arcs around outside corners, inside corners cut to the
// intersection of the offset moves, and no special exit move. Inputs: programmed Moves, mm (Z
// linear along each); outputs: tool-centre Moves, mm. Cost O(1) per move; one move is held back
// until the next shows the corner between them.
// Method: RS274NGC v3 (Kramer, Proctor & Messina, NIST IR 6556, 2000) §3.5.10 and its chapter on
// cutter radius compensation (straight and arc entry moves, convex-corner arcs of the tool radius,
// no exit move); inside corners by intersecting the offset lines and circles (derived).
#pragma once

#include <Eigen/Core>
#include <cstddef>
#include <optional>
#include <string>
#include <vector>

#include "path/move.h"

namespace cuspmap {

/// Side of the programmed path the tool centre runs on.
enum class CompSide {
  Left,   ///< G41: left of the direction of travel
  Right,  ///< G42: right of it
};

/// Two tool-centre points closer than this are one point, mm: 1000x the rounding of a double at
/// the largest coordinate read (1e6 mm), far below anything cuspmap reports.
inline constexpr double kCompPointToleranceMm = 1e-7;
/// A corner whose direction turns less than this is tangent, rad (0.057 deg): the tool moves
/// straight from one offset move to the next, leaving or overlapping at most r theta^2 / 8
/// (derived: 0.4 nm for a 3 mm radius) - below the 3 decimals posts round coordinates to.
inline constexpr double kCompTangentRad = 1e-3;
/// Most moves without X/Y motion held back after one compensated move while the next corner is
/// not yet known: a bound on memory for garbage programs; real programs hold one or two.
inline constexpr std::size_t kMaxCompHeldMoves = 1000;

/// One offset (tool-centre) move held by GcodeCutterComp: a line s -> e, or an arc about c of
/// radius rho from s to e. The parameter u runs from 0 at s to `total` at e (mm along a line, rad
/// along an arc); the part [u0, u1] is kept (inside corners trim both ends).
struct CompElement {
  bool arc = false;                     ///< arc (true) or line
  Eigen::Vector2d corner{0, 0};         ///< programmed end point: the corner with the next move
  Eigen::Vector2d t0{1, 0}, t1{1, 0};   ///< unit tangents at the start and the end
  Eigen::Vector2d s{0, 0}, e{0, 0};     ///< tool-centre start and end, untrimmed, mm
  Eigen::Vector2d c{0, 0};              ///< arc centre, mm
  double rho = 0.0;                     ///< arc radius of the tool centre, mm
  double total = 0.0;                   ///< u at e (> 0)
  double u0 = 0.0, u1 = 0.0;            ///< kept part
  double z0 = 0.0, z1 = 0.0;            ///< Z at u = 0 and u = total, mm
  Move proto;                           ///< feed, rapid, ccw and source line of the move
  std::string word;                     ///< motion word, for messages
};

/// Compensation state and geometry; GcodeInterpreter feeds it the programmed moves while G41/G42
/// is in force and emits what it returns.
class GcodeCutterComp {
 public:
  /// @param[in] file  program name for messages
  explicit GcodeCutterComp(std::string file) : file_(std::move(file)) {}

  /// True between G41/G42 and G40.
  bool active() const { return active_; }
  /// True until the first move with X/Y motion after G41/G42 (the entry move).
  bool entry_pending() const { return active_ && entry_; }
  /// Side in force (valid while active).
  CompSide side() const { return side_; }
  /// Tool radius in force, mm (valid while active).
  double radius_mm() const { return radius_mm_; }
  /// Where the tool centre stands after every move returned so far, mm.
  const Eigen::Vector3d& tool_mm() const { return tool_mm_; }

  /// G41/G42, or a new D or side while on: returns the held move (ended at its own offset end,
  /// no corner), then makes the next X/Y move an entry move from where the tool stands.
  /// @param[in] side, radius_mm  side and tool radius (>= 0, mm)
  /// @param[in] tool_mm  tool-centre position (used when compensation was off)
  /// @param[out] out  moves ready to emit (appended)
  void start(CompSide side, double radius_mm, const Eigen::Vector3d& tool_mm,
             std::vector<Move>& out);
  /// G40: returns the held move (no exit move: the next move starts where the tool stands).
  void stop(std::vector<Move>& out);
  /// Returns the held move and the moves without X/Y motion after it (end of program).
  void flush(std::vector<Move>& out);
  /// The tool was moved to `tool_mm` without compensation (a move from an unknown start): the
  /// next X/Y move enters again.
  void restart_at(const Eigen::Vector3d& tool_mm, std::vector<Move>& out);

  /// Adds a programmed move (a line, or an arc in XY) while active.
  /// @param[in] programmed  start, end (and centre) as programmed; feed, rapid, ccw, turns and
  ///            source_line are carried to the tool moves
  /// @param[in] word  the motion word, for messages
  /// @param[in] arc_tolerance_mm  allowed radius difference of an entry arc (RS274NGC v3
  ///            §3.5.3.2: 0.002 mm, 0.0002 in)
  /// @param[out] out  moves ready to emit (appended): the previous move, trimmed or followed by
  ///            its corner arc; this move is held until the next one shows its corner
  /// @throws InputError "<file>:<line>: '<word>': <why>" for an entry move that ends within the
  ///         tool radius of the start, an entry arc whose start is not one tool radius from its
  ///         circle, an arc whose inside radius is not larger than the tool radius, an inside
  ///         corner whose offset moves do not meet (the tool would gouge), more than
  ///         kMaxCompHeldMoves moves without X/Y motion in a row.
  void add(const Move& programmed, const std::string& word, double arc_tolerance_mm,
           std::vector<Move>& out);

 private:
  [[noreturn]] void fail(const CompElement& el, const std::string& why) const;
  CompElement offset_element(const Move& m, const std::string& word) const;
  CompElement entry_element(const Move& m, const std::string& word, double arc_tolerance_mm) const;
  void join(CompElement& held, CompElement& next, std::vector<Move>& corner) const;
  void emit_element(const CompElement& el, std::vector<Move>& out);
  // A move without X/Y motion, run at the tool's X/Y.
  void z_move(const Move& programmed, std::vector<Move>& out);

  std::string file_;
  bool active_ = false, entry_ = false;
  CompSide side_ = CompSide::Left;
  double radius_mm_ = 0.0;
  Eigen::Vector3d tool_mm_{0, 0, 0};
  std::optional<CompElement> held_;
  std::vector<Move> held_z_;  // moves without X/Y motion after held_ (their Z ends)
};

}  // namespace cuspmap

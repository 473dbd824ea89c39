// Builds the Toolpath a PathSpec asks for: dispatches to the strategy (raster, offset, spiral,
// trochoidal) or reads the user's G-code program. Lengths mm.
#pragma once

#include <string>
#include <vector>

#include "core/heightfield.h"
#include "path/move.h"
#include "path/path_spec.h"
#include "tool/cutter.h"

namespace cuspmap {

/// Warnings gathered while building a path (e.g. a rapid that reaches the floor), for the report.
struct PathWarning {
  int line = 0;          ///< G-code line number, 0 for built-in strategies
  std::string message;   ///< one line, no trailing newline
};

/// The built path and what the builder noticed.
struct BuiltPath {
  Toolpath path;                       ///< moves in execution order
  std::vector<PathWarning> warnings;   ///< non-fatal findings, in order
  SpindleDirection spindle = SpindleDirection::Cw;  ///< spindle direction in force (M3/M4 for G-code)
  /// Offset with a wall edge: polygons of the region the tool centre may visit, mm; the floor's
  /// cells outside it are the wall band (job/wall_band.h). Empty otherwise.
  std::vector<std::vector<Eigen::Vector2d>> wall_region_mm;
  /// Raster whose cutter can finish a cell from a pass beyond the patch (tilt, dish, runout):
  /// passes added on each side across the lay (path.raster_margin_passes), so the patch's edge
  /// cells are finished as inside a larger floor. 0 otherwise.
  int margin_passes = 0;
  /// With margin passes: the program without them (path length and cycle time are its own).
  Toolpath program;
};

/// One line saying that the path cuts a single straight groove (every feed move's XY ends within
/// 1 um of one line; no arcs), so the texture figures describe that groove's cross-section, not a
/// finish left by neighbouring passes; empty otherwise.
std::string single_groove_note(const Toolpath& path);

/// The moves a shop runs: `program` when margin passes were added, else `path`.
const Toolpath& program_moves(const BuiltPath& built);

/// One line saying that margin passes were added and why; empty when none were.
std::string margin_passes_note(const BuiltPath& built);

/// @param[in] spec, cut, patch, cutter  validated job parts (mm, deg, mm/min)
/// @throws InputError for an unreadable or malformed G-code file (file:line, the word, why).
BuiltPath build_toolpath(const PathSpec& spec, const CutSpec& cut, const Patch& patch,
                         const Cutter& cutter);

}  // namespace cuspmap

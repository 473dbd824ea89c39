// Builds the Toolpath a PathSpec asks for: one of the built-in strategies (raster, offset,
// spiral, trochoidal) or the user's G-code program. Lengths mm, feeds mm/min.
// Method: dispatch only; each strategy's file names its method.
#include "path/build_toolpath.h"

#include <cassert>
#include <cmath>
#include <vector>

#include "path/gcode_reader.h"
#include "path/offset_path.h"
#include "path/raster.h"
#include "path/spiral_path.h"
#include "path/trochoidal_path.h"

namespace cuspmap {

BuiltPath build_toolpath(const PathSpec& spec, const CutSpec& cut, const Patch& patch,
                         const Cutter& cutter) {
  if (spec.kind == PathKind::Gcode) {
    GcodeReadOptions options;
    options.block_delete = spec.block_delete;
    options.d_radius_mm = spec.d_radius_mm;
    return read_gcode_file(spec.file, cut, patch, cutter, options);
  }
  BuiltPath built;
  built.spindle = cut.spindle;
  switch (spec.kind) {
    case PathKind::Raster:
      built.margin_passes = raster_margin_passes(spec.stepover_mm, cutter);
      built.path = raster_path(spec, cut, patch, cutter, built.margin_passes);
      if (built.margin_passes > 0) built.program = raster_path(spec, cut, patch, cutter);
      break;
    case PathKind::Offset: built.path = offset_path(spec, cut, patch, cutter, &built.wall_region_mm); break;
    case PathKind::Spiral: built.path = spiral_path(spec, cut, patch, cutter); break;
    case PathKind::Trochoidal: built.path = trochoidal_path(spec, cut, patch, cutter); break;
    case PathKind::Gcode: assert(false && "handled above"); break;
  }
  return built;
}

std::string margin_passes_note(const BuiltPath& built) {
  if (built.margin_passes == 0) return {};
  return std::to_string(built.margin_passes) +
         " passes added on each side across the lay: the cutter's lowest point is off its axis "
         "(tilt, dish or runout), so passes beyond the patch cut its edge cells; simulated as "
         "inside a larger floor, not counted in path length or cycle time";
}

std::string single_groove_note(const Toolpath& path) {
  // Derived: a point set is collinear when every point lies within tol of the line through its
  // two farthest-apart points (their span is the set's diameter, found here as the farthest
  // point from the first and then the farthest from that one).
  constexpr double kTolMm = 1e-3;  // passes closer than 1 um leave one groove (derived)
  std::vector<Eigen::Vector2d> xy;
  for (const Move& m : path.moves) {
    if (m.rapid) continue;
    if (m.kind == MoveKind::Arc) return {};
    xy.push_back(m.start_mm.head<2>());
    xy.push_back(m.end_mm.head<2>());
  }
  if (xy.empty()) return {};
  const auto farthest = [&xy](const Eigen::Vector2d& from) {
    Eigen::Vector2d best = from;
    for (const Eigen::Vector2d& p : xy) {
      if ((p - from).squaredNorm() > (best - from).squaredNorm()) best = p;
    }
    return best;
  };
  const Eigen::Vector2d a = farthest(xy.front()), b = farthest(a);
  const double span = (b - a).norm();
  if (span <= kTolMm) return {};
  const Eigen::Vector2d u = (b - a) / span;
  for (const Eigen::Vector2d& p : xy) {
    const Eigen::Vector2d d = p - a;
    if (std::abs(d.x() * u.y() - d.y() * u.x()) > kTolMm) return {};
  }
  return "one straight pass: Ra, Rz and Sa describe a single groove's cross-section, not the "
         "finish neighbouring passes leave (a stepover narrower than the tool gives that)";
}

const Toolpath& program_moves(const BuiltPath& built) {
  return built.margin_passes > 0 ? built.program : built.path;
}

}  // namespace cuspmap

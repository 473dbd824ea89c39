// Builds the Toolpath a PathSpec asks for: one of the built-in strategies (raster, offset,
// spiral, trochoidal) or the user's G-code program. Lengths mm, feeds mm/min.
// Method: dispatch only; each strategy's file names its method.
#include "path/build_toolpath.h"

#include <cassert>

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

const Toolpath& program_moves(const BuiltPath& built) {
  return built.margin_passes > 0 ? built.program : built.path;
}

}  // namespace cuspmap

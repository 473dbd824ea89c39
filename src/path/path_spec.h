// What the user asked the path to be ([path] and [cut] of a job), before it is built into Moves.
// Lengths mm, angles deg, feeds mm/min, speeds rev/min. Validated in job/ and cli/.
// Method: strategy vocabulary of the trade (raster one-way/zigzag, offset, spiral, trochoidal).
#pragma once

#include <Eigen/Core>
#include <map>
#include <string>
#include <vector>

#include "tool/cutter.h"

namespace cuspmap {

/// Path strategies.
enum class PathKind {
  Raster,      ///< parallel straight passes at angle_deg, stepover apart
  Offset,      ///< contour-parallel rings stepping inward from the boundary
  Spiral,      ///< Archimedean spiral, constant stepover, built from arcs
  Trochoidal,  ///< loops of loop_diameter advancing along lanes
  Gcode,       ///< the user's own RS-274 program
};

/// Raster pass direction.
enum class RasterDirection {
  OneWay,  ///< every pass in the same direction, lifting back over the part between passes
  Zigzag,  ///< alternate passes reverse, linked at the side
};

/// What the offset boundary is to the floor ([path] edge).
enum class OffsetEdge {
  Open,  ///< an open edge: ring 0's tool centre runs on it, the cutter overhangs (like raster)
  Wall,  ///< a wall: ring 0 runs R inside it; the band within R of it is the wall band
};

/// Cutting conditions ([cut]).
struct CutSpec {
  double rpm = 10000.0;                           ///< spindle speed, rev/min, > 0
  double feed_mm_per_min = 1000.0;                ///< cutting feed, > 0
  double depth_mm = 0.0;                          ///< tip Z of built-in strategies relative to the floor (0 = on it)
  SpindleDirection spindle = SpindleDirection::Cw;  ///< M3 = cw
  double rapid_mm_per_min = 10000.0;              ///< rate charged for rapids/links in cycle time (stated in the report)
  double retract_mm = 2.0;                        ///< clearance height of one-way return moves above the floor
};

/// The strategy and its parameters ([path]).
struct PathSpec {
  PathKind kind = PathKind::Raster;                ///< strategy
  double stepover_mm = 0.3;                        ///< distance between neighbouring passes/rings/lanes, > 0
  double angle_deg = 0.0;                          ///< raster/trochoidal lane direction from +X, ccw
  RasterDirection direction = RasterDirection::OneWay;  ///< raster and lanes
  bool climb = true;                               ///< offset: climb (true) or conventional cutting
  bool outward = true;                             ///< spiral: from the centre out (true) or in
  double loop_diameter_mm = 0.0;                   ///< trochoidal loop diameter (0 = half the tool diameter)
  double advance_mm = 0.0;                         ///< trochoidal advance per loop (0 = a tenth of the tool diameter)
  std::vector<Eigen::Vector2d> boundary_mm;        ///< offset: closed polygon (empty = the patch rectangle)
  OffsetEdge edge = OffsetEdge::Open;              ///< offset: the boundary is an open edge or a wall
  std::string file;                                ///< gcode: program path
  bool block_delete = true;                        ///< gcode: block delete switch ('/' lines skipped)
  std::map<int, double> d_radius_mm;               ///< gcode: D-word table, D number -> tool radius (G41/G42)
};

}  // namespace cuspmap

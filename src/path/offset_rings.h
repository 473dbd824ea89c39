// Contour-parallel rings inside a closed polygon: the offsets of the boundary by R, R + s,
// R + 2s, ... (each taken from the boundary itself, so every rounded corner is an exact arc of
// radius equal to the offset about a reflex vertex of the boundary, and is returned as an arc),
// plus centre passes along the spine (the last non-empty inward offset, a thin loop about the
// medial axis) of every piece of the tool-centre region farther than s/2 from every ring. Inputs mm; output closed loops of lines and arcs. Cost O(rings x boundary vertices x
// log) for the offsets plus one union of all rings' s/2 bands.
// Method: polygon offsetting with Clipper 6.4 (A. Johnson, ClipperOffset, round joins, integer
// coordinates), after Vatti's clipping algorithm (Comm. ACM 35(7), 1992).
#pragma once

#include <Eigen/Core>
#include <vector>

namespace cuspmap {

/// Clipper works in integers: 1e6 units per mm (1 unit = 1 nm). Coordinates up to +-4.6e12 mm
/// fit Clipper's 64-bit range; rounding to 1 nm is far below any cusp height.
inline constexpr double kClipperUnitsPerMm = 1e6;

/// Clipper's ArcTolerance: largest distance between the polylines Clipper draws for round joins
/// and the true arcs, mm. Ring corners are rebuilt as exact arcs, so this matters only where
/// Clipper's clean-up cuts an arc's polyline (ends of arcs at a ring's self-contact) and for the
/// centre passes, which stay polylines: 0.5 um, a tenth of a typical finishing cusp.
inline constexpr double kOffsetArcToleranceMm = 0.0005;

/// A vertex of a ring within this distance of the circle of radius d about a reflex boundary
/// vertex lies on that corner's arc: 10x Clipper's 1 nm rounding of both the vertex and the
/// boundary point, and far below the distance of any other ring vertex from that circle.
inline constexpr double kArcSnapMm = 1e-5;

/// Areas thinner than this (2 area / perimeter), mm, are dropped from rings and from the
/// uncovered region: their points lie at most 0.5 um beyond s/2 from a pass.
inline constexpr double kMinSliverMm = 0.001;

/// One element of a closed loop.
struct LoopElement {
  Eigen::Vector2d start_mm{0, 0};   ///< start point
  Eigen::Vector2d end_mm{0, 0};     ///< end point (the next element's start)
  Eigen::Vector2d centre_mm{0, 0};  ///< arc centre (arcs only)
  bool arc = false;                 ///< arc (true) or line
  bool ccw = false;                 ///< arc direction seen from +Z
};

/// A closed loop: a ring at one offset, or a centre pass.
struct OffsetLoop {
  std::vector<LoopElement> elements;       ///< in order; the last ends where the first starts
  std::vector<Eigen::Vector2d> polygon_mm; ///< Clipper's vertices (containment tests)
  int level = 0;                           ///< ring k sits at offset R + k s; centre passes: -1
};

/// The rings and centre passes of a boundary, and the region the tool centre may visit.
struct OffsetRings {
  std::vector<OffsetLoop> loops;                          ///< rings by level, then centre passes
  std::vector<std::vector<Eigen::Vector2d>> region_mm;   ///< offset by R: allowed tool centres
};

/// Rings of a closed polygon.
/// @param[in] boundary_mm  simple closed polygon, either orientation, >= 3 vertices
/// @param[in] first_mm     offset of the first ring: R (wall edge) or 0 (open edge), >= 0
/// @param[in] stepover_mm  distance between rings, > 0
/// @param[in] max_elements  stop with InputError (naming path.stepover) beyond this many
///                          elements in all
/// @return loops in Clipper's orientation (outer loops counter-clockwise); empty when the
///         boundary is narrower than 2 first_mm everywhere. region_mm is ring 0.
OffsetRings offset_rings(const std::vector<Eigen::Vector2d>& boundary_mm, double first_mm,
                         double stepover_mm, std::size_t max_elements);

}  // namespace cuspmap

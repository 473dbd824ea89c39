// Row kernels of the level-distance sweep: squared distance from a run of cell centres to a
// segment or an arc, folded into a running minimum, and heights z + p(d) from that minimum.
// Contiguous float/double loops without calls per cell, built for AVX-512, AVX2 and baseline
// x86-64 and picked at run time (function multiversioning). Cost O(cells) per call.
// Method: point-segment and point-arc distance (Eberly, Geometric Tools for Computer Graphics,
// 2003, §6.1 and §6.2.6 of the 2-D distance chapter); ball/torus profile of DESIGN.md "Geometry".
#pragma once

namespace cuspmap {

/// One straight level move seen along a row: cell n (0-based) lies at u = ua + n du along the
/// move from its start (ub = ua - L from its end) and at w = w + n dw across it, all mm.
struct LineRow {
  float ua = 0.0f;  ///< along-move offset of cell 0 from the start, mm
  float ub = 0.0f;  ///< along-move offset of cell 0 from the end (ua - L), mm
  float du = 0.0f;  ///< along-move step per cell, mm
  float w = 0.0f;   ///< across-move offset of cell 0, mm
  float dw = 0.0f;  ///< across-move step per cell, mm
};

/// One level arc seen along a row (double: arc radii of tens of mm meet um-sized differences).
/// Cell n lies at (vx + n step, vy) from the centre and at (ax + n step, ay), (bx + n step, by)
/// from the arc's start and end points.
struct ArcRow {
  double vx = 0.0, vy = 0.0;        ///< cell 0 minus the arc centre, mm
  double ax = 0.0, ay = 0.0;        ///< cell 0 minus the start point, mm
  double bx = 0.0, by = 0.0;        ///< cell 0 minus the end point, mm
  double step = 0.0;                ///< cell size, mm
  double radius = 0.0;              ///< arc radius, mm
  double mid_x = 1.0, mid_y = 0.0;  ///< unit direction of the arc's middle from the centre
  double cos_half = -2.0;           ///< cos(half the swept angle); -2 for a full turn or more
};

/// d2[n] = min(d2[n], squared distance from cell n to the segment), n in [0, count).
/// @param[in] row       the move in the row's terms
/// @param[in] count     cells in the run, >= 0
/// @param[in,out] d2    running minimum, mm^2
void line_d2_min(const LineRow& row, int count, float* d2);

/// d2[n] = min(d2[n], (w + n dw)^2), n in [0, count): a line beside every one of the cells
/// (their foot points fall within the segment), so only the across-move offset counts.
/// @param[in] w         across-move offset of cell 0, mm
/// @param[in] dw        across-move step per cell, mm
/// @param[in] count     cells in the run, >= 0
/// @param[in,out] d2    running minimum, mm^2
void band_d2_min(float w, float dw, int count, float* d2);

/// d2[n] = min(d2[n], squared distance from cell n to the arc), n in [0, count). A cell whose
/// direction from the centre lies within the arc's angles is |rho - radius| from it, any other
/// cell is nearest an end point.
/// @param[in] row       the arc in the row's terms
/// @param[in] count     cells in the run, >= 0
/// @param[in,out] d2    running minimum, mm^2
void arc_d2_min(const ArcRow& row, int count, float* d2);

/// out[n] = value for n in [0, count): a run of one height (rows beside parallel passes).
/// @param[in] value   height to write, um (NaN allowed)
/// @param[in] count   cells, >= 0
/// @param[out] out    the run
void fill_cells(float value, int count, float* out);

/// As fill_cells, with stores that bypass the caches (SSE2 non-temporal stores on x86-64,
/// plain stores elsewhere): for grids far larger than the last-level cache, where a normal store
/// would first read every line it writes. Call stream_fence() before other threads read them.
void fill_cells_stream(float value, int count, float* out);

/// out[n] = in[n] for n in [0, count) with the stores of fill_cells_stream (caches bypassed).
/// @param[in] in      the run, count entries
/// @param[in] count   cells, >= 0
/// @param[out] out    the copy (must not overlap `in`)
void copy_cells_stream(const float* in, int count, float* out);

/// Orders earlier fill_cells_stream and copy_cells_stream stores before any later store (x86 sfence; no-op elsewhere).
void stream_fence();

/// Heights of an untilted ball or undished bull-nose/flat at squared distances d2 from the
/// nearest move: out[n] = base_um + 1000 (rc - sqrt(rc^2 - max(d - flat, 0)^2)), d = sqrt(d2),
/// NaN (unreached) where d2 > reach2.
/// @param[in] d2        squared distances, mm^2, count entries
/// @param[in] count     cells, >= 0
/// @param[in] base_um   tip height of the moves plus the lowest tooth, um
/// @param[in] flat_mm   R - rc (0 for a ball)
/// @param[in] corner_mm rc (R for a ball, 0 for a flat end)
/// @param[in] reach2    R^2, mm^2
/// @param[out] out      heights, um
void profile_heights(const float* d2, int count, float base_um, float flat_mm, float corner_mm,
                     float reach2, float* out);

/// The profile of an untilted ball or undished bull-nose/flat as one row kernel sees it.
struct RowProfile {
  float base_um = 0.0f;    ///< tip height of the moves plus the lowest tooth, um
  float flat_mm = 0.0f;    ///< R - rc (0 for a ball)
  float corner_mm = 0.0f;  ///< rc (R for a ball, 0 for a flat end)
  float reach2 = 0.0f;     ///< R^2, mm^2
  bool series = false;     ///< every u of the row has u^2 <= rc^2 / 16: the power series applies
  bool in_reach = false;   ///< with `series`: every d of the row has d^2 < reach2 (no NaN cell)
};

/// One piece of a raster row: cells [start, end) lie between the same two parallel lines, each
/// beside every one of the cells (a raster's passes on either side of them).
struct RasterPiece {
  int start = 0;   ///< first cell of the piece
  int end = 0;     ///< one past its last cell, > start
  float a = 0.0f;  ///< signed across-line offset of cell `start` from the first line, mm
  float b = 0.0f;  ///< the same from the second line (a for a single line), mm
};

/// Heights of a raster row in one pass: cell n of piece q (start s) is at distance
/// d = min(|a + (n - s) dw|, |b + (n - s) dw|) from its nearest line, and out[n] = base_um +
/// 1000 (rc - sqrt(rc^2 - max(d - flat, 0)^2)) as in profile_heights; where `profile.series`
/// holds, rc (1 - sqrt(1 - x)), x = u^2 / rc^2, is summed as its binomial series to x^6 (no
/// square root, no division; truncation below 2e-9 relative for x <= 1/16).
/// @param[in] pieces   `count` pieces, contiguous and ascending, covering [0, width)
/// @param[in] count    pieces, >= 1
/// @param[in] dw       across-line step per cell, mm
/// @param[in] profile  the cutter's profile and reach
/// @param[out] out     the row's width heights, um (NaN where d^2 > reach2)
void raster_row_heights(const RasterPiece* pieces, int count, float dw, const RowProfile& profile,
                        float* out);

}  // namespace cuspmap

// Raster tile of the level-distance sweep: checks that the tile's candidate moves are parallel
// lines beside the whole tile, sorts their offsets, splits each row where it crosses one (the
// first line followed from row to row, no search) and runs one row kernel per row (distances
// and heights, raster_row_heights). Method: see raster_tile.h.
#include "sweep/raster_tile.h"

#include <algorithm>
#include <cmath>
#include <limits>

#include "sweep/nearest_rows.h"

namespace cuspmap {
namespace {

// Largest |sin| of the angle between a line and the first one for both to count as parallel:
// measuring every line across the first one's normal then moves a distance by at most 1e-12 x
// the distance along the line (1e-10 mm over 100 mm), far below float rounding, while a raster's
// passes, whose directions come from the same angle, agree to a few ulps.
constexpr double kParallelSin = 1e-12;
// Largest x = u^2 / rc^2 of a row taking the power series: its truncation after x^6 is then
// below 2e-9 relative (next term 33/2048 x^7 against x / 2), under float's 6e-8.
constexpr double kSeriesMaxX = 1.0 / 16.0;
constexpr double kInfMm = std::numeric_limits<double>::infinity();

struct Scratch {
  std::vector<double> offsets;       // c_k = n.(a_k - origin), ascending, mm
  std::vector<RasterPiece> pieces;  // one row's pieces
  std::vector<float> h;              // one row's heights before a streamed copy, um
};

Scratch& scratch() {
  thread_local Scratch s;
  return s;
}

// True when cell centres `corners` all have their foot point on line m (0 <= u <= L).
bool beside(const PreparedMove& m, const Eigen::Vector2d (&corners)[4]) {
  return std::all_of(std::begin(corners), std::end(corners), [&](const Eigen::Vector2d& c) {
    const double u = (c - m.a_mm).dot(m.dir);
    return u >= 0.0 && u <= m.length_xy_mm;
  });
}

}  // namespace

bool raster_tile(const SweepSetup& setup, const std::vector<const PreparedMove*>& kept,
                 const TileRect& tile, double base_um, float* grid, int grid_row0, bool stream,
                 std::int64_t& visits) {
  if (kept.empty()) return false;
  const double cell = setup.cell_mm;
  const Eigen::Vector2d origin((tile.i0 + 0.5) * cell, (tile.j0 + 0.5) * cell);
  const Eigen::Vector2d far((tile.i1 - 0.5) * cell, (tile.j1 - 0.5) * cell);
  const Eigen::Vector2d corners[4] = {origin, {far.x(), origin.y()}, {origin.x(), far.y()}, far};
  // The common normal, turned so that w = n.(p - origin) does not decrease along a row.
  Eigen::Vector2d n = kept.front()->perp;
  if (n.x() < 0.0) n = -n;
  Scratch& sc = scratch();
  sc.offsets.clear();
  for (const PreparedMove* m : kept) {
    if (m->kind != MoveKind::Line || !(m->length_xy_mm > 0.0)) return false;
    if (std::abs(m->perp.x() * n.y() - m->perp.y() * n.x()) > kParallelSin) return false;
    if (!beside(*m, corners)) return false;
    sc.offsets.push_back(n.dot(m->a_mm - origin));
  }
  std::sort(sc.offsets.begin(), sc.offsets.end());
  sc.offsets.erase(std::unique(sc.offsets.begin(), sc.offsets.end()), sc.offsets.end());
  const std::vector<double>& c = sc.offsets;
  const int last = static_cast<int>(c.size()) - 1;

  const int width = tile.i1 - tile.i0;
  if (stream) sc.h.resize(width);
  RowProfile profile;
  profile.base_um = static_cast<float>(base_um);
  profile.flat_mm = static_cast<float>(setup.flat_mm);
  profile.corner_mm = static_cast<float>(setup.corner_mm);
  profile.reach2 = static_cast<float>(setup.envelope.reach_mm * setup.envelope.reach_mm);
  const double dw = n.x() * cell;  // >= 0
  const double inv_dw = dw > 0.0 ? 1.0 / dw : 0.0;
  const float dw_f = static_cast<float>(dw);
  // One bound on every distance of the tile, so one choice of height form: between two lines
  // half their gap (the distance is concave there), outside them the farthest corner's offset.
  double w_lo = kInfMm, w_hi = -kInfMm;
  for (const Eigen::Vector2d& p : corners) {
    w_lo = std::min(w_lo, n.dot(p - origin));
    w_hi = std::max(w_hi, n.dot(p - origin));
  }
  double d_max = std::max({0.0, c.front() - w_lo, w_hi - c.back()});
  for (int k = 0; k < last; ++k) d_max = std::max(d_max, 0.5 * (c[k + 1] - c[k]));
  const double u_max = std::max(d_max - setup.flat_mm, 0.0);
  profile.series = u_max * u_max <= kSeriesMaxX * setup.corner_mm * setup.corner_mm;
  // A cell's float distance exceeds d_max by rounding only (ulps of mm), far below a cell.
  profile.in_reach = profile.series && d_max + cell < setup.envelope.reach_mm;
  // First line above the row's first cell (cells with w < c[k] lie between lines k-1 and k),
  // followed from row to row: w0 moves one way, by |n.y| cell per row.
  int k_row = 0;
  for (int j = tile.j0; j < tile.j1; ++j) {
    const double w0 = n.y() * (j - tile.j0) * cell;
    while (k_row > 0 && c[k_row - 1] > w0) --k_row;
    while (k_row <= last && c[k_row] <= w0) ++k_row;
    sc.pieces.clear();
    for (int s = 0, k = k_row; s < width; ++k) {
      int e = width;
      if (k <= last && dw > 0.0) {
        // First column with w >= c[k], clamped to [s, width] (a ceil on the clamped value: an
        // integer conversion, no call); a column off by one from rounding has w within an ulp
        // of c[k], where line k is nearest and a candidate of both pieces.
        const double at = std::clamp((c[k] - w0) * inv_dw, static_cast<double>(s),
                                     static_cast<double>(width));
        e = static_cast<int>(at);
        e += static_cast<double>(e) < at ? 1 : 0;
      }
      if (e > s) {
        const int lo = std::max(k - 1, 0), hi = std::min(k, last);
        const double ws = w0 + s * dw;
        sc.pieces.push_back(
            {s, e, static_cast<float>(ws - c[lo]), static_cast<float>(ws - c[hi])});
        visits += static_cast<std::int64_t>(e - s) * (lo == hi ? 1 : 2);
      }
      s = e;
    }
    float* row = grid + static_cast<std::int64_t>(j - grid_row0) * setup.nx + tile.i0;
    raster_row_heights(sc.pieces.data(), static_cast<int>(sc.pieces.size()), dw_f, profile,
                       stream ? sc.h.data() : row);
    if (stream) copy_cells_stream(sc.h.data(), width, row);
  }
  return true;
}

}  // namespace cuspmap

// Level-distance tile sweep: eligibility per tile, tile- and block-level pruning of the moves
// that can be nearest, one height per row where the only nearest moves run parallel to the rows,
// SIMD row kernels elsewhere. Inputs: SweepSetup, moves, tile; output: the tile's cells (um, NaN =
// unreached). Method: see distance_tile.h.
#include "sweep/distance_tile.h"

#include <algorithm>
#include <array>
#include <cmath>
#include <limits>
#include <numbers>

#include "core/units.h"
#include "sweep/nearest_rows.h"
#include "sweep/raster_tile.h"

namespace cuspmap {
namespace {

constexpr double kInf = std::numeric_limits<double>::infinity();
// Columns per block that shares one pruned move list: narrow enough that a raster at an angle
// keeps ~4 passes per block (64 x 10 um = 0.64 mm), wide enough that the scalar bounds of the
// tile's moves cost little against 64 x 32 cells of SIMD work.
constexpr int kBlockCols = 64;
// Relative slack on the pruning comparisons: the bounds are computed in double from the same
// inputs, so 1e-12 covers their rounding (a few ulps) without keeping any real extra move.
constexpr double kPruneSlack = 1e-12;
// Grid size from which constant runs bypass the caches: twice the largest last-level cache of
// common 2-socket-free servers (32 MiB); below it the grid may stay cached for the next stage.
constexpr std::int64_t kStreamGridBytes = std::int64_t{64} << 20;

// Margin by which a move must clear the lowest level moves' highest height on a tile to be left
// out of it: far above the float rounding of heights (~1e-7 mm at a few mm), far below any
// clearance a path lifts by.
constexpr double kAboveMarginMm = 1e-6;

double sq(double v) { return v * v; }

// Squared distance from p to the level line move m, in its frame (the row kernel's formula).
double line_point_d2(const PreparedMove& m, const Eigen::Vector2d& p) {
  const Eigen::Vector2d rel = p - m.a_mm;
  const double u = rel.dot(m.dir), w = rel.dot(m.perp);
  return sq(w) + sq(std::max({0.0, -u, u - m.length_xy_mm}));
}

// True when the arc passes the direction v from its centre (v != 0).
bool arc_covers(const PreparedMove& m, const Eigen::Vector2d& v) {
  if (std::abs(m.sweep_rad) >= 2.0 * std::numbers::pi) return true;
  const double mid = m.start_angle_rad + 0.5 * m.sweep_rad;
  return v.dot(Eigen::Vector2d(std::cos(mid), std::sin(mid))) >=
         v.norm() * std::cos(0.5 * std::abs(m.sweep_rad));
}

// Squared upper bound of the distance from every point of the convex hull of pts[0..n) to move
// m: the distance to a convex set is convex, so for a line the largest value at the points
// bounds it; for an arc any point P on the arc gives |x - P|, itself convex, tried at the ends
// and at the arc point facing the points' centroid.
double upper_d2(const PreparedMove& m, const Eigen::Vector2d* pts, int n) {
  double best = 0.0;
  if (m.kind == MoveKind::Line) {
    for (int k = 0; k < n; ++k) best = std::max(best, line_point_d2(m, pts[k]));
    return best;
  }
  auto via = [&](const Eigen::Vector2d& on_arc) {
    double d2 = 0.0;
    for (int k = 0; k < n; ++k) d2 = std::max(d2, (pts[k] - on_arc).squaredNorm());
    return d2;
  };
  best = std::min(via(m.a_mm), via(m.b_mm));
  Eigen::Vector2d centroid(0.0, 0.0);
  for (int k = 0; k < n; ++k) centroid += pts[k] / n;
  const Eigen::Vector2d v = centroid - m.centre_mm;
  const double rho = v.norm();
  if (rho > 0.0 && arc_covers(m, v)) {
    best = std::min(best, via(m.centre_mm + v * (m.arc_radius_mm / rho)));
  }
  return best;
}

// Squared distance from move m to the box: exact for lines, for arcs a lower bound (the arc's
// bounding box to the box).
double box_d2(const PreparedMove& m, double x_lo, double x_hi, double y_lo, double y_hi) {
  if (m.kind == MoveKind::Arc) {
    const double dx = std::max({x_lo - m.x_max_mm, 0.0, m.x_min_mm - x_hi});
    const double dy = std::max({y_lo - m.y_max_mm, 0.0, m.y_min_mm - y_hi});
    return dx * dx + dy * dy;
  }
  return sq(m.distance_to_box(x_lo, x_hi, y_lo, y_hi));
}

// p(d) of the untilted ball / undished bull-nose / flat at d^2 = d2 <= R^2, mm, in the
// cancellation-free form u^2 / (rc + sqrt(rc^2 - u^2)) of rc - sqrt(rc^2 - u^2).
double profile_mm(const SweepSetup& s, double d2) {
  if (s.corner_mm == 0.0) return 0.0;
  const double u = std::clamp(std::sqrt(d2) - s.flat_mm, 0.0, s.corner_mm);
  const double u2 = s.flat_mm == 0.0 ? std::min(d2, s.corner_mm * s.corner_mm) : u * u;
  return u2 / (s.corner_mm + std::sqrt(s.corner_mm * s.corner_mm - u2));
}

// Lower and upper bound of the squared distance from move m to the box with the given corners.
// A line whose frame puts every corner beside it (0 <= u <= L) is exactly |w| away at each
// corner; any other move takes box_d2 and upper_d2.
void tile_bounds(const PreparedMove& m, const Eigen::Vector2d (&corners)[4], double& lo2,
                 double& hi2) {
  if (m.kind == MoveKind::Line && m.length_xy_mm > 0.0) {
    double u_lo = kInf, u_hi = -kInf, w_lo = kInf, w_hi = -kInf;
    for (const Eigen::Vector2d& c : corners) {
      const Eigen::Vector2d rel = c - m.a_mm;
      const double u = rel.dot(m.dir), w = rel.dot(m.perp);
      u_lo = std::min(u_lo, u);
      u_hi = std::max(u_hi, u);
      w_lo = std::min(w_lo, w);
      w_hi = std::max(w_hi, w);
    }
    if (u_lo >= 0.0 && u_hi <= m.length_xy_mm) {
      lo2 = w_lo > 0.0 ? sq(w_lo) : (w_hi < 0.0 ? sq(w_hi) : 0.0);
      hi2 = std::max(sq(w_lo), sq(w_hi));
      return;
    }
  }
  lo2 = box_d2(m, corners[0].x(), corners[3].x(), corners[0].y(), corners[3].y());
  hi2 = upper_d2(m, corners, 4);
}

// Per-thread work lists, reused from tile to tile (no allocation per tile).
struct Scratch {
  std::vector<double> lo2;
  std::vector<const PreparedMove*> tile_kept, kept;
  std::vector<float> heights;
  std::vector<char> beside;
  std::vector<double> key, heights_key;  // what `heights` were computed from
  std::vector<int> level;                // the tile's moves that can lower a cell
};

Scratch& scratch() {
  thread_local Scratch s;
  return s;
}

// The moves of `from` that can be nearest to some cell centre of the box [x_lo, x_hi] x
// [y_lo, y_hi]: every such cell is at most U from its nearest move (U the least upper bound over
// the moves), so a move whose distance to the box exceeds U (or the reach) is nearest nowhere.
void prune(const std::vector<const PreparedMove*>& from, double x_lo, double x_hi, double y_lo,
           double y_hi, double reach2, std::vector<double>& lo2,
           std::vector<const PreparedMove*>& to) {
  const Eigen::Vector2d corners[4] = {{x_lo, y_lo}, {x_hi, y_lo}, {x_lo, y_hi}, {x_hi, y_hi}};
  lo2.resize(from.size());
  double u2 = kInf;
  for (std::size_t q = 0; q < from.size(); ++q) {
    double hi2 = 0.0;
    tile_bounds(*from[q], corners, lo2[q], hi2);
    u2 = std::min(u2, hi2);
  }
  const double limit2 = std::min(u2, reach2) * (1.0 + kPruneSlack);
  to.clear();
  for (std::size_t q = 0; q < from.size(); ++q) {
    if (lo2[q] <= limit2) to.push_back(from[q]);
  }
}

// True when every move is a line along X beside all of [x_lo, x_hi] (a raster at angle 0): each
// row is then at the least |w| of them from its nearest move, one height per row.
bool rows_parallel(const std::vector<const PreparedMove*>& kept, double x_lo, double x_hi) {
  return std::all_of(kept.begin(), kept.end(), [&](const PreparedMove* m) {
    if (m->kind != MoveKind::Line || m->perp.x() != 0.0) return false;
    const double u0 = (x_lo - m->a_mm.x()) * m->dir.x(), u1 = (x_hi - m->a_mm.x()) * m->dir.x();
    return std::min(u0, u1) >= 0.0 && std::max(u0, u1) <= m->length_xy_mm;
  });
}

// Squared distances from cells [0, count) of the row starting at p0 to the nearest of `kept`.
// `beside[q]` marks lines whose every cell of the block lies beside them (0 <= u <= L): their
// distance is |w| alone.
void row_d2(const std::vector<const PreparedMove*>& kept, const std::vector<char>& beside,
            const Eigen::Vector2d& p0, double cell, int count, float* d2) {
  fill_cells(std::numeric_limits<float>::infinity(), count, d2);
  for (std::size_t q = 0; q < kept.size(); ++q) {
    const PreparedMove& m = *kept[q];
    if (beside[q]) {
      const Eigen::Vector2d rel = p0 - m.a_mm;
      band_d2_min(static_cast<float>(rel.dot(m.perp)), static_cast<float>(cell * m.perp.x()), count,
                  d2);
      continue;
    }
    if (m.kind == MoveKind::Line) {
      // Offsets in double at the run's first cell, steps in float: the float sums stay within a
      // run of kBlockCols cells, so their rounding is an ulp of a few mm.
      const Eigen::Vector2d rel = p0 - m.a_mm;
      const double ua = rel.dot(m.dir);
      LineRow lr;
      lr.ua = static_cast<float>(ua);
      lr.ub = static_cast<float>(ua - m.length_xy_mm);
      lr.du = static_cast<float>(cell * m.dir.x());
      lr.w = static_cast<float>(rel.dot(m.perp));
      lr.dw = static_cast<float>(cell * m.perp.x());
      line_d2_min(lr, count, d2);
      continue;
    }
    ArcRow ar;
    ar.vx = p0.x() - m.centre_mm.x();
    ar.vy = p0.y() - m.centre_mm.y();
    ar.ax = p0.x() - m.a_mm.x();
    ar.ay = p0.y() - m.a_mm.y();
    ar.bx = p0.x() - m.b_mm.x();
    ar.by = p0.y() - m.b_mm.y();
    ar.step = cell;
    ar.radius = m.arc_radius_mm;
    const double mid = m.start_angle_rad + 0.5 * m.sweep_rad;
    ar.mid_x = std::cos(mid);
    ar.mid_y = std::sin(mid);
    ar.cos_half = std::abs(m.sweep_rad) >= 2.0 * std::numbers::pi
                      ? -2.0
                      : std::cos(0.5 * std::abs(m.sweep_rad));
    arc_d2_min(ar, count, d2);
  }
}

// The tile's moves that can lower a cell, into `out`; false when one of them is not a level move
// at the lowest level moves' height z_low (the general envelope then takes the tile). The
// lowest level moves leave at most z_low + p(U) on every cell, U the least over them of the
// largest distance to the tile's corners (when U is within reach), so a move whose lowest point
// is above that (a one-way raster's return at clearance height) leaves only higher values.
bool level_moves(const SweepSetup& setup, const std::vector<PreparedMove>& moves,
                 const std::vector<int>& tile_moves, const TileRect& tile, std::vector<int>& out) {
  out.clear();
  auto level_at = [&](const PreparedMove& m, double z) {
    return !m.vertical() && m.z0_mm == z && m.z1_mm == z;
  };
  double z_low = kInf;
  for (int k : tile_moves) {
    const PreparedMove& m = moves[k];
    if (level_at(m, m.z0_mm)) z_low = std::min(z_low, m.z0_mm);
  }
  if (z_low == kInf) return tile_moves.empty();
  const double cell = setup.cell_mm;
  const double x_lo = (tile.i0 + 0.5) * cell, x_hi = (tile.i1 - 0.5) * cell;
  const double y_lo = (tile.j0 + 0.5) * cell, y_hi = (tile.j1 - 0.5) * cell;
  const Eigen::Vector2d corners[4] = {{x_lo, y_lo}, {x_hi, y_lo}, {x_lo, y_hi}, {x_hi, y_hi}};
  double u2 = kInf;
  for (int k : tile_moves) {
    if (level_at(moves[k], z_low)) u2 = std::min(u2, upper_d2(moves[k], corners, 4));
  }
  const double reach = setup.envelope.reach_mm;
  const double ceiling_mm =
      u2 <= reach * reach ? z_low + profile_mm(setup, u2) + kAboveMarginMm : kInf;
  for (int k : tile_moves) {
    const PreparedMove& m = moves[k];
    if (level_at(m, z_low)) {
      out.push_back(k);
    } else if (m.z_min_mm <= ceiling_mm) {
      return false;
    }
  }
  return true;
}

}  // namespace

bool distance_tile(const SweepSetup& setup, const std::vector<PreparedMove>& moves,
                   const std::vector<int>& tile_moves, const TileRect& tile, float* grid,
                   int grid_row0, std::int64_t& visits) {
  Scratch& sc = scratch();
  if (!level_moves(setup, moves, tile_moves, tile, sc.level)) return false;
  const std::vector<int>& level = sc.level;
  const int nx = setup.nx;
  const double cell = setup.cell_mm, reach = setup.envelope.reach_mm;
  const double reach2 = reach * reach;
  auto row_of = [&](int j) { return grid + static_cast<std::int64_t>(j - grid_row0) * nx; };
  const double base_um =
      level.empty() ? 0.0 : (moves[level.front()].z0_mm + setup.axial_min_mm) * kUmPerMm;
  auto height_um = [&](double d2) {
    return d2 <= reach2 ? static_cast<float>(base_um + kUmPerMm * profile_mm(setup, d2))
                        : kUnreached;
  };

  // Grids far beyond any cache take constant runs as streaming stores (no read of the line).
  const bool stream =
      static_cast<std::int64_t>(setup.nx) * setup.ny * static_cast<std::int64_t>(sizeof(float)) >=
      kStreamGridBytes;
  sc.kept.clear();
  for (int k : level) sc.kept.push_back(&moves[k]);
  const double y_lo = (tile.j0 + 0.5) * cell, y_hi = (tile.j1 - 0.5) * cell;
  prune(sc.kept, (tile.i0 + 0.5) * cell, (tile.i1 - 0.5) * cell, y_lo, y_hi, reach2, sc.lo2,
        sc.tile_kept);

  const bool whole_tile =
      rows_parallel(sc.tile_kept, (tile.i0 + 0.5) * cell, (tile.i1 - 0.5) * cell);
  // A raster at an angle: two candidate lines per cell, no blocks.
  if (!whole_tile &&
      raster_tile(setup, sc.tile_kept, tile, base_um, grid, grid_row0, stream, visits)) {
    if (stream) stream_fence();
    return true;
  }
  // Blocks of columns, each with the moves that can be nearest in it.
  for (int b0 = tile.i0; b0 < tile.i1; b0 += kBlockCols) {
    const int b1 = std::min(tile.i1, b0 + kBlockCols);
    const int width = b1 - b0;
    const double x_lo = (b0 + 0.5) * cell, x_hi = (b1 - 0.5) * cell;
    const std::vector<const PreparedMove*>* kept = &sc.tile_kept;
    if (!whole_tile) {
      prune(sc.tile_kept, x_lo, x_hi, y_lo, y_hi, reach2, sc.lo2, sc.kept);
      kept = &sc.kept;
    }
    const int fill_width = whole_tile ? tile.i1 - b0 : width;
    if (kept->empty() || whole_tile || rows_parallel(*kept, x_lo, x_hi)) {
      // One height per row: heights first (independent square roots overlap), then the fills.
      // They depend only on the values in `key`, so the next tile of the same tile row (the
      // usual next tile of a worker) reuses them.
      std::vector<double>& key = sc.key;
      key.assign({double(tile.j0), double(tile.j1), cell, base_um, setup.flat_mm, setup.corner_mm,
                  reach2});
      for (const PreparedMove* m : *kept) {
        key.push_back(m->a_mm.y());
        key.push_back(m->perp.y());
      }
      if (key != sc.heights_key) {
        sc.heights.resize(tile.j1 - tile.j0);
        for (int j = tile.j0; j < tile.j1; ++j) {
          const double y = (j + 0.5) * cell;
          double w2 = kInf;
          for (const PreparedMove* m : *kept) {
            w2 = std::min(w2, sq((y - m->a_mm.y()) * m->perp.y()));
          }
          sc.heights[j - tile.j0] = height_um(w2);
        }
        sc.heights_key.swap(key);
      }
      for (int j = tile.j0; j < tile.j1; ++j) {
        if (stream) {
          fill_cells_stream(sc.heights[j - tile.j0], fill_width, row_of(j) + b0);
        } else {
          fill_cells(sc.heights[j - tile.j0], fill_width, row_of(j) + b0);
        }
      }
      visits += static_cast<std::int64_t>(fill_width) * (tile.j1 - tile.j0);
      if (whole_tile) break;
      continue;
    }
    sc.beside.resize(kept->size());
    for (std::size_t q = 0; q < kept->size(); ++q) {
      const PreparedMove& m = *(*kept)[q];
      bool inside = m.kind == MoveKind::Line;
      for (double cx : {x_lo, x_hi}) {
        for (double cy : {y_lo, y_hi}) {
          const double u = (Eigen::Vector2d(cx, cy) - m.a_mm).dot(m.dir);
          inside = inside && u >= 0.0 && u <= m.length_xy_mm;
        }
      }
      sc.beside[q] = inside;
    }
    std::array<float, kBlockCols> d2{};
    for (int j = tile.j0; j < tile.j1; ++j) {
      const Eigen::Vector2d p0((b0 + 0.5) * cell, (j + 0.5) * cell);
      row_d2(*kept, sc.beside, p0, cell, width, d2.data());
      profile_heights(d2.data(), width, static_cast<float>(base_um),
                      static_cast<float>(setup.flat_mm), static_cast<float>(setup.corner_mm),
                      static_cast<float>(reach2), row_of(j) + b0);
    }
    visits += static_cast<std::int64_t>(width) * (tile.j1 - tile.j0) *
              static_cast<std::int64_t>(kept->size());
  }
  if (stream) stream_fence();
  return true;
}

}  // namespace cuspmap

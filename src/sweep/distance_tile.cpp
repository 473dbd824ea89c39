// Level-distance tile sweep: eligibility per tile, tile- and run-level pruning of the moves that
// can be nearest, constant fills where the only nearest moves run parallel to the row, SIMD row
// kernels elsewhere. Inputs: SweepSetup, moves, tile; output: the tile's cells (um, NaN =
// unreached). Method: see distance_tile.h.
#include "sweep/distance_tile.h"

#include <algorithm>
#include <array>
#include <cmath>
#include <limits>
#include <numbers>

#include "sweep/nearest_rows.h"

namespace cuspmap {
namespace {

constexpr double kInf = std::numeric_limits<double>::infinity();
constexpr double kUmPerMm = 1000.0;
// Cells per run that shares one pruned candidate list: short enough that a raster at an angle
// crosses about one pass per run (64 x 10 um = 0.64 mm), long enough to amortise the scalar
// bound of each candidate over 64 SIMD lanes.
constexpr int kRunCells = 64;
// Relative slack on the pruning comparisons: the bounds are computed in double from the same
// inputs, so 1e-12 covers their rounding (a few ulps) without keeping any real extra move.
constexpr double kPruneSlack = 1e-12;

double sq(double v) { return v * v; }

// Squared distance from p to segment a-b (a == b allowed).
double point_segment_d2(const Eigen::Vector2d& p, const Eigen::Vector2d& a,
                        const Eigen::Vector2d& b) {
  const Eigen::Vector2d ab = b - a;
  const double len2 = ab.squaredNorm();
  const double t = len2 > 0.0 ? std::clamp((p - a).dot(ab) / len2, 0.0, 1.0) : 0.0;
  return (p - (a + t * ab)).squaredNorm();
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
    for (int k = 0; k < n; ++k) best = std::max(best, point_segment_d2(pts[k], m.a_mm, m.b_mm));
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

// A move prepared for one row: kernel parameters and the double values the bounds use.
struct RowMove {
  const PreparedMove* move = nullptr;
  double ua = 0.0, du = 0.0, w = 0.0, dw = 0.0;  // lines: cell 0 of the row, step per cell
  double vx = 0.0, vy = 0.0;                     // arcs: cell 0 minus centre
};

// Lower and upper bound of the squared distance over cells [n0, n1] of the row; `constant` is
// set when the distance is the same for every one of those cells (a parallel line beside them).
void run_bounds(const RowMove& r, const Eigen::Vector2d& p0, double cell, int n0, int n1,
                double& lo2, double& hi2, bool& constant) {
  const PreparedMove& m = *r.move;
  constant = false;
  if (m.kind == MoveKind::Line) {
    const double u0 = r.ua + n0 * r.du, u1 = r.ua + n1 * r.du;
    const double w0 = r.w + n0 * r.dw, w1 = r.w + n1 * r.dw;
    const double length = m.length_xy_mm;
    auto d2_at = [&](double u, double w) { return sq(w) + sq(std::max({0.0, -u, u - length})); };
    hi2 = std::max(d2_at(u0, w0), d2_at(u1, w1));
    const double w_lo = (w0 > 0.0) != (w1 > 0.0) ? 0.0 : std::min(std::abs(w0), std::abs(w1));
    const double u_min = std::min(u0, u1), u_max = std::max(u0, u1);
    const double t_lo = std::max({0.0, -u_max, u_min - length});
    lo2 = sq(w_lo) + sq(t_lo);
    constant = r.dw == 0.0 && u_min >= 0.0 && u_max <= length;
    return;
  }
  const double x0 = r.vx + n0 * cell, x1 = r.vx + n1 * cell;
  const double near_x = (x0 > 0.0) != (x1 > 0.0) ? 0.0 : std::min(std::abs(x0), std::abs(x1));
  const double rho_min = std::hypot(near_x, r.vy);
  const double rho_max = std::max(std::hypot(x0, r.vy), std::hypot(x1, r.vy));
  const double ra = m.arc_radius_mm;
  lo2 = ra >= rho_min && ra <= rho_max ? 0.0 : sq(std::min(std::abs(rho_min - ra), std::abs(rho_max - ra)));
  const Eigen::Vector2d ends[2] = {p0 + Eigen::Vector2d(n0 * cell, 0.0),
                                   p0 + Eigen::Vector2d(n1 * cell, 0.0)};
  hi2 = upper_d2(m, ends, 2);
}

// Per-thread work lists, reused from tile to tile (no allocation per tile).
struct Scratch {
  std::vector<double> tile_lo2, lo2, hi2;
  std::vector<const PreparedMove*> kept;
  std::vector<RowMove> row_moves;
  std::vector<int> row_chosen, chosen, all;
  std::vector<char> constant;
  std::vector<float> heights;
};

Scratch& scratch() {
  thread_local Scratch s;
  return s;
}

}  // namespace

bool distance_tile(const SweepSetup& setup, const std::vector<PreparedMove>& moves,
                   const std::vector<int>& tile_moves, const TileRect& tile, float* grid,
                   int grid_row0, std::int64_t& visits) {
  for (int k : tile_moves) {
    const PreparedMove& m = moves[k];
    if (m.vertical() || m.z0_mm != m.z1_mm || m.z0_mm != moves[tile_moves.front()].z0_mm) {
      return false;
    }
  }
  const int nx = setup.nx;
  const double cell = setup.cell_mm, reach = setup.envelope.reach_mm;
  auto row_of = [&](int j) { return grid + static_cast<std::int64_t>(j - grid_row0) * nx; };
  if (tile_moves.empty()) {
    for (int j = tile.j0; j < tile.j1; ++j) std::fill(row_of(j) + tile.i0, row_of(j) + tile.i1, kUnreached);
    return true;
  }
  const double z_mm = moves[tile_moves.front()].z0_mm;
  const double base_um = (z_mm + setup.axial_min_mm) * kUmPerMm;

  // Tile level: every cell's nearest move is at most U away (U from the move that is nearest in
  // the worst corner), so only moves within U of the tile can be nearest anywhere on it.
  const double x_lo = (tile.i0 + 0.5) * cell, x_hi = (tile.i1 - 0.5) * cell;
  const double y_lo = (tile.j0 + 0.5) * cell, y_hi = (tile.j1 - 0.5) * cell;
  const Eigen::Vector2d corners[4] = {{x_lo, y_lo}, {x_hi, y_lo}, {x_lo, y_hi}, {x_hi, y_hi}};
  Scratch& sc = scratch();
  sc.tile_lo2.resize(tile_moves.size());
  double tile_u2 = kInf;
  for (std::size_t q = 0; q < tile_moves.size(); ++q) {
    double hi2 = 0.0;
    tile_bounds(moves[tile_moves[q]], corners, sc.tile_lo2[q], hi2);
    tile_u2 = std::min(tile_u2, hi2);
  }
  const double tile_limit2 = std::min(tile_u2, reach * reach) * (1.0 + kPruneSlack);
  std::vector<const PreparedMove*>& kept = sc.kept;
  kept.clear();
  for (std::size_t q = 0; q < tile_moves.size(); ++q) {
    if (sc.tile_lo2[q] <= tile_limit2) kept.push_back(&moves[tile_moves[q]]);
  }

  std::vector<RowMove>& row_moves = sc.row_moves;
  row_moves.resize(kept.size());
  std::vector<int>& row_chosen = sc.row_chosen;
  std::vector<int>& chosen = sc.chosen;
  std::vector<double>& lo2 = sc.lo2;
  std::vector<double>& hi2 = sc.hi2;
  std::vector<char>& constant = sc.constant;
  for (auto* v : {&row_chosen, &chosen}) v->resize(kept.size());
  for (auto* v : {&lo2, &hi2}) v->resize(kept.size());
  constant.resize(kept.size());
  std::array<float, kRunCells> d2{};
  const double reach2 = reach * reach;
  // Moves of `from` (indices into row_moves) that can be nearest somewhere in cells [n0, n1]
  // of the current row go to `to`; returns their count. `all_constant` tells whether each of
  // them is a parallel line beside every one of those cells, const_d2 the least such distance.
  const Eigen::Vector2d* p0_now = nullptr;
  auto select = [&](const int* from, int from_count, int n0, int n1, int* to, bool& all_constant,
                    double& const_d2) {
    double u2 = kInf;
    for (int q = 0; q < from_count; ++q) {
      const int c = from[q];
      bool is_const = false;
      run_bounds(row_moves[c], *p0_now, cell, n0, n1, lo2[c], hi2[c], is_const);
      constant[c] = is_const;
      u2 = std::min(u2, hi2[c]);
    }
    const double limit2 = std::min(u2, reach2) * (1.0 + kPruneSlack);
    int count = 0;
    all_constant = true;
    const_d2 = kInf;
    for (int q = 0; q < from_count; ++q) {
      const int c = from[q];
      if (lo2[c] > limit2) continue;
      to[count++] = c;
      all_constant = all_constant && constant[c];
      if (constant[c]) const_d2 = std::min(const_d2, sq(row_moves[c].w));
    }
    return count;
  };
  // Height of a constant run, remembered for the next run at the same distance.
  double last_d2 = -1.0;
  float last_h_um = 0.0f;
  auto fill = [&](float* out, int cells, double const_d2) {
    if (const_d2 != last_d2) {
      last_h_um = const_d2 <= reach2 ? static_cast<float>(base_um + kUmPerMm * profile_mm(setup, const_d2))
                                     : kUnreached;
      last_d2 = const_d2;
    }
    fill_cells(last_h_um, cells, out);
    visits += cells;
  };
  std::vector<int>& all = sc.all;
  all.resize(kept.size());
  for (std::size_t c = 0; c < kept.size(); ++c) all[c] = static_cast<int>(c);
  const int width = tile.i1 - tile.i0;

  // Every remaining move a line along X beside the whole width of the tile (a raster at angle
  // 0): each row's distance is the least |w| of its moves, one constant per row.
  const bool rows_parallel = std::all_of(kept.begin(), kept.end(), [&](const PreparedMove* m) {
    if (m->kind != MoveKind::Line || m->perp.x() != 0.0) return false;
    const double u0 = (x_lo - m->a_mm.x()) * m->dir.x(), u1 = (x_hi - m->a_mm.x()) * m->dir.x();
    return std::min(u0, u1) >= 0.0 && std::max(u0, u1) <= m->length_xy_mm;
  });
  if (rows_parallel && !kept.empty()) {
    // Heights of all rows first (independent square roots overlap), then the fills.
    std::vector<float>& heights = sc.heights;
    heights.resize(tile.j1 - tile.j0);
    for (int j = tile.j0; j < tile.j1; ++j) {
      const double y = (j + 0.5) * cell;
      double w2 = kInf;
      for (const PreparedMove* m : kept) w2 = std::min(w2, sq((y - m->a_mm.y()) * m->perp.y()));
      heights[j - tile.j0] = w2 <= reach2 ? static_cast<float>(base_um + kUmPerMm * profile_mm(setup, w2))
                                         : kUnreached;
    }
    for (int j = tile.j0; j < tile.j1; ++j) fill_cells(heights[j - tile.j0], width, row_of(j) + tile.i0);
    visits += static_cast<std::int64_t>(width) * (tile.j1 - tile.j0);
    return true;
  }

  for (int j = tile.j0; j < tile.j1; ++j) {
    const double y = (j + 0.5) * cell;
    const Eigen::Vector2d p0((tile.i0 + 0.5) * cell, y);
    p0_now = &p0;
    for (std::size_t c = 0; c < kept.size(); ++c) {
      const PreparedMove& m = *kept[c];
      RowMove& r = row_moves[c];
      r.move = &m;
      if (m.kind == MoveKind::Line) {
        const Eigen::Vector2d rel = p0 - m.a_mm;
        r.ua = rel.dot(m.dir);
        r.w = rel.dot(m.perp);
        r.du = cell * m.dir.x();
        r.dw = cell * m.perp.x();
      } else {
        r.vx = p0.x() - m.centre_mm.x();
        r.vy = p0.y() - m.centre_mm.y();
      }
    }
    float* row = row_of(j) + tile.i0;
    // Whole row first (a raster along X fills it at once), then runs from the row's survivors.
    bool all_constant = false;
    double const_d2 = kInf;
    const int row_count = select(all.data(), static_cast<int>(all.size()), 0, width - 1,
                                 row_chosen.data(), all_constant, const_d2);
    if (row_count == 0 || all_constant) {
      fill(row, width, const_d2);
      continue;
    }
    for (int n0 = 0; n0 < width; n0 += kRunCells) {
      const int n1 = std::min(width, n0 + kRunCells) - 1;
      const int cells = n1 - n0 + 1;
      const int count =
          select(row_chosen.data(), row_count, n0, n1, chosen.data(), all_constant, const_d2);
      if (count == 0 || all_constant) {
        // A run beside parallel passes only (or out of reach): one height for every cell.
        fill(row + n0, cells, const_d2);
        continue;
      }
      fill_cells(std::numeric_limits<float>::infinity(), cells, d2.data());
      for (int q = 0; q < count; ++q) {
        const RowMove& r = row_moves[chosen[q]];
        const PreparedMove& m = *r.move;
        if (m.kind == MoveKind::Line) {
          LineRow lr;
          const double ua = r.ua + n0 * r.du;
          lr.ua = static_cast<float>(ua);
          lr.ub = static_cast<float>(ua - m.length_xy_mm);
          lr.du = static_cast<float>(r.du);
          lr.w = static_cast<float>(r.w + n0 * r.dw);
          lr.dw = static_cast<float>(r.dw);
          line_d2_min(lr, cells, d2.data());
        } else {
          ArcRow ar;
          const double s = n0 * cell;
          ar.vx = r.vx + s;
          ar.vy = r.vy;
          ar.ax = p0.x() + s - m.a_mm.x();
          ar.ay = y - m.a_mm.y();
          ar.bx = p0.x() + s - m.b_mm.x();
          ar.by = y - m.b_mm.y();
          ar.step = cell;
          ar.radius = m.arc_radius_mm;
          const double mid = m.start_angle_rad + 0.5 * m.sweep_rad;
          ar.mid_x = std::cos(mid);
          ar.mid_y = std::sin(mid);
          ar.cos_half = std::abs(m.sweep_rad) >= 2.0 * std::numbers::pi
                            ? -2.0
                            : std::cos(0.5 * std::abs(m.sweep_rad));
          arc_d2_min(ar, cells, d2.data());
        }
      }
      visits += static_cast<std::int64_t>(cells) * count;
      profile_heights(d2.data(), cells, static_cast<float>(base_um),
                      static_cast<float>(setup.flat_mm), static_cast<float>(setup.corner_mm),
                      static_cast<float>(reach2), row + n0);
    }
  }
  return true;
}

}  // namespace cuspmap

// Chooses the detail window where the marks are deepest (plane-removed Sq) and crops it.
// Inputs: heightfield (um, mm cells); outputs: window (cells, mm, Sq um), cropped heightfield.
// Method: least-squares plane z = a + b i + c j per window from summed tile moments (normal
// equations, ISO 25178-2 F-operator), then Sq = sqrt(mean squared residual).
#include "report/detail_window.h"

#include <Eigen/Dense>
#include <algorithm>
#include <cmath>
#include <cstdint>
#include <limits>
#include <vector>

#include "report/finite_row.h"

namespace cuspmap {
namespace {

// Sums of one tile: count, z, z^2 and the moments the plane fit needs (i, j in cells, global).
struct Moments {
  double n = 0, z = 0, zz = 0, i = 0, j = 0, ii = 0, jj = 0, ij = 0, iz = 0, jz = 0;
  void add(const Moments& m) {
    n += m.n, z += m.z, zz += m.zz, i += m.i, j += m.j;
    ii += m.ii, jj += m.jj, ij += m.ij, iz += m.iz, jz += m.jz;
  }
};

// 0 + 1 + ... + (m - 1) and 0 + 1 + 4 + ... + (m - 1)^2, exact in 64 bits for m <= 2^20.
std::int64_t sum_to(std::int64_t m) { return m * (m - 1) / 2; }
std::int64_t sum_squares_to(std::int64_t m) { return (m - 1) * m * (2 * m - 1) / 6; }

// Window starts along an axis of n cells for a window of w cells on a step of s cells: 0, s, ...
// and n - w (flush with the far edge). All are multiples of s except possibly the last.
std::vector<int> starts(int n, int w, int s) {
  std::vector<int> out;
  for (int a = 0; a + w <= n; a += s) out.push_back(a);
  if (out.empty() || out.back() != n - w) out.push_back(n - w);
  return out;
}

// Residual mean square about the least-squares plane; with fewer than 3 cells or a degenerate
// spread, about the mean.
double residual_ms(const Moments& m) {
  if (m.n < 1) return 0.0;
  const double mean = m.z / m.n;
  const double var = std::max(0.0, m.zz / m.n - mean * mean);
  if (m.n < 3) return var;
  // Centred normal equations for the slopes b, c: [Sii Sij; Sij Sjj] [b c]' = [Siz Sjz]'.
  const double mi = m.i / m.n, mj = m.j / m.n;
  Eigen::Matrix2d a;
  a << m.ii / m.n - mi * mi, m.ij / m.n - mi * mj, m.ij / m.n - mi * mj, m.jj / m.n - mj * mj;
  const Eigen::Vector2d rhs(m.iz / m.n - mi * mean, m.jz / m.n - mj * mean);
  if (std::abs(a.determinant()) < 1e-12 * (1.0 + a.squaredNorm())) return var;
  const Eigen::Vector2d slope = a.ldlt().solve(rhs);
  return std::max(0.0, var - slope.dot(rhs));  // explained variance of a linear fit: beta' rhs
}

}  // namespace

DetailWindow choose_detail_window(const Heightfield& hf) {
  const int aimed = std::clamp(static_cast<int>(std::lround(kDetailTargetMm / hf.cell_mm)),
                               kDetailMinCells, kDetailMaxCells);
  // A whole number of steps per side, so that most windows are sums of whole tiles.
  const int s = std::max(1, aimed / kDetailStepsPerWindow);
  const int side = s * kDetailStepsPerWindow;
  const int wx = std::min(side, hf.nx), wy = std::min(side, hf.ny);
  // Tile sums on an s x s grid aligned with the window starts; a window flush with the far edge
  // is summed from the cells themselves (it is one of few).
  const int tx = (hf.nx + s - 1) / s, ty = (hf.ny + s - 1) / s;
  std::vector<Moments> tiles(static_cast<std::size_t>(tx) * ty);
  const auto add_cell = [&](Moments& m, int j, int i) {
    const float v = hf.z_um(j, i);
    if (!std::isfinite(v)) return;
    const double z = v;
    m.n += 1, m.z += z, m.zz += z * z, m.i += i, m.j += j;
    m.ii += static_cast<double>(i) * i, m.jj += static_cast<double>(j) * j;
    m.ij += static_cast<double>(i) * j;
    m.iz += i * z, m.jz += j * z;
  };
  // Per row, each tile's run of cells is summed in the terms that vary along the row (count,
  // z, z^2, i, i^2, i z); the row's j enters once per run.
  for (int j = 0; j < hf.ny; ++j) {
    Moments* row = &tiles[static_cast<std::size_t>(j / s) * tx];
    const float* z_row = &hf.z_um(j, 0);
    const double jd = j;
    const bool all_finite = hf.nx <= (1 << 20) && row_all_finite(z_row, hf.nx);
    for (int a = 0; a < tx; ++a) {
      double n = 0, z = 0, zz = 0, si = 0, sii = 0, siz = 0;
      const int i0 = a * s, i1 = std::min(hf.nx, (a + 1) * s);
      if (all_finite) {
        // No test per cell; count, sum of i and of i^2 are whole numbers below 2^53, which the
        // cell-by-cell double sums hold exactly: the same values in closed form.
        for (int i = i0; i < i1; ++i) {
          const double zi = z_row[i], id = i;
          z += zi, zz += zi * zi, siz += id * zi;
        }
        n = static_cast<double>(i1 - i0);
        si = static_cast<double>(sum_to(i1) - sum_to(i0));
        sii = static_cast<double>(sum_squares_to(i1) - sum_squares_to(i0));
      } else {
        for (int i = i0; i < i1; ++i) {
          const float v = z_row[i];
          if (!std::isfinite(v)) continue;
          const double zi = v, id = i;
          n += 1, z += zi, zz += zi * zi, si += id, sii += id * id, siz += id * zi;
        }
      }
      Moments& m = row[a];
      m.n += n, m.z += z, m.zz += zz, m.i += si, m.j += n * jd;
      m.ii += sii, m.jj += n * jd * jd, m.ij += si * jd;
      m.iz += siz, m.jz += z * jd;
    }
  }
  // A window's moments: the whole tiles inside it, then the cells of its head strips (a window
  // flush with the far edge starts inside a tile; it ends at the floor's edge, where the last
  // tile ends too). Windows are whole numbers of steps, so a start on the tile grid ends on it.
  const auto window_moments = [&](int i0, int j0) {
    Moments m;
    const int ia = (i0 + s - 1) / s, ja = (j0 + s - 1) / s;  // first whole tile
    const int i_end = i0 + wx, j_end = j0 + wy;
    const bool whole_tiles = wx % s == 0 && wy % s == 0 && (i_end % s == 0 || i_end == hf.nx) &&
                             (j_end % s == 0 || j_end == hf.ny);
    if (!whole_tiles) {
      for (int j = j0; j < j_end; ++j) {
        for (int i = i0; i < i_end; ++i) add_cell(m, j, i);
      }
      return m;
    }
    const int ib = (i_end + s - 1) / s, jb = (j_end + s - 1) / s;  // one past the last tile
    for (int b = ja; b < jb; ++b) {
      for (int a = ia; a < ib; ++a) m.add(tiles[static_cast<std::size_t>(b) * tx + a]);
    }
    for (int j = j0; j < ja * s; ++j) {  // head rows, the whole width
      for (int i = i0; i < i_end; ++i) add_cell(m, j, i);
    }
    for (int j = ja * s; j < j_end; ++j) {  // head columns beside the tiles
      for (int i = i0; i < ia * s; ++i) add_cell(m, j, i);
    }
    return m;
  };
  // Score every window; keep the most reached ones.
  struct Candidate {
    int i0, j0;
    double n, ms;
  };
  std::vector<Candidate> candidates;
  double most_n = 0.0, best_ms = 0.0;
  for (const int j0 : starts(hf.ny, wy, s)) {
    for (const int i0 : starts(hf.nx, wx, s)) {
      const Moments m = window_moments(i0, j0);
      candidates.push_back({i0, j0, m.n, residual_ms(m)});
      most_n = std::max(most_n, m.n);
    }
  }
  for (const Candidate& c : candidates) {
    if (c.n == most_n) best_ms = std::max(best_ms, c.ms);
  }
  // Of the windows whose Sq is within kDetailSqTolerance of the deepest, the one nearest the
  // floor's centre: on an even floor the detail then shows the middle, not a corner.
  const double floor_ms = best_ms * (1.0 - kDetailSqTolerance) * (1.0 - kDetailSqTolerance);
  DetailWindow best;
  double best_d2 = std::numeric_limits<double>::infinity();
  for (const Candidate& c : candidates) {
    if (c.n != most_n || c.ms < floor_ms) continue;
    const double dx = c.i0 + 0.5 * wx - 0.5 * hf.nx, dy = c.j0 + 0.5 * wy - 0.5 * hf.ny;
    if (dx * dx + dy * dy < best_d2) {
      best_d2 = dx * dx + dy * dy;
      best.i0 = c.i0;
      best.j0 = c.j0;
      best_ms = c.ms;
    }
  }
  best.nx = wx;
  best.ny = wy;
  best.x0_mm = hf.origin_x_mm + best.i0 * hf.cell_mm;
  best.y0_mm = hf.origin_y_mm + best.j0 * hf.cell_mm;
  best.size_x_mm = wx * hf.cell_mm;
  best.size_y_mm = wy * hf.cell_mm;
  best.sq_um = std::sqrt(std::max(best_ms, 0.0));
  return best;
}

Heightfield crop_heightfield(const Heightfield& hf, const DetailWindow& w) {
  Heightfield out;
  out.nx = w.nx;
  out.ny = w.ny;
  out.cell_mm = hf.cell_mm;
  out.origin_x_mm = hf.origin_x_mm + w.i0 * hf.cell_mm;
  out.origin_y_mm = hf.origin_y_mm + w.j0 * hf.cell_mm;
  out.z_um = hf.z_um.block(w.j0, w.i0, w.ny, w.nx);
  return out;
}

}  // namespace cuspmap

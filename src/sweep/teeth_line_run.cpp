// Tooth-resolved heights of a run of grid cells beside one straight move (LineTeeth::sweep_run):
// the cells of a row parallel to the move share their chord, its minima and bearing series, so
// each cell's crossings are the same closed forms as LineTeeth::height_mm, taken in SIMD lanes.
// Inputs: grid row (y mm, cells i_lo..i_hi), the row's heights (um); output: the row, lowered.
// Method: the series reversion of bearing_series.h in plain counted loops, cloned for AVX-512,
// AVX2 and the baseline (built with -ffp-contract=off, -fno-math-errno and -fno-trapping-math,
// CMakeLists.txt: every clone does the scalar path's exact IEEE operations, and the lanes hold
// no NaN, so nothing can trap); cells the closed form does not settle take the scalar path.
#include <algorithm>
#include <array>
#include <cmath>
#include <cstdint>
#include <limits>

#include "core/units.h"
#include "sweep/lane_clones.h"
#include "sweep/teeth_line.h"

namespace cuspmap {
namespace {

constexpr double kInf = std::numeric_limits<double>::infinity();
// Cells per block: the lanes' scratch arrays stay in L1.
constexpr int kBlock = 128;
// The same tolerance as teeth_line.cpp's kRootTolMm (crossing position, mm).
constexpr double kRootTolMm = 1e-10;
// The same offset as teeth_line.cpp's kOnLineOffsetMm for a cell on the move's line.
constexpr double kOnLineOffsetMm = 1e-12;

// One walk from one chord minimum in one direction, for every cell of the block: the constants
// of LineTeeth::height_mm's closed-form step (Crossings::newton_from's series branch).
struct SeriesWalk {
  double x0 = 0.0, f0 = 0.0, dir = 0.0, limit = 0.0;
  double period = 0.0, inv_period = 0.0;
  BearingSeries series;
};

// Per lane: the crossing x where found = 1 (0: none within reach) and whether the closed form
// settled it (unsettled = 1: the scalar path takes the cell);
// the series root of bearing_series_root and the settling tests of newton_from, same order.
// floor and ceil in SIMD lanes (the baseline has no rounding instruction): adding and taking
// away 2^52 rounds to an integer (round to nearest, IEEE 754), then one step fixes the direction.
// Exact for |v| < 2^51 (lattice steps are at most ~1e5 here), as std::floor / std::ceil (the
// sign of a zero aside, which no later step can see: it only ever adds to a non-zero term).
constexpr double kTwo52 = 4503599627370496.0;
inline double lane_round(double v) {
  const double big = std::copysign(kTwo52, v);
  return (v + big) - big;
}
inline double lane_floor(double v) {
  const double r = lane_round(v);
  return r > v ? r - 1.0 : r;
}
inline double lane_ceil(double v) {
  const double r = lane_round(v);
  return r < v ? r + 1.0 : r;
}

// A lane the family does not count for (counts[j] = 0) is never marked unsettled. Constants are
// copied to locals (no aliasing with the outputs) and tests combined bitwise, so the loop has no
// branch and takes SIMD lanes.
template <bool kRising>
CUSPMAP_CLONES void series_crossings(const SeriesWalk& k, const double* __restrict target,
                                     const double* __restrict counts, int count,
                                     double* __restrict x_out, double* __restrict found,
                                     double* __restrict unsettled) {
  const double x0 = k.x0, f0 = k.f0, dir = k.dir, limit = k.limit;
  const double period = k.period, inv_period = k.inv_period;
  const double inv_a = k.series.inv_a, k2 = k.series.k2, k3 = k.series.k3, k4 = k.series.k4;
  const double a = k.series.a, b = k.series.b, c = k.series.c, d = k.series.d;
  const double rem = k.series.rem, inv_min_slope = k.series.inv_min_slope;
  const double window = k.series.window_mm;
  for (int j = 0; j < count; ++j) {
    const double steps = (f0 - target[j]) * inv_period;
    const double lattice = target[j] + period * (kRising ? lane_ceil(steps) : lane_floor(steps));
    const double delta = lattice - f0;
    const double t = delta * inv_a;
    const double h = t + t * t * (k2 + t * (k3 + t * k4));
    const double ah = std::abs(h);
    const double residual = h * (a + h * (b + h * (c + h * d))) - delta;
    const double h2 = ah * ah;
    const double err = (std::abs(residual) + h2 * h2 * ah * rem) * inv_min_slope;
    const bool ok = (err <= kRootTolMm) & (ah + err < window);
    const double xs = x0 + h;
    const bool beyond = (xs - limit) * dir > kRootTolMm;
    const bool inside = ((xs - x0) * dir >= 0.0) & ((limit - xs) * dir > kRootTolMm);
    x_out[j] = xs;
    found[j] = (ok & inside) ? 1.0 : 0.0;
    const bool open = (counts[j] != 0.0) & !(ok & (beyond | inside));
    unsettled[j] = open ? 1.0 : unsettled[j];
  }
}

// Per lane: best = min(best, height at x) where the family counts (Crossings::height for a
// single-line tooth profile without runout: c - k x + (a + b clamp(r, r0, r1)) + axial).
struct LineHeight {
  double w2 = 0.0, slope = 0.0, radius_mm = 0.0, axial_mm = 0.0;
  double a = 0.0, b = 0.0, r0 = 0.0, r1 = 0.0;
};

CUSPMAP_CLONES void line_heights(const LineHeight& p, const double* __restrict x,
                                 const double* __restrict found, const double* __restrict c,
                                 const double* __restrict counts, int count,
                                 double* __restrict best) {
  const double w2 = p.w2, slope = p.slope, radius = p.radius_mm, axial = p.axial_mm;
  const double a = p.a, b = p.b, r0 = p.r0, r1 = p.r1;
  for (int j = 0; j < count; ++j) {
    const double xj = x[j];
    const double r = std::sqrt(w2 + xj * xj);
    const double rc = r < r0 ? r0 : (r1 < r ? r1 : r);  // std::clamp(r, r0, r1)
    const double hgt = c[j] - slope * xj + (a + b * rc) + axial;
    const bool take = (counts[j] != 0.0) & (found[j] != 0.0) & !((r < 0.0) | (r > radius)) & (hgt < best[j]);
    best[j] = take ? hgt : best[j];
  }
}

// The cells' coordinates along the move (u) as sweep_tile's scalar loop forms them, rel . dir
// with rel = p - a (a sum of two rounded products: Eigen's dot, in lanes); returns the common
// lateral offset rel . perp of the n cells, NaN when they differ (a move not along the rows).
CUSPMAP_CLONES double cell_coords(const PreparedMove& m, double cell_mm, double y_mm, int i0,
                                  int count, double* __restrict u) {
  const double ax = m.a_mm.x(), ry = y_mm - m.a_mm.y();
  const double dx = m.dir.x(), dy = m.dir.y(), px = m.perp.x(), py = m.perp.y();
  const double w0 = ((static_cast<double>(i0) + 0.5) * cell_mm - ax) * px + ry * py;
  std::int64_t differ = 0;  // lanes as wide as the doubles: the reduction vectorizes
  for (int j = 0; j < count; ++j) {
    const double rx = (static_cast<double>(i0 + j) + 0.5) * cell_mm - ax;
    u[j] = rx * dx + ry * dy;
    differ += rx * px + ry * py != w0 ? 1 : 0;
  }
  return differ == 0 ? w0 : std::numeric_limits<double>::quiet_NaN();
}

// Per lane, for one tooth family: whether it can lower the cell (height_mm's test against the
// best so far and the bound) and its lattice target; returns whether any lane counts.
CUSPMAP_CLONES bool family_lanes(double value_mm, double axial_mm, double phase0, double kappa,
                                 double spacing_rad, const double* __restrict c,
                                 const double* __restrict u, const double* __restrict best,
                                 const double* __restrict bound, int count,
                                 double* __restrict counts, double* __restrict target) {
  std::int64_t any = 0;
  for (int j = 0; j < count; ++j) {
    const double cap = bound[j] < best[j] ? bound[j] : best[j];  // std::min(best, bound)
    const bool in = c[j] + value_mm + axial_mm < cap;
    counts[j] = in ? 1.0 : 0.0;
    any += in ? 1 : 0;
    target[j] = (phase0 + kappa * u[j]) + spacing_rad;
  }
  return any != 0;
}

// line_heights for any tooth profile (ball, bull-nose: several pieces), one lane at a time.
void profile_heights(const RevolvedProfile& tooth, const LineHeight& p, const double* x,
                     const double* found, const double* c, const double* counts, int count,
                     double* best) {
  for (int j = 0; j < count; ++j) {
    const double xj = x[j];
    if (counts[j] == 0.0 || found[j] == 0.0) continue;
    const double r = std::sqrt(p.w2 + xj * xj);
    if (r < 0.0 || r > p.radius_mm) continue;
    best[j] = std::min(best[j], c[j] - p.slope * xj + tooth.height_mm(r) + p.axial_mm);
  }
}

}  // namespace

bool LineTeeth::run_ready(double w_mm) {
  if (w_mm == run_key_w_) return run_ok_;
  run_key_w_ = w_mm;
  run_ok_ = false;
  const double reach = setup_.envelope.reach_mm;
  // height_mm's own steps for the offset: the on-line nudge, the reach test, the half chord.
  if (w_mm == 0.0) w_mm = setup_.omega_rad_per_s > 0.0 ? -kOnLineOffsetMm : kOnLineOffsetMm;
  run_w_ = w_mm;
  run_w2_ = w_mm * w_mm;
  if (run_w2_ > reach * reach) return run_ok_ = true;  // every cell +inf
  run_half_ = std::sqrt(reach * reach - run_w2_);
  prepare_chord(w_mm, -run_half_, run_half_);
  // The lanes take the series branch only: no turning points of the bearing on the chord, no
  // runout offset (Newton's), a usable series at every minimum.
  if (turn_mm_ != 0.0) return false;
  const RevolvedProfile& tooth = setup_.tooth;
  if (!(tooth.reach_mm >= tooth.radius_mm)) return false;
  run_line_profile_ = tooth.pieces.size() == 1 && tooth.pieces[0].kind == PieceKind::Line;
  for (std::size_t t = 0; t < setup_.families.size(); ++t) {
    const ToothFamily& tf = setup_.families[t];
    if (tf.e_sin_mm != 0.0 || tf.e_cos_mm != 0.0) return false;
    for (int i = 0; i < minima_[t].count; ++i) {
      const Start& st = starts_[t][i];
      if (st.series.min_slope == 0.0 || st.s0 == 0.0) return false;
    }
  }
  return run_ok_ = true;
}

void LineTeeth::sweep_run(double y_mm, int i_lo, int i_hi, float* row) {
  const SweepSetup& s = setup_;
  const PreparedMove& m = move_;
  auto scalar_cell = [&](int i, double u, double w) {
    const double h = height_mm(u, w, row[i] / kUmPerMm);
    const float h_um = static_cast<float>(h * kUmPerMm);
    if (h_um < row[i]) row[i] = h_um;
  };
  std::array<double, kBlock> u{}, c{}, bound{}, target{}, best{}, x{}, found{};
  std::array<int, kBlock> cell{};
  std::array<double, kBlock> counts{}, unsettled{};  // 0 or 1 (lanes as wide as the rest)
  std::array<int, kBlock> edge{};
  for (int i0 = i_lo; i0 <= i_hi; i0 += kBlock) {
    const int n = std::min(kBlock, i_hi - i0 + 1);
    const double w_row = cell_coords(m, s.cell_mm, y_mm, i0, n, u.data());
    if (!(w_row == w_row) || !run_ready(w_row)) {
      for (int j = 0; j < n; ++j) {
        const Eigen::Vector2d p((i0 + j + 0.5) * s.cell_mm, y_mm);
        const Eigen::Vector2d rel = p - m.a_mm;
        scalar_cell(i0 + j, rel.dot(m.dir), rel.dot(m.perp));
      }
      continue;
    }
    if (run_w2_ > s.envelope.reach_mm * s.envelope.reach_mm) continue;  // out of reach: +inf
    // Cells whose chord is the whole chord (the cached one) and whose bound lets the move in;
    // the chord of a cell near the move's ends is shorter: those take the scalar path after.
    const double length = m.length_xy_mm, half = run_half_;
    int active = 0, edges = 0;
    // Compacted without branches (which cells pass is data-dependent): every slot is written,
    // the counters advance only for the cells kept. Slot `active` <= j was already read.
    const double c0 = m.z0_mm, rise = rise_, lateral = run_w_ * tilt_across_, low = low_mm_;
    for (int j = 0; j < n; ++j) {
      const double uj = u[j];
      const double lo = std::max(uj - length, -half), hi = std::min(uj, half);
      const bool interior = (lo == -half) & (hi == half);
      const double cj = c0 + rise * uj - lateral;
      const double bj = row[i0 + j] / kUmPerMm;
      edge[edges] = j;
      edges += !interior;
      cell[active] = j;
      u[active] = uj;
      c[active] = cj;
      bound[active] = bj;
      active += interior & (cj + low < bj);  // height_mm's bound test: else +inf
    }
    std::fill(best.begin(), best.begin() + active, kInf);
    std::fill(unsettled.begin(), unsettled.begin() + active, 0.0);
    const std::vector<ToothFamily>& families = s.families;
    for (std::size_t t = 0; t < families.size() && active > 0; ++t) {
      const ToothFamily& tf = families[t];
      const ChordMin& mn = minima_[t];
      if (!family_lanes(mn.value_mm, tf.axial_mm, phase0_, kappa_, tf.spacing_rad, c.data(),
                        u.data(), best.data(), bound.data(), active, counts.data(),
                        target.data())) {
        continue;
      }
      LineHeight lh;
      lh.w2 = run_w2_;
      lh.slope = slope_;
      lh.radius_mm = s.tooth.radius_mm;
      lh.axial_mm = tf.axial_mm;
      const ProfilePiece& piece = s.tooth.pieces.front();
      lh.a = piece.a;
      lh.b = piece.b;
      lh.r0 = piece.r0_mm;
      lh.r1 = piece.r1_mm;
      for (int i = 0; i < mn.count; ++i) {
        const Start& st = starts_[t][i];
        for (double dir : {-1.0, 1.0}) {
          SeriesWalk k;
          k.x0 = mn.candidates[i].x_mm;
          k.dir = dir;
          k.limit = std::clamp(k.x0 + dir * walk_mm_, -half, half);
          if ((k.limit - k.x0) * dir <= 0.0) continue;  // nothing to walk: no crossing
          k.f0 = st.f0;
          k.period = tf.period_rad;
          k.inv_period = 1.0 / tf.period_rad;
          k.series = st.series;
          if (st.s0 * dir > 0.0) {
            series_crossings<true>(k, target.data(), counts.data(), active, x.data(),
                                   found.data(), unsettled.data());
          } else {
            series_crossings<false>(k, target.data(), counts.data(), active, x.data(),
                                    found.data(), unsettled.data());
          }
          if (run_line_profile_) {
            line_heights(lh, x.data(), found.data(), c.data(), counts.data(), active, best.data());
          } else {
            profile_heights(s.tooth, lh, x.data(), found.data(), c.data(), counts.data(), active,
                            best.data());
          }
        }
      }
    }
    for (int a = 0; a < active; ++a) {
      const int i = i0 + cell[a];
      if (unsettled[a] != 0.0) {  // a crossing the closed form left open: the scalar path, whole
        scalar_cell(i, u[a], run_w_);
        continue;
      }
      const double h = best[a];
      const float h_um = static_cast<float>(h * kUmPerMm);
      if (h_um < row[i]) row[i] = h_um;
    }
    for (int e = 0; e < edges; ++e) {
      const int j = edge[e];
      const Eigen::Vector2d p((i0 + j + 0.5) * s.cell_mm, y_mm);
      const Eigen::Vector2d rel = p - m.a_mm;
      scalar_cell(i0 + j, rel.dot(m.dir), rel.dot(m.perp));
    }
  }
}

}  // namespace cuspmap

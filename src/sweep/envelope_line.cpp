// Envelope of straight moves on grid rows: float fast path for a ball (one sqrt per cell, a
// constant fill where the row runs parallel to the move), closed forms for any revolved profile,
// chord minimisation for ramps and tilt. Inputs: SweepSetup, PreparedMove; output: row (um).
// Method: DESIGN.md "Geometry" envelope of a revolving cutter.
#include "sweep/envelope_line.h"

#include <algorithm>
#include <cmath>
#include <limits>

#include "tool/chord_min.h"

namespace cuspmap {
namespace {

constexpr double kInf = std::numeric_limits<double>::infinity();
constexpr float kUmPerMm = 1000.0f;
// Cells per SIMD block of the ball kernel: a few cache lines, a multiple of any vector width.
constexpr int kBallBlock = 64;
// Smallest radicand of the ball kernel (mm^2): Eigen's SSE sqrt goes through 1/sqrt, which a
// zero turns into 0 x inf (an invalid operation that debug builds trap); sqrt(1e-20) = 1e-10 mm
// changes no height.
constexpr float kSqrtFloorMm2 = 1e-20f;

// Slope k of the linear term along the move (tip rise per mm plus the tilt drop along dir) and
// the tilt's cross-move part, see envelope_line_mm.
double along_slope(const SweepSetup& s, const PreparedMove& m) {
  return (m.z1_mm - m.z0_mm) / m.length_xy_mm + s.tilt.dot(m.dir);
}

// Cells n in [0, count) whose u = u0 + n du lies in [0, L]; empty when first > last.
void middle_range(double u0, double du, double length, int count, int& first, int& last) {
  double a = (0.0 - u0) / du, b = (length - u0) / du;
  if (a > b) std::swap(a, b);
  first = static_cast<int>(std::max(0.0, std::ceil(a)));
  last = static_cast<int>(std::min(static_cast<double>(count - 1), std::floor(b)));
}

inline void lower(float& cell, float h) { cell = std::min(cell, h); }

// Ball without runout or tilt on a level move: z + R - sqrt(R^2 - d^2), d the distance to the
// segment. Float, in blocks Eigen maps onto SIMD registers (sqrt, min per lane); the
// subtraction loses at most an ulp of R (2.4e-7 mm at R = 3 mm), under a nanometre.
void ball_row(float r, float c_um, float u0, float du, float w0, float dw, float length, int count,
              float* out) {
  using Block = Eigen::Array<float, kBallBlock, 1>;
  const Block ramp = Block::LinSpaced(kBallBlock, 0.0f, static_cast<float>(kBallBlock - 1));
  const float r2 = r * r;
  for (int first = 0; first < count; first += kBallBlock) {
    const int n = std::min(kBallBlock, count - first);
    const Block index = ramp + static_cast<float>(first);
    const Block u = u0 + index * du;
    const Block w = w0 + index * dw;
    const Block t = (-u).max(u - length).max(0.0f);
    const Block d2 = w.square() + t.square();
    const Block h = c_um + kUmPerMm * (r - (r2 - d2).max(kSqrtFloorMm2).sqrt());
    Eigen::Map<Eigen::ArrayXf> cells(out + first, n);
    cells = cells.min(h.head(n));
  }
}

}  // namespace

double envelope_line_mm(const SweepSetup& setup, const PreparedMove& move, double u_mm,
                        double w_mm) {
  const RevolvedProfile& q = setup.envelope;
  if (move.vertical()) {
    const double d = std::hypot(u_mm, w_mm);
    if (d > q.reach_mm) return kInf;
    return move.z_min_mm + q.height_mm(d) - setup.tilt.dot(Eigen::Vector2d(u_mm, w_mm));
  }
  const double length = move.length_xy_mm;
  const double rise = (move.z1_mm - move.z0_mm) / length;
  const double k = along_slope(setup, move);
  const double c = move.z0_mm + rise * u_mm - w_mm * setup.tilt.dot(move.perp);
  if (k == 0.0) {
    const double t = std::max({0.0, -u_mm, u_mm - length});
    const double d_min = std::hypot(w_mm, t);
    if (d_min > q.reach_mm) return kInf;
    const double d_max = std::hypot(w_mm, std::max(std::abs(u_mm), std::abs(u_mm - length)));
    return c + q.min_over_mm(d_min, d_max);
  }
  // Along the move the cell sees the axis at offsets x = u - s, s in [0, L].
  return c + chord_min(q, w_mm, k, u_mm - length, u_mm, false).value_mm;
}

void envelope_line_row(const SweepSetup& setup, const PreparedMove& move, double y_mm, int i_lo,
                       int i_hi, float* row) {
  const int count = i_hi - i_lo + 1;
  const Eigen::Vector2d p0((i_lo + 0.5) * setup.cell_mm - move.a_mm.x(), y_mm - move.a_mm.y());
  const double u0 = p0.dot(move.dir), w0 = p0.dot(move.perp);
  const double du = setup.cell_mm * move.dir.x(), dw = setup.cell_mm * move.perp.x();
  float* out = row + i_lo;
  const double axial_um = setup.axial_min_mm * kUmPerMm;
  const RevolvedProfile& q = setup.envelope;

  const bool level_untilted = !move.vertical() && move.z0_mm == move.z1_mm &&
                              setup.tilt.x() == 0.0 && setup.tilt.y() == 0.0;
  if (level_untilted && (q.is_centred_circle() || q.non_decreasing())) {
    // A level move of an untilted cutter whose profile rises from the axis: the height depends
    // on the distance to the segment only, z + q(d_min).
    const double c_um = move.z0_mm * kUmPerMm + axial_um;
    int mid_first = count, mid_last = -1;
    if (dw == 0.0) {
      // Row parallel to the move: every cell beside the segment is at distance |w0|.
      middle_range(u0, du, move.length_xy_mm, count, mid_first, mid_last);
      if (mid_first <= mid_last) {
        const float h = static_cast<float>(c_um + kUmPerMm * q.height_mm(std::abs(w0)));
        for (int n = mid_first; n <= mid_last; ++n) lower(out[n], h);
      }
    }
    auto run = [&](int first, int last) {
      if (first > last) return;
      if (q.is_centred_circle()) {
        ball_row(static_cast<float>(q.radius_mm), static_cast<float>(c_um),
                 static_cast<float>(u0 + first * du), static_cast<float>(du),
                 static_cast<float>(w0 + first * dw), static_cast<float>(dw),
                 static_cast<float>(move.length_xy_mm), last - first + 1, out + first);
        return;
      }
      for (int n = first; n <= last; ++n) {
        const double u = u0 + n * du, w = w0 + n * dw;
        const double t = std::max({0.0, -u, u - move.length_xy_mm});
        const double h = q.height_mm(std::hypot(w, t));
        if (h < kInf) lower(out[n], static_cast<float>(c_um + kUmPerMm * h));
      }
    };
    if (mid_first <= mid_last) {
      run(0, mid_first - 1);
      run(mid_last + 1, count - 1);
    } else {
      run(0, count - 1);
    }
    return;
  }
  for (int n = 0; n < count; ++n) {
    const double h = envelope_line_mm(setup, move, u0 + n * du, w0 + n * dw);
    if (h < kInf) lower(out[n], static_cast<float>((h + setup.axial_min_mm) * kUmPerMm));
  }
}

}  // namespace cuspmap

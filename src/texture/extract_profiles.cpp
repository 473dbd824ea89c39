// Profile extraction: parallel lines across the field, bilinear samples, split at NaN runs.
// Inputs: heightfield, direction; output: traces. Cost O(samples).
// Method: line clipping against the cell-centre rectangle (slab method) and bilinear sampling.
#include "texture/extract_profiles.h"

#include <algorithm>
#include <cmath>
#include <numbers>

namespace cuspmap {
namespace {

// Positions within this many cells of a cell centre snap to it, so axis-aligned traces read the
// stored heights exactly (floating-point sums of cell sizes are off by ~1e-15).
constexpr double kSnapCells = 1e-7;

struct Frame {
  double cx, cy;          // centre of the cell-centre rectangle, mm
  double dx, dy;          // unit direction
  double nx, ny;          // unit normal (direction turned +90 deg)
  double x0, x1, y0, y1;  // cell-centre rectangle, mm
};

Frame make_frame(const Heightfield& hf, double direction_deg) {
  Frame f{};
  f.x0 = hf.x_mm(0);
  f.x1 = hf.x_mm(hf.nx - 1);
  f.y0 = hf.y_mm(0);
  f.y1 = hf.y_mm(hf.ny - 1);
  f.cx = 0.5 * (f.x0 + f.x1);
  f.cy = 0.5 * (f.y0 + f.y1);
  // Exact unit vectors at multiples of 90 deg: cos(pi/2) is 6e-17, not 0.
  double a = std::fmod(direction_deg, 360.0);
  if (a < 0.0) a += 360.0;
  const double quarter = a / 90.0;
  if (std::abs(quarter - std::round(quarter)) < 1e-12) {
    static constexpr double kCos[4] = {1.0, 0.0, -1.0, 0.0};
    static constexpr double kSin[4] = {0.0, 1.0, 0.0, -1.0};
    const int q = static_cast<int>(std::lround(quarter)) % 4;
    f.dx = kCos[q];
    f.dy = kSin[q];
  } else {
    f.dx = std::cos(a * std::numbers::pi / 180.0);
    f.dy = std::sin(a * std::numbers::pi / 180.0);
  }
  f.nx = -f.dy;
  f.ny = f.dx;
  return f;
}

// Parameter range [t0, t1] of the line p(t) = origin + t d inside the rectangle; false if none.
bool clip(const Frame& f, double ox, double oy, double eps, double& t0, double& t1) {
  t0 = -1e300;
  t1 = 1e300;
  const double lo[2] = {f.x0 - eps, f.y0 - eps}, hi[2] = {f.x1 + eps, f.y1 + eps};
  const double o[2] = {ox, oy}, d[2] = {f.dx, f.dy};
  for (int k = 0; k < 2; ++k) {
    if (d[k] == 0.0) {
      if (o[k] < lo[k] || o[k] > hi[k]) return false;
      continue;
    }
    // The range along the line is exact (no slack), so samples start on the edge cell centres.
    double a = (lo[k] + eps - o[k]) / d[k], b = (hi[k] - eps - o[k]) / d[k];
    if (a > b) std::swap(a, b);
    t0 = std::max(t0, a);
    t1 = std::min(t1, b);
  }
  return t1 >= t0;
}

// Bilinear height at (x, y); NaN when a cell with non-zero weight is NaN.
double sample(const Heightfield& hf, const Frame& f, double x, double y) {
  const double fx = (x - f.x0) / hf.cell_mm, fy = (y - f.y0) / hf.cell_mm;
  const int i0 =
      std::clamp(static_cast<int>(std::floor(fx + kSnapCells)), 0, std::max(0, hf.nx - 2));
  const int j0 =
      std::clamp(static_cast<int>(std::floor(fy + kSnapCells)), 0, std::max(0, hf.ny - 2));
  double tx = std::clamp(fx - i0, 0.0, 1.0), ty = std::clamp(fy - j0, 0.0, 1.0);
  if (tx < kSnapCells || hf.nx == 1) tx = 0.0;
  if (ty < kSnapCells || hf.ny == 1) ty = 0.0;
  if (tx > 1.0 - kSnapCells) tx = 1.0;
  if (ty > 1.0 - kSnapCells) ty = 1.0;
  double acc = 0.0;
  for (int b = 0; b < 2; ++b) {
    const double wy = b == 0 ? 1.0 - ty : ty;
    if (wy == 0.0) continue;
    for (int a = 0; a < 2; ++a) {
      const double wx = a == 0 ? 1.0 - tx : tx;
      if (wx == 0.0) continue;
      acc += wx * wy * hf.z_um(j0 + b, i0 + a);
    }
  }
  return acc;  // NaN propagates through the sum
}

}  // namespace

double longest_chord_mm(const Heightfield& hf, double direction_deg) {
  const Frame f = make_frame(hf, direction_deg);
  // The longest chord of a rectangle in a direction passes through its centre.
  double t0 = 0.0, t1 = 0.0;
  const double eps = kSnapCells * hf.cell_mm;
  if (!clip(f, f.cx, f.cy, eps, t0, t1)) return 0.0;
  return std::max(0.0, t1 - t0);
}

std::vector<ProfileTrace> extract_profiles(const Heightfield& hf, double direction_deg,
                                           int max_traces, double min_length_mm) {
  std::vector<ProfileTrace> traces;
  if (hf.nx < 1 || hf.ny < 1 || hf.cell_mm <= 0.0) return traces;
  const Frame f = make_frame(hf, direction_deg);
  const double cell = hf.cell_mm, eps = kSnapCells * cell;
  // Offsets of the rectangle's corners across the direction.
  double omin = 1e300, omax = -1e300;
  for (double x : {f.x0, f.x1}) {
    for (double y : {f.y0, f.y1}) {
      const double o = (x - f.cx) * f.nx + (y - f.cy) * f.ny;
      omin = std::min(omin, o);
      omax = std::max(omax, o);
    }
  }
  const long lines = static_cast<long>(std::floor((omax - omin) / cell + kSnapCells)) + 1;
  const long used = std::min<long>(lines, std::max(1, max_traces));
  for (long k = 0; k < used; ++k) {
    // Evenly spread pick of `used` lines among `lines`, always including both outermost.
    const long line = used == 1 ? lines / 2 : (k * (lines - 1) + (used - 1) / 2) / (used - 1);
    const double o = omin + static_cast<double>(line) * cell;
    const double ox = f.cx + o * f.nx, oy = f.cy + o * f.ny;
    double t0 = 0.0, t1 = 0.0;
    if (!clip(f, ox, oy, eps, t0, t1)) continue;
    const long count = static_cast<long>(std::floor((t1 - t0) / cell + kSnapCells)) + 1;
    ProfileTrace run;
    run.spacing_mm = cell;
    run.offset_mm = o;
    auto flush = [&]() {
      if (!run.z_um.empty() && run.length_mm() >= min_length_mm - eps) traces.push_back(run);
      run.z_um.clear();
    };
    for (long s = 0; s < count; ++s) {
      const double t = t0 + static_cast<double>(s) * cell;
      const double z = sample(hf, f, ox + t * f.dx, oy + t * f.dy);
      if (std::isnan(z)) {
        flush();
        continue;
      }
      if (run.z_um.empty()) run.start_mm = t;
      run.z_um.push_back(z);
    }
    flush();
  }
  return traces;
}

}  // namespace cuspmap

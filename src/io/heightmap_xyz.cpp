// ASCII XYZ point-list reader (grid inference, irregular points rejected) and writer.
// Inputs/outputs: Heightfield <-> text. Cost O(points log points).
// Method: regular-grid inference from sorted unique coordinates.
#include "io/heightmap_xyz.h"

#include <algorithm>
#include <cmath>
#include <vector>

#include "core/input_error.h"
#include "core/units.h"
#include "io/heightmap_text.h"

namespace cuspmap {
namespace {

struct Point {
  double x, y, z;
  size_t line;
};

// Smallest gap between distinct sorted values (0 when fewer than two).
double smallest_gap(std::vector<double> v) {
  std::sort(v.begin(), v.end());
  double gap = 0.0;
  for (size_t k = 1; k < v.size(); ++k) {
    const double d = v[k] - v[k - 1];
    // Gaps far below any real cell are the same coordinate printed twice with round-off.
    if (d > 1e-9 * std::max(1.0, std::abs(v[k])) && (gap == 0.0 || d < gap)) gap = d;
  }
  return gap;
}

// A scan fills most of its grid; a grid with more than 64 cells per point (under 2 % filled) is
// a stray point far from the scan, not a surface (common practice, no source).
constexpr double kMaxXyzCellsPerPoint = 64.0;

}  // namespace

std::string encode_xyz(const Heightfield& hf) {
  std::string out = "# X mm, Y mm, Z um above nominal\n";  // the reader skips '#' lines
  for (int j = 0; j < hf.ny; ++j) {
    for (int i = 0; i < hf.nx; ++i) {
      const float z = hf.z_um(j, i);
      if (std::isnan(z)) continue;
      out += format_coordinate(hf.x_mm(i)) + ' ' + format_coordinate(hf.y_mm(j)) + ' ' +
             format_height(z) + '\n';
    }
  }
  return out;
}

Heightfield decode_xyz(std::string_view text, const std::string& name) {
  std::vector<Point> pts;
  const std::vector<std::string_view> lines = split_lines(text);
  for (size_t l = 0; l < lines.size(); ++l) {
    std::string_view line = lines[l];
    while (!line.empty() && (line.front() == ' ' || line.front() == '\t')) line.remove_prefix(1);
    if (line.empty() || line.front() == '#') continue;
    const std::vector<std::string_view> f = split_fields(line);
    const std::string where = name + ":" + std::to_string(l + 1) + ": ";
    if (f.size() != 3) {
      throw InputError(where + std::to_string(f.size()) + " values, expected 3 (X Y Z)");
    }
    double v[3];
    for (int k = 0; k < 3; ++k) {
      if (!parse_height_value(f[static_cast<size_t>(k)], v[k]) || (k < 2 && std::isnan(v[k]))) {
        throw InputError(where + "value " + std::to_string(k + 1) + " '" +
                         std::string(f[static_cast<size_t>(k)]) + "' is not a number");
      }
    }
    pts.push_back({v[0], v[1], v[2], l + 1});
  }
  if (pts.empty()) throw InputError(name + ": no points (empty XYZ file)");
  std::vector<double> xs, ys;
  for (const Point& p : pts) {
    xs.push_back(p.x);
    ys.push_back(p.y);
  }
  const double gx = smallest_gap(xs), gy = smallest_gap(ys);
  if (gx == 0.0 && gy == 0.0) {
    throw InputError(name + ": all points share one position; cannot infer the grid cell");
  }
  // Square cells; a single row or column takes the other axis's spacing.
  const double cell = gx == 0.0 ? gy : gx;
  if (gx > 0.0 && gy > 0.0 && std::abs(gx - gy) > kXyzGridToleranceCells * cell) {
    throw InputError(name + ": X spacing " + format_number(gx) + " mm differs from Y spacing " +
                     format_number(gy) + " mm; cuspmap needs square cells");
  }
  const double x0 = *std::min_element(xs.begin(), xs.end());
  const double y0 = *std::min_element(ys.begin(), ys.end());
  const double x1 = *std::max_element(xs.begin(), xs.end());
  const double y1 = *std::max_element(ys.begin(), ys.end());
  // Counts in double, bounded before any integer conversion (a far point would overflow lround
  // and nx * ny).
  const double nx_d = std::floor((x1 - x0) / cell + 0.5) + 1.0;
  const double ny_d = std::floor((y1 - y0) / cell + 0.5) + 1.0;
  const double cells_d = nx_d * ny_d;
  const std::string grid = format_number(nx_d) + " x " + format_number(ny_d) + " cells (cell " +
                           format_number(cell) + " mm)";
  if (!(cells_d <= static_cast<double>(kMaxHeightmapCells))) {
    throw InputError(name + ": grid of " + grid + " is over the limit of " +
                     std::to_string(kMaxHeightmapCells) + " cells");
  }
  if (cells_d > kMaxXyzCellsPerPoint * static_cast<double>(pts.size())) {
    throw InputError(name + ": grid of " + grid + " for " + std::to_string(pts.size()) +
                     " points; at most " + format_number(kMaxXyzCellsPerPoint) +
                     " cells per point are allowed (is a point far off the scan?)");
  }
  const long nx = static_cast<long>(nx_d), ny = static_cast<long>(ny_d);
  Heightfield hf;
  hf.nx = static_cast<int>(nx);
  hf.ny = static_cast<int>(ny);
  hf.cell_mm = cell;
  hf.origin_x_mm = x0 - 0.5 * cell;
  hf.origin_y_mm = y0 - 0.5 * cell;
  hf.z_um = HeightGrid::Constant(hf.ny, hf.nx, kUnreached);
  std::vector<bool> seen(static_cast<size_t>(nx * ny), false);
  for (const Point& p : pts) {
    const double fx = (p.x - x0) / cell, fy = (p.y - y0) / cell;
    const long i = std::lround(fx), j = std::lround(fy);
    if (std::abs(fx - i) > kXyzGridToleranceCells || std::abs(fy - j) > kXyzGridToleranceCells) {
      throw InputError(name + ":" + std::to_string(p.line) + ": point (" + format_number(p.x) +
                       ", " + format_number(p.y) + ") is off the regular grid of cell " +
                       format_number(cell) + " mm starting at (" + format_number(x0) + ", " +
                       format_number(y0) + ")");
    }
    const size_t k = static_cast<size_t>(j * nx + i);
    if (seen[k]) {
      throw InputError(name + ":" + std::to_string(p.line) + ": point (" + format_number(p.x) +
                       ", " + format_number(p.y) + ") appears twice");
    }
    seen[k] = true;
    hf.z_um(j, i) = static_cast<float>(p.z);
  }
  return hf;
}

}  // namespace cuspmap

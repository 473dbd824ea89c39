// Heightfield allocation with a memory estimate checked before any allocation.
// Inputs: Patch (mm) and a byte limit; output: float grid (um), NaN-filled unless the caller
// writes every cell itself; large grids are advised into transparent huge pages.
// Method: plain dense Z-map (Choi & Jerard, Sculptured Surface Machining, 1998, ch. on Z-maps).
#include "core/heightfield.h"

#include <unistd.h>

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <limits>
#include <string>

#include "core/input_error.h"
#include "core/large_buffer.h"
#include "core/units.h"

namespace cuspmap {
namespace {

// Bytes -> "1.5 GiB" style text for messages.
std::string format_bytes(double bytes) {
  const char* units[] = {"B", "KiB", "MiB", "GiB", "TiB"};
  int u = 0;
  while (bytes >= 1024.0 && u < 4) {
    bytes /= 1024.0;
    ++u;
  }
  return format_number(std::round(bytes * 10.0) / 10.0) + " " + units[u];
}

// Cells along one side. Counts beyond kMaxCellsPerSide (far past any memory) saturate there, so
// the conversion to an integer never overflows whatever size/cell a file holds.
std::int64_t cells_along(double size_mm, double cell_mm) {
  // A tiny relative slack so that 10 mm / 0.01 mm is exactly 1000 cells, not 1001.
  constexpr double kSlack = 1e-9;
  constexpr double kMaxCellsPerSide = 1e15;
  const double n = std::ceil(size_mm / cell_mm - kSlack);
  if (!(n >= 1.0)) return 1;  // also NaN (an unvalidated patch): one cell
  return static_cast<std::int64_t>(std::min(n, kMaxCellsPerSide));
}

}  // namespace

void grid_dimensions(const Patch& patch, std::int64_t& nx, std::int64_t& ny) {
  nx = cells_along(patch.size_x_mm, patch.cell_mm);
  ny = cells_along(patch.size_y_mm, patch.cell_mm);
}

std::int64_t heightfield_bytes(const Patch& patch) {
  std::int64_t nx = 0, ny = 0;
  grid_dimensions(patch, nx, ny);
  const double bytes = static_cast<double>(nx) * static_cast<double>(ny) * sizeof(float);
  return bytes > 9e18 ? std::numeric_limits<std::int64_t>::max()
                      : static_cast<std::int64_t>(bytes);
}

std::int64_t physical_memory_bytes() {
  const long pages = sysconf(_SC_PHYS_PAGES);
  const long page_size = sysconf(_SC_PAGE_SIZE);
  if (pages <= 0 || page_size <= 0) return 0;
  return static_cast<std::int64_t>(pages) * page_size;
}

Heightfield make_heightfield(const Patch& patch, std::int64_t max_memory_bytes, GridFill fill) {
  std::int64_t limit = max_memory_bytes;
  if (limit <= 0) limit = physical_memory_bytes() / 2;
  std::int64_t nx = 0, ny = 0;
  grid_dimensions(patch, nx, ny);
  const std::int64_t bytes = heightfield_bytes(patch);
  if (nx > std::numeric_limits<int>::max() || ny > std::numeric_limits<int>::max() ||
      (limit > 0 && bytes > limit)) {
    throw InputError(
        "grid of " + std::to_string(nx) + " x " + std::to_string(ny) + " cells needs " +
        format_bytes(static_cast<double>(nx) * static_cast<double>(ny) * sizeof(float)) +
        ", over the memory limit of " + format_bytes(static_cast<double>(limit)) +
        "; use a larger cell, a smaller patch or --max-memory");
  }
  Heightfield hf;
  hf.nx = static_cast<int>(nx);
  hf.ny = static_cast<int>(ny);
  hf.cell_mm = patch.cell_mm;
  hf.origin_x_mm = patch.origin_x_mm;
  hf.origin_y_mm = patch.origin_y_mm;
  hf.z_um.resize(hf.ny, hf.nx);
  advise_huge_pages(hf.z_um.data(), static_cast<std::size_t>(hf.z_um.size()) * sizeof(float));
  if (fill == GridFill::Unreached) hf.z_um.setConstant(kUnreached);
  return hf;
}

std::int64_t reached_cells(const Heightfield& hf) {
  std::int64_t n = 0;
  const float* z = hf.z_um.data();
  for (std::int64_t k = 0; k < hf.cells(); ++k) n += std::isfinite(z[k]) ? 1 : 0;
  return n;
}

}  // namespace cuspmap

// Heightfield: a Z-map of the floor a pass leaves, float micrometres on a square grid of cells.
// Storage: ny rows x nx columns, row-major, row j runs along +X at y = origin_y + (j + 0.5) cell,
// column i at x = origin_x + (i + 0.5) cell. Heights are um above the nominal floor; a cell no
// move reached holds NaN and is left out of every statistic.
#pragma once

#include <Eigen/Core>
#include <cstddef>
#include <cstdint>
#include <limits>

namespace cuspmap {

/// Row-major float grid: rows = Y (index j), columns = X (index i). Stated once, here.
using HeightGrid = Eigen::Array<float, Eigen::Dynamic, Eigen::Dynamic, Eigen::RowMajor>;

/// The floor region simulated, in program coordinates (mm).
struct Patch {
  double size_x_mm = 10.0;   ///< extent along X, > 0
  double size_y_mm = 10.0;   ///< extent along Y, > 0
  double cell_mm = 0.01;     ///< grid spacing (square cells), > 0
  double origin_x_mm = 0.0;  ///< X of the patch's lower-left corner
  double origin_y_mm = 0.0;  ///< Y of the patch's lower-left corner
  double floor_z_mm = 0.0;   ///< nominal floor in program Z (G-code Z is read against it)
};

/// A grid of heights over a patch (or over one tile of it).
struct Heightfield {
  int nx = 0;                 ///< columns (along X)
  int ny = 0;                 ///< rows (along Y)
  double cell_mm = 0.0;       ///< cell size, mm
  double origin_x_mm = 0.0;   ///< X of the grid's lower-left corner (cell i's centre at +(i+0.5)cell)
  double origin_y_mm = 0.0;   ///< Y of the grid's lower-left corner
  HeightGrid z_um;            ///< ny x nx heights in um above the nominal floor; NaN = not reached

  /// X of column i's centre, mm.
  double x_mm(int i) const { return origin_x_mm + (i + 0.5) * cell_mm; }
  /// Y of row j's centre, mm.
  double y_mm(int j) const { return origin_y_mm + (j + 0.5) * cell_mm; }
  /// Number of cells.
  std::int64_t cells() const { return static_cast<std::int64_t>(nx) * ny; }
};

/// Height of a cell no move reached.
inline constexpr float kUnreached = std::numeric_limits<float>::quiet_NaN();

/// Grid dimensions for a patch: nx = ceil(size_x / cell), ny likewise (a partial cell at the top
/// or right edge counts as a whole one).
/// @param[in] patch  validated patch (sizes and cell > 0)
/// @param[out] nx, ny  columns and rows
void grid_dimensions(const Patch& patch, std::int64_t& nx, std::int64_t& ny);

/// Bytes a float grid of this patch would take (4 bytes per cell), for the memory check.
std::int64_t heightfield_bytes(const Patch& patch);

/// Physical memory of this machine in bytes (sysconf), or 0 when it cannot be read.
std::int64_t physical_memory_bytes();

/// What a new grid's cells hold.
enum class GridFill {
  Unreached,  ///< every cell kUnreached (NaN)
  None,       ///< left unwritten: for a caller that writes every cell itself (the sweep's tiles
              ///< cover the grid); saves a pass over the grid and lets its threads first-touch
              ///< the pages
};

/// Allocates the grid for a patch.
/// @param[in] patch             validated patch
/// @param[in] max_memory_bytes  limit; 0 means half of physical memory
/// @param[in] fill              kUnreached everywhere (default) or nothing
/// @throws InputError with the estimate and the limit when the grid would exceed it, or when
///         a dimension exceeds 2^31 - 1 cells.
Heightfield make_heightfield(const Patch& patch, std::int64_t max_memory_bytes,
                             GridFill fill = GridFill::Unreached);

/// Counts the cells that hold a finite height.
std::int64_t reached_cells(const Heightfield& hf);

}  // namespace cuspmap

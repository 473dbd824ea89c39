// CSV grid reader and writer.
// Inputs/outputs: Heightfield <-> text. Cost O(cells).
// Method: line/field splitting with locale-free numbers (io/heightmap_text.h).
#include "io/heightmap_csv.h"

#include <vector>

#include "core/input_error.h"
#include "core/units.h"
#include "io/heightmap_text.h"

namespace cuspmap {

std::string encode_csv_grid(const Heightfield& hf) {
  // The header states the units; the reader skips '#' lines, so the file still reads back.
  std::string out = "# heights in um above nominal; rows along +Y (first row at the lowest Y), "
                    "columns along +X; cell " + format_number(hf.cell_mm) + " mm\n";
  for (int j = 0; j < hf.ny; ++j) {
    for (int i = 0; i < hf.nx; ++i) {
      if (i > 0) out += ',';
      out += format_height(hf.z_um(j, i));
    }
    out += '\n';
  }
  return out;
}

Heightfield decode_csv_grid(std::string_view text, const std::string& name) {
  std::vector<float> values;
  size_t nx = 0;
  int ny = 0;
  size_t first_line = 0;
  const std::vector<std::string_view> lines = split_lines(text);
  for (size_t l = 0; l < lines.size(); ++l) {
    std::string_view line = lines[l];
    while (!line.empty() && (line.front() == ' ' || line.front() == '\t')) line.remove_prefix(1);
    if (line.empty() || line.front() == '#') continue;
    const std::vector<std::string_view> fields = split_fields(line);
    const std::string where = name + ":" + std::to_string(l + 1) + ": ";
    if (nx == 0) {
      nx = fields.size();
      first_line = l + 1;
    } else if (fields.size() != nx) {
      throw InputError(where + std::to_string(fields.size()) + " values, expected " +
                       std::to_string(nx) + " as on line " + std::to_string(first_line));
    }
    for (size_t f = 0; f < fields.size(); ++f) {
      double v = 0.0;
      if (!parse_height_value(fields[f], v)) {
        throw InputError(where + "value " + std::to_string(f + 1) + " '" + std::string(fields[f]) +
                         "' is not a number");
      }
      values.push_back(static_cast<float>(v));
    }
    ++ny;
  }
  if (ny == 0) throw InputError(name + ": no data rows (empty CSV grid)");
  Heightfield hf;
  hf.nx = static_cast<int>(nx);
  hf.ny = ny;
  hf.z_um = Eigen::Map<HeightGrid>(values.data(), ny, static_cast<Eigen::Index>(nx));
  return hf;
}

}  // namespace cuspmap

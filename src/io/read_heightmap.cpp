// Heightmap dispatch by extension or content, cell size from flag / sidecar / file, z units.
// Inputs: path and options; output: HeightmapFile. Cost O(file size).
// Method: format readers in io/heightmap_*.cpp and io/npy.cpp.
#include "io/read_heightmap.h"

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <fstream>
#include <nlohmann/json.hpp>
#include <sstream>

#include "core/input_error.h"
#include "core/units.h"
#include "io/heightmap_csv.h"
#include "io/heightmap_sdf.h"
#include "io/heightmap_x3p.h"
#include "io/heightmap_xyz.h"
#include "io/npy.h"

namespace cuspmap {
namespace {

// --cell and a cell stated by the file agree when within 1e-6 of each other.
constexpr double kSameCellRel = 1e-6;

std::string lower_extension(const std::string& path) {
  std::string ext = std::filesystem::path(path).extension().string();
  std::transform(ext.begin(), ext.end(), ext.begin(),
                 [](unsigned char c) { return static_cast<char>(std::tolower(c)); });
  return ext;
}

std::string detect_format(const std::string& path, const std::string& bytes) {
  const std::string ext = lower_extension(path);
  if (ext == ".npy") return "npy";
  if (ext == ".csv") return "csv";
  if (ext == ".xyz" || ext == ".txt" || ext == ".asc") return "xyz";
  if (ext == ".sdf") return "sdf";
  if (ext == ".x3p") return "x3p";
  if (bytes.rfind("\x93NUMPY", 0) == 0) return "npy";
  if (bytes.rfind("PK\x03\x04", 0) == 0) return "x3p";
  if (bytes.rfind("aBCR", 0) == 0 || bytes.rfind("aISO", 0) == 0 || bytes.rfind("bBCR", 0) == 0 ||
      bytes.rfind("bISO", 0) == 0) {
    return "sdf";
  }
  throw InputError(path + ": unknown heightmap format; use .npy, .csv, .xyz, .sdf or .x3p");
}

// cell_mm from a report.json beside the file (what `simulate` writes next to height.npy).
std::optional<double> sidecar_cell(const std::string& path) {
  const std::filesystem::path side = std::filesystem::path(path).parent_path() / "report.json";
  std::error_code ec;
  if (!std::filesystem::is_regular_file(side, ec)) return std::nullopt;
  const std::string text = read_all(side.string());
  const nlohmann::json doc = nlohmann::json::parse(text, nullptr, false);
  if (doc.is_discarded() || !doc.is_object() || !doc.contains("cell_mm") ||
      !doc["cell_mm"].is_number()) {
    throw InputError(side.string() + ": no numeric cell_mm in it; pass --cell instead");
  }
  const double cell = doc["cell_mm"].get<double>();
  if (!(cell > 0.0) || !std::isfinite(cell)) {
    throw InputError(side.string() + ": cell_mm " + format_number(cell) + " must be > 0");
  }
  return cell;
}

}  // namespace

std::string read_all(const std::string& path) {
  std::ifstream f(path, std::ios::binary);
  if (!f) throw InputError(path + ": cannot open the file");
  // One read into a buffer of the file's size (no growing stream buffer and copy out: a 64 MB
  // heightmap was copied twice and paged in three times).
  f.seekg(0, std::ios::end);
  const std::streamoff size = f.tellg();
  f.seekg(0, std::ios::beg);
  if (size < 0 || !f) {
    std::ostringstream ss;  // not seekable (a pipe): read as it comes
    f.clear();
    ss << f.rdbuf();
    return std::move(ss).str();
  }
  std::string bytes(static_cast<std::size_t>(size), '\0');
  f.read(bytes.data(), size);
  bytes.resize(static_cast<std::size_t>(f.gcount()));
  return bytes;
}

double z_units_to_um(const std::string& units) {
  if (units == "um" || units == "µm") return 1.0;
  if (units == "nm") return 1e-3;
  if (units == "mm") return 1e3;
  if (units == "m") return 1e6;
  throw InputError("--z-units '" + units + "': allowed units are um, nm, mm, m");
}

HeightmapFile read_heightmap(const std::string& path, const HeightmapReadOptions& options) {
  const std::string bytes = read_all(path);
  HeightmapFile out;
  out.format = detect_format(path, bytes);
  const bool own_scale = out.format == "sdf" || out.format == "x3p";
  if (own_scale && options.z_units) {
    throw InputError("--z-units " + *options.z_units + ": " + path + " is " + out.format +
                     ", which states its own height scale in metres");
  }
  Heightfield& hf = out.field;
  if (out.format == "npy") {
    hf.z_um = decode_npy(bytes, path);
    hf.ny = static_cast<int>(hf.z_um.rows());
    hf.nx = static_cast<int>(hf.z_um.cols());
  } else if (out.format == "csv") {
    hf = decode_csv_grid(bytes, path);
  } else if (out.format == "xyz") {
    hf = decode_xyz(bytes, path);
  } else if (out.format == "sdf") {
    hf = decode_sdf(bytes, path);
  } else {
    hf = decode_x3p(bytes, path);
  }
  for (std::int64_t k = 0; k < hf.cells(); ++k) {
    if (std::isinf(hf.z_um.data()[k])) throw InputError(path + ": holds an infinite height");
  }
  if (!own_scale && options.z_units) {
    const double f = z_units_to_um(*options.z_units);
    if (f != 1.0) hf.z_um *= static_cast<float>(f);
  }
  // Cell size: the file's own (xyz, sdf, x3p), else --cell, else report.json beside the file.
  if (hf.cell_mm > 0.0) {
    out.cell_source = "file";
    if (options.cell_mm && std::abs(*options.cell_mm - hf.cell_mm) > kSameCellRel * hf.cell_mm) {
      throw InputError("--cell " + format_number(*options.cell_mm) + " mm disagrees with " + path +
                       ", whose cell is " + format_number(hf.cell_mm) + " mm");
    }
  } else if (options.cell_mm) {
    hf.cell_mm = *options.cell_mm;
    out.cell_source = "--cell";
  } else if (const auto side = sidecar_cell(path)) {
    hf.cell_mm = *side;
    out.cell_source = "report.json";
  } else {
    throw InputError(path + ": --cell is required for ." + out.format +
                     " files (no report.json with cell_mm beside it)");
  }
  return out;
}

std::string encode_heightmap(const Heightfield& hf, const std::string& path) {
  const std::string ext = lower_extension(path);
  if (ext == ".npy") return encode_npy(hf);
  if (ext == ".csv") return encode_csv_grid(hf);
  if (ext == ".xyz" || ext == ".txt" || ext == ".asc") return encode_xyz(hf);
  if (ext == ".sdf") return encode_sdf(hf);
  if (ext == ".x3p") return encode_x3p(hf);
  throw InputError("--export " + path + ": unknown format; use .npy, .csv, .xyz, .sdf or .x3p");
}

}  // namespace cuspmap

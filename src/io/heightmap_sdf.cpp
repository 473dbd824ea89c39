// ASCII SDF (ISO 25178-71) reader and writer.
// Inputs/outputs: Heightfield <-> text. Cost O(cells).
// Method: ISO 25178-71:2012 record layout; locale-free numbers.
#include "io/heightmap_sdf.h"

#include <algorithm>
#include <cmath>
#include <map>
#include <vector>

#include "core/input_error.h"
#include "core/units.h"
#include "io/heightmap_text.h"

namespace cuspmap {
namespace {

// The format stores dimensions as 16-bit unsigned numbers (ISO 25178-71 record 1).
constexpr int kMaxSdfPoints = 65535;
// Xscale and Yscale that agree to 1e-6 are one square cell (they are printed with >= 7 digits).
constexpr double kSquareCellRel = 1e-6;
constexpr double kMetresPerMm = 1e-3;
constexpr double kUmPerMetre = 1e6;

std::string_view trim(std::string_view s) {
  while (!s.empty() && (s.front() == ' ' || s.front() == '\t')) s.remove_prefix(1);
  while (!s.empty() && (s.back() == ' ' || s.back() == '\t')) s.remove_suffix(1);
  return s;
}

}  // namespace

std::string encode_sdf(const Heightfield& hf) {
  if (hf.nx > kMaxSdfPoints || hf.ny > kMaxSdfPoints) {
    throw InputError("SDF holds at most 65535 points per profile and 65535 profiles; the grid is " +
                     std::to_string(hf.nx) + " x " + std::to_string(hf.ny));
  }
  const std::string scale = format_coordinate(hf.cell_mm * kMetresPerMm);
  std::string out = "aBCR-1.0\n";
  out += "ManufacID   = cuspmap\n";
  out += "CreateDate  = 010120000000\n";
  out += "ModDate     = 010120000000\n";
  out += "NumPoints   = " + std::to_string(hf.nx) + "\n";
  out += "NumProfiles = " + std::to_string(hf.ny) + "\n";
  out += "Xscale      = " + scale + "\n";
  out += "Yscale      = " + scale + "\n";
  out += "Zscale      = 1e-06\n";
  out += "Zresolution = -1\n";
  out += "Compression = 0\n";
  out += "DataType    = 7\n";
  out += "CheckType   = 0\n";
  out += "*\n";
  for (int j = 0; j < hf.ny; ++j) {
    for (int i = 0; i < hf.nx; ++i) {
      const float z = hf.z_um(j, i);
      if (i > 0) out += ' ';
      out += std::isnan(z) ? std::string("BAD") : format_height(z);
    }
    out += '\n';
  }
  out += "*\n*\n";
  return out;
}

Heightfield decode_sdf(std::string_view text, const std::string& name) {
  const std::vector<std::string_view> lines = split_lines(text);
  const std::string_view magic = lines.empty() ? std::string_view() : trim(lines[0]);
  if (magic == "bBCR-1.0" || magic == "bISO-1.0") {
    throw InputError(name + ":1: binary SDF (" + std::string(magic) +
                     ") is not read; save it as ASCII SDF (aBCR-1.0)");
  }
  if (magic != "aBCR-1.0" && magic != "aISO-1.0") {
    throw InputError(name + ":1: not an ASCII SDF file (expected aBCR-1.0 or aISO-1.0)");
  }
  std::map<std::string, std::pair<double, size_t>> keys;
  size_t l = 1;
  for (; l < lines.size(); ++l) {
    const std::string_view line = trim(lines[l]);
    if (line == "*") break;
    if (line.empty()) continue;
    const size_t eq = line.find('=');
    if (eq == std::string_view::npos) {
      throw InputError(name + ":" + std::to_string(l + 1) + ": header line has no '='");
    }
    const std::string key(trim(line.substr(0, eq)));
    const std::string_view value = trim(line.substr(eq + 1));
    if (key == "ManufacID" || key == "CreateDate" || key == "ModDate") continue;
    double v = 0.0;
    if (!parse_height_value(value, v) || std::isnan(v)) {
      throw InputError(name + ":" + std::to_string(l + 1) + ": " + key + " '" + std::string(value) +
                       "' is not a number");
    }
    keys[key] = {v, l + 1};
  }
  if (l == lines.size()) throw InputError(name + ": header has no closing '*' line");
  auto need = [&](const char* key) {
    const auto it = keys.find(key);
    if (it == keys.end()) throw InputError(name + ": header lacks " + std::string(key));
    return it->second.first;
  };
  const double points = need("NumPoints"), profiles = need("NumProfiles");
  const double xscale = need("Xscale"), yscale = need("Yscale"), zscale = need("Zscale");
  if (points < 1 || profiles < 1 || points != std::floor(points) ||
      profiles != std::floor(profiles)) {
    throw InputError(name + ": NumPoints and NumProfiles must be whole numbers >= 1");
  }
  // Bounds checked in double before any integer conversion (a huge count would be UB to cast).
  for (const char* key : {"NumPoints", "NumProfiles"}) {
    const auto& [v, line] = keys[key];
    if (v > kMaxSdfPoints) {
      throw InputError(name + ":" + std::to_string(line) + ": " + key + " " + format_number(v) +
                       " is out of range; SDF allows 1 to 65535");
    }
  }
  if (points * profiles > static_cast<double>(kMaxHeightmapCells)) {
    throw InputError(name + ": NumPoints x NumProfiles = " + format_number(points * profiles) +
                     " cells is over the limit of " + std::to_string(kMaxHeightmapCells) +
                     " cells");
  }
  if (keys.count("Compression") && keys["Compression"].first != 0.0) {
    throw InputError(name + ":" + std::to_string(keys["Compression"].second) +
                     ": Compression must be 0 (compressed SDF is not read)");
  }
  if (!(xscale > 0.0) || !(zscale != 0.0)) {
    throw InputError(name + ": Xscale must be > 0 m and Zscale non-zero");
  }
  if (profiles > 1 && std::abs(yscale - xscale) > kSquareCellRel * xscale) {
    throw InputError(name + ": Xscale " + format_number(xscale) + " m differs from Yscale " +
                     format_number(yscale) + " m; cuspmap needs square cells");
  }
  const long nx = static_cast<long>(points), ny = static_cast<long>(profiles);
  const double to_um = zscale * kUmPerMetre;
  std::vector<float> values;
  // Each value takes at least two characters (digit and separator): never reserve more than the
  // text can hold, whatever the header declares.
  values.reserve(std::min(static_cast<size_t>(nx * ny), text.size() / 2 + 1));
  bool closed = false;
  for (++l; l < lines.size() && !closed; ++l) {
    for (std::string_view tok : split_fields(lines[l])) {
      if (tok == "*") {
        closed = true;
        break;
      }
      double v = 0.0;
      if (!parse_height_value(tok, v)) {
        throw InputError(name + ":" + std::to_string(l + 1) + ": data value '" + std::string(tok) +
                         "' is not a number");
      }
      if (static_cast<long>(values.size()) == nx * ny) {
        throw InputError(
            name + ":" + std::to_string(l + 1) +
            ": more data values than NumPoints x NumProfiles = " + std::to_string(nx * ny));
      }
      values.push_back(static_cast<float>(v * to_um));
    }
  }
  if (static_cast<long>(values.size()) != nx * ny) {
    throw InputError(name + ": " + std::to_string(values.size()) +
                     " data values, NumPoints x NumProfiles = " + std::to_string(nx * ny));
  }
  Heightfield hf;
  hf.nx = static_cast<int>(nx);
  hf.ny = static_cast<int>(ny);
  hf.cell_mm = xscale / kMetresPerMm;
  hf.z_um = Eigen::Map<HeightGrid>(values.data(), hf.ny, hf.nx);
  return hf;
}

}  // namespace cuspmap

// Two-column x, z trace reader: rows parsed locale-free, x checked increasing, uneven steps
// resampled linearly onto the median step, NaN heights split the trace into runs.
// Inputs: text; output: MeasuredTrace. Cost O(rows log rows).
// Method: ISO 4287:1997 §3.1 (profile ordinates at equal sampling steps).
#include "io/measured_trace.h"

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <utility>

#include "core/input_error.h"
#include "core/units.h"
#include "io/heightmap_text.h"
#include "io/read_heightmap.h"

namespace cuspmap {
namespace {

std::string_view data_part(std::string_view line) {
  while (!line.empty() && (line.front() == ' ' || line.front() == '\t')) line.remove_prefix(1);
  return line;
}

// A row of column names ("x_mm,z_um", "X [mm]<tab>Z [um]"), as profilometers write above their
// data: no field reads as a number. Only the first data row may be one (a later one is an error
// that names it); before this such a file was refused ("x 'x_mm' is not a finite number") or,
// with spaces in the names, read as a grid ("4 values, expected 3 (X Y Z)").
bool is_header_row(std::string_view line) {
  for (const std::string_view field : split_fields(line)) {
    double v = 0.0;
    if (parse_height_value(field, v)) return false;
  }
  return true;
}

// Equally spaced heights from (x, z) rows, by linear interpolation between neighbours; a NaN
// neighbour makes the sample NaN.
std::vector<double> resample(const std::vector<double>& x, const std::vector<double>& z,
                             double step) {
  const size_t n = static_cast<size_t>(std::floor((x.back() - x.front()) / step + 1e-9)) + 1;
  std::vector<double> out(n);
  size_t k = 0;
  for (size_t i = 0; i < n; ++i) {
    const double xi = x.front() + static_cast<double>(i) * step;
    while (k + 2 < x.size() && x[k + 1] < xi) ++k;
    const double t = std::clamp((xi - x[k]) / (x[k + 1] - x[k]), 0.0, 1.0);
    out[i] = z[k] + t * (z[k + 1] - z[k]);
  }
  return out;
}

}  // namespace

InputLayout parse_input_layout(const std::string& text) {
  if (text == "auto") return InputLayout::Auto;
  if (text == "trace") return InputLayout::Trace;
  if (text == "grid") return InputLayout::Grid;
  throw InputError("--layout '" + text + "': allowed are auto, trace or grid");
}

bool is_trace_file(const std::string& path, InputLayout layout) {
  if (layout != InputLayout::Auto) return layout == InputLayout::Trace;
  std::string ext = std::filesystem::path(path).extension().string();
  std::transform(ext.begin(), ext.end(), ext.begin(),
                 [](unsigned char c) { return static_cast<char>(std::tolower(c)); });
  if (ext != ".csv" && ext != ".txt" && ext != ".xyz" && ext != ".asc") return false;
  return looks_like_trace(read_all(path));
}

MeasuredTrace read_trace(const std::string& path, double x_mm_per_unit, double z_um_per_unit) {
  return decode_trace(read_all(path), path, x_mm_per_unit, z_um_per_unit);
}

bool looks_like_trace(std::string_view text) {
  bool any = false, first = true;
  for (std::string_view line : split_lines(text)) {
    line = data_part(line);
    if (line.empty() || line.front() == '#') continue;
    if (std::exchange(first, false) && is_header_row(line)) continue;
    if (split_fields(line).size() != 2) return false;
    any = true;
  }
  return any;
}

MeasuredTrace decode_trace(std::string_view text, const std::string& name, double x_mm_per_unit,
                           double z_um_per_unit) {
  std::vector<double> x, z;
  const std::vector<std::string_view> lines = split_lines(text);
  bool first = true;
  for (size_t l = 0; l < lines.size(); ++l) {
    const std::string_view line = data_part(lines[l]);
    if (line.empty() || line.front() == '#') continue;
    if (std::exchange(first, false) && is_header_row(line)) continue;
    const std::string where = name + ":" + std::to_string(l + 1) + ": ";
    const std::vector<std::string_view> fields = split_fields(line);
    if (fields.size() != 2) {
      throw InputError(where + std::to_string(fields.size()) +
                       " values, a trace row holds exactly two (x, z)");
    }
    double xv = 0.0, zv = 0.0;
    if (!parse_height_value(fields[0], xv) || !std::isfinite(xv)) {
      throw InputError(where + "x '" + std::string(fields[0]) + "' is not a finite number");
    }
    if (!parse_height_value(fields[1], zv)) {
      throw InputError(where + "z '" + std::string(fields[1]) + "' is not a number");
    }
    xv *= x_mm_per_unit;
    if (!x.empty() && !(xv > x.back())) {
      throw InputError(where + "x " + format_number(xv) + " mm does not increase (previous row " +
                       format_number(x.back()) + " mm); a trace lists x in increasing order");
    }
    x.push_back(xv);
    z.push_back(zv * z_um_per_unit);
  }
  if (x.size() < static_cast<size_t>(kMinTracePoints)) {
    throw InputError(name + ": " + std::to_string(x.size()) + " trace points, at least " +
                     std::to_string(kMinTracePoints) + " are needed");
  }
  MeasuredTrace t;
  t.points = static_cast<int>(x.size());
  t.length_mm = x.back() - x.front();
  std::vector<double> steps(x.size() - 1);
  for (size_t i = 0; i + 1 < x.size(); ++i) steps[i] = x[i + 1] - x[i];
  std::nth_element(steps.begin(), steps.begin() + steps.size() / 2, steps.end());
  t.spacing_mm = steps[steps.size() / 2];
  bool even = true;
  for (size_t i = 0; i + 1 < x.size() && even; ++i) {
    even = std::abs(x[i + 1] - x[i] - t.spacing_mm) <= kTraceStepTolerance * t.spacing_mm;
  }
  std::vector<double> zs = even ? z : resample(x, z, t.spacing_mm);
  t.resampled = !even;
  ProfileTrace run;
  run.spacing_mm = t.spacing_mm;
  auto flush = [&] {
    if (run.z_um.size() >= 2) t.runs.push_back(run);
    run.z_um.clear();
  };
  for (size_t i = 0; i < zs.size(); ++i) {
    if (std::isnan(zs[i])) {
      flush();
      continue;
    }
    if (run.z_um.empty()) run.start_mm = static_cast<double>(i) * t.spacing_mm - 0.5 * t.length_mm;
    run.z_um.push_back(zs[i]);
  }
  flush();
  t.missing_points =
      static_cast<int>(std::count_if(z.begin(), z.end(), [](double v) { return std::isnan(v); }));
  if (t.runs.empty()) throw InputError(name + ": no two neighbouring trace points hold heights");
  return t;
}

}  // namespace cuspmap

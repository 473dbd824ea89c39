// Measurements file of `calibrate`: header + rows of past jobs and their measured Ra.
// Method: RFC 4180 fields (double quotes, "" inside quotes); units parsed by core/units.
#include "io/measured_jobs_csv.h"

#include <algorithm>
#include <array>
#include <cctype>
#include <filesystem>
#include <fstream>
#include <map>
#include <sstream>

#include "core/height_units.h"
#include "core/input_error.h"
#include "job/validate_cutter.h"

namespace cuspmap {
namespace {

constexpr std::array<std::string_view, 7> kColumns = {
    "name", "job", "tool", "diameter", "corner_radius", "stepover", "measured_ra"};

std::string lower(std::string s) {
  for (char& c : s) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
  return s;
}

std::string trim(std::string_view s) {
  std::size_t a = 0, b = s.size();
  while (a < b && std::isspace(static_cast<unsigned char>(s[a]))) ++a;
  while (b > a && std::isspace(static_cast<unsigned char>(s[b - 1]))) --b;
  return std::string(s.substr(a, b - a));
}

// Splits one line into fields; a field may be double-quoted with "" for a quote.
std::vector<std::string> split_fields(std::string_view line, const std::string& at) {
  std::vector<std::string> out;
  std::string field;
  bool quoted = false, was_quoted = false;
  for (std::size_t i = 0; i < line.size(); ++i) {
    const char c = line[i];
    if (quoted) {
      if (c == '"' && i + 1 < line.size() && line[i + 1] == '"') {
        field += '"';
        ++i;
      } else if (c == '"') {
        quoted = false;
      } else {
        field += c;
      }
    } else if (c == '"' && trim(field).empty()) {
      quoted = was_quoted = true;
      field.clear();
    } else if (c == ',') {
      out.push_back(was_quoted ? field : trim(field));
      field.clear();
      was_quoted = false;
    } else {
      field += c;
    }
  }
  if (quoted) throw InputError(at + ": a quoted field is not closed");
  out.push_back(was_quoted ? field : trim(field));
  return out;
}

// Strips a '#' comment outside quotes and a trailing CR.
std::string_view strip_comment(std::string_view line) {
  bool quoted = false;
  for (std::size_t i = 0; i < line.size(); ++i) {
    if (line[i] == '"') quoted = !quoted;
    if (line[i] == '#' && !quoted) return line.substr(0, i);
  }
  if (!line.empty() && line.back() == '\r') line.remove_suffix(1);
  return line;
}

CutterShape parse_shape(const std::string& text, const std::string& at) {
  if (text == "ball") return CutterShape::Ball;
  if (text == "bullnose") return CutterShape::BullNose;
  if (text == "flat") return CutterShape::Flat;
  throw InputError(at + ": tool '" + text + "': allowed values are ball, bullnose, flat");
}

}  // namespace

std::vector<MeasuredJob> parse_measured_jobs(std::string_view text, const std::string& file,
                                             const std::string& base_dir, LengthUnit unit) {
  std::map<std::string, std::size_t> column;  // name -> index
  std::vector<MeasuredJob> rows;
  std::istringstream in{std::string(text)};
  std::string raw;
  int line_no = 0;
  while (std::getline(in, raw)) {
    ++line_no;
    const std::string at = file + ":" + std::to_string(line_no);
    const std::string_view line = strip_comment(raw);
    if (trim(line).empty()) continue;
    const std::vector<std::string> f = split_fields(line, at);
    if (column.empty()) {
      for (std::size_t k = 0; k < f.size(); ++k) {
        const std::string name = lower(f[k]);
        if (std::find(kColumns.begin(), kColumns.end(), name) == kColumns.end()) {
          throw InputError(at + ": unknown column '" + f[k] +
                           "'; allowed: name, job, tool, diameter, corner_radius, stepover, "
                           "measured_ra");
        }
        if (column.count(name)) throw InputError(at + ": column '" + f[k] + "' appears twice");
        column[name] = k;
      }
      if (!column.count("measured_ra")) {
        throw InputError(at + ": the header has no measured_ra column (the profilometer's Ra)");
      }
      continue;
    }
    if (f.size() > column.size()) {
      throw InputError(at + ": " + std::to_string(f.size()) + " fields, the header has " +
                       std::to_string(column.size()));
    }
    auto get = [&](const char* name) -> std::string {
      const auto it = column.find(name);
      return it == column.end() || it->second >= f.size() ? std::string() : f[it->second];
    };
    MeasuredJob row;
    row.line = line_no;
    row.name = get("name").empty() ? "row " + std::to_string(line_no) : get("name");
    const std::string ra = get("measured_ra");
    if (ra.empty()) throw InputError(at + ": measured_ra is empty");
    row.measured_ra_um = parse_height_um(ra, unit, at + ": measured_ra");
    if (!(row.measured_ra_um > 0.0)) {
      throw InputError(at + ": measured_ra " + ra + ": must be > 0");
    }
    if (!get("job").empty()) {
      const std::filesystem::path p(get("job"));
      row.job_path = p.is_absolute() || base_dir.empty()
                         ? p.string()
                         : (std::filesystem::path(base_dir) / p).string();
      rows.push_back(row);
      continue;
    }
    if (get("tool").empty() || get("diameter").empty() || get("stepover").empty()) {
      throw InputError(at + ": give a job file (job) or tool, diameter and stepover");
    }
    CuspSetup setup;
    setup.cutter.shape = parse_shape(lower(get("tool")), at);
    setup.cutter.diameter_mm = parse_positive_length_mm(get("diameter"), unit, at + ": diameter");
    if (setup.cutter.shape == CutterShape::BullNose) {
      if (get("corner_radius").empty()) throw InputError(at + ": corner_radius is required for bullnose");
      setup.cutter.corner_radius_mm =
          parse_positive_length_mm(get("corner_radius"), unit, at + ": corner_radius");
    }
    try {
      validate_cutter(setup.cutter, NameStyle::JobKey);
    } catch (const InputError& e) {
      throw InputError(at + ": " + e.what());
    }
    row.stepover_mm = parse_positive_length_mm(get("stepover"), unit, at + ": stepover");
    if (row.stepover_mm >= setup.cutter.diameter_mm) {
      throw InputError(at + ": stepover " + get("stepover") + ": must be smaller than the diameter");
    }
    row.setup = setup;
    rows.push_back(row);
  }
  if (column.empty()) throw InputError(file + ": no header row (name,job,...,measured_ra)");
  if (rows.size() < 2) {
    throw InputError(file + ": " + std::to_string(rows.size()) +
                     " measured row(s); calibration needs at least 2");
  }
  return rows;
}

std::vector<MeasuredJob> read_measured_jobs(const std::string& path, LengthUnit unit) {
  std::ifstream in(path, std::ios::binary);
  if (!in) throw InputError(path + ": cannot read the measurements file");
  std::ostringstream buf;
  buf << in.rdbuf();
  return parse_measured_jobs(buf.str(), path, std::filesystem::path(path).parent_path().string(),
                             unit);
}

}  // namespace cuspmap

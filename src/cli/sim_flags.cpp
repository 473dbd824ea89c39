// Shared simulation flags: threads, memory limit (bytes with binary/decimal suffixes), range.
#include "cli/sim_flags.h"

#include <cmath>

#include "core/input_error.h"

namespace cuspmap {

void add_sim_flags(CLI::App& sub, SimFlags& flags) {
  sub.add_option("--threads", flags.threads, "Sweep threads (0 = all cores)")
      ->capture_default_str()
      ->check(CLI::Range(0, 1024));
  sub.add_option("--max-memory", flags.max_memory,
                 "Largest heightfield to allocate, e.g. 2GiB (default: half of physical memory)");
  // Reason for the flag: pictures of several runs can only be compared on one height scale.
  sub.add_option("--range", flags.range,
                 "Fixed height range LO,HI for height.png, e.g. 0um,5um (default: min..max)");
}

std::int64_t parse_bytes(const std::string& text, const char* what) {
  struct Suffix {
    const char* name;
    double factor;
  };
  static constexpr Suffix kSuffixes[] = {
      {"KiB", 1024.0}, {"MiB", 1048576.0}, {"GiB", 1073741824.0}, {"TiB", 1099511627776.0},
      {"K", 1e3},      {"M", 1e6},         {"G", 1e9},            {"T", 1e12},
      {"kB", 1e3},     {"MB", 1e6},        {"GB", 1e9},           {"B", 1.0}};
  std::string number = text;
  double factor = 1.0;
  for (const Suffix& s : kSuffixes) {
    const std::string suffix = s.name;
    if (number.size() > suffix.size() &&
        number.compare(number.size() - suffix.size(), suffix.size(), suffix) == 0) {
      number.resize(number.size() - suffix.size());
      factor = s.factor;
      break;
    }
  }
  double value = 0.0;
  try {
    value = parse_number(number, what);
  } catch (const InputError&) {
    throw InputError(std::string(what) + " '" + text +
                     "': expected a size such as 512MiB, 2GiB or 4G");
  }
  const double bytes = value * factor;
  if (!(bytes >= 1.0) || bytes > 9e18) {
    throw InputError(std::string(what) + " '" + text + "': must be at least 1 byte");
  }
  return static_cast<std::int64_t>(bytes);
}

std::optional<HeightRange> parse_height_range(const std::string& text, LengthUnit unit) {
  if (text.empty()) return std::nullopt;
  const size_t comma = text.find(',');
  if (comma == std::string::npos) {
    throw InputError("--range '" + text + "': expected two heights LO,HI such as 0um,5um");
  }
  HeightRange r;
  r.lo_um = parse_length_mm(text.substr(0, comma), unit, "--range") * kUmPerMm;
  r.hi_um = parse_length_mm(text.substr(comma + 1), unit, "--range") * kUmPerMm;
  if (!(r.hi_um > r.lo_um)) {
    throw InputError("--range '" + text + "': the high end must be above the low end");
  }
  return r;
}

}  // namespace cuspmap

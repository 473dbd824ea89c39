// Shared CLI helpers: common flags, JSON output with a finite-number check, stage lines.
#include "cli/command.h"

#include <cmath>
#include <cstdio>
#include <iostream>
#include <stdexcept>

#include "report/progress_text.h"

namespace cuspmap {
namespace {

// Walks a JSON value; a NaN or infinity anywhere is an internal error, never a silent null.
void require_finite(const nlohmann::json& value, const std::string& where) {
  if (value.is_number_float() && !std::isfinite(value.get<double>())) {
    throw std::logic_error("non-finite number in JSON output at " + where);
  }
  if (value.is_object()) {
    for (const auto& [key, item] : value.items()) require_finite(item, where + "." + key);
  } else if (value.is_array()) {
    for (size_t k = 0; k < value.size(); ++k) {
      require_finite(value[k], where + "[" + std::to_string(k) + "]");
    }
  }
}

}  // namespace

void add_common_flags(CLI::App& sub, CommonOptions& common) {
  sub.add_option("--units", common.units, "Unit of bare numbers and of human output: mm or in")
      ->capture_default_str();
  sub.add_flag("--json", common.json, "Print exactly one JSON object on stdout");
  sub.add_flag("--verbose", common.verbose, "Print one line per stage with its time on stderr");
}

void print_json(const nlohmann::json& doc) {
  require_finite(doc, "$");
  std::cout << doc.dump(2) << '\n';
  std::cout.flush();
}

std::function<void(const RunEstimate&)> forecast_printer(bool verbose, std::string prefix) {
  return [verbose, prefix](const RunEstimate& e) {
    if (!verbose && e.seconds < kAnnounceRunS) return;
    std::fprintf(stderr, "%s%s\n", prefix.c_str(), forecast_line(e).c_str());
    std::fflush(stderr);
  };
}

void print_stage(bool verbose, const char* stage, double seconds) {
  if (!verbose) return;
  std::fprintf(stderr, "%-10s %9.1f ms\n", stage, seconds * 1000.0);
}

}  // namespace cuspmap

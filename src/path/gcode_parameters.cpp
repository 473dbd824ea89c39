// Parameter store of an RS-274 program run (see gcode_parameters.h). Cost O(1) numbered,
// O(log n) named.
// Method: RS274NGC v3 (Kramer, Proctor & Messina 2000) §3.2.1, §3.3.3.
#include "path/gcode_parameters.h"

#include <algorithm>

namespace cuspmap {

GcodeParameters::GcodeParameters() : numbered_(kGcodeParameterCount, 0.0) {}

std::optional<double> GcodeParameters::named(const std::string& name) const {
  const bool global = !name.empty() && name[0] == '_';
  const std::map<std::string, double>& scope =
      global ? globals_ : frames_.empty() ? main_locals_ : frames_.back().locals;
  const auto it = scope.find(name);
  if (it == scope.end()) return std::nullopt;
  return it->second;
}

void GcodeParameters::set_named(const std::string& name, double value) {
  const bool global = !name.empty() && name[0] == '_';
  std::map<std::string, double>& scope =
      global ? globals_ : frames_.empty() ? main_locals_ : frames_.back().locals;
  scope[name] = value;
}

void GcodeParameters::push_call(const std::vector<double>& args) {
  Frame f;
  std::copy(numbered_.begin() + 1, numbered_.begin() + 1 + kGcodeCallArguments, f.saved.begin());
  frames_.push_back(std::move(f));
  for (int i = 0; i < kGcodeCallArguments; ++i) {
    numbered_[static_cast<std::size_t>(i + 1)] =
        i < static_cast<int>(args.size()) ? args[static_cast<std::size_t>(i)] : 0.0;
  }
}

void GcodeParameters::pop_call() {
  if (frames_.empty()) return;
  std::copy(frames_.back().saved.begin(), frames_.back().saved.end(), numbered_.begin() + 1);
  frames_.pop_back();
}

}  // namespace cuspmap

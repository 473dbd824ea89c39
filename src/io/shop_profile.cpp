// Shop profile TOML: encoder and reader of the fitted roughness correction (um).
// Method: TOML v1.0 (toml++ 3.3); std::to_chars shortest round-trip numbers.
#include "io/shop_profile.h"

#include <toml++/toml.h>

#include <array>
#include <charconv>
#include <cmath>
#include <fstream>
#include <sstream>

#include "core/input_error.h"
#include "core/units.h"

namespace cuspmap {
namespace {

std::string num(double v) {
  char buf[40];
  const auto r = std::to_chars(buf, buf + sizeof buf, v);
  std::string s(buf, r.ptr);
  // TOML floats need a fraction or an exponent.
  if (s.find_first_of(".eE") == std::string::npos && s.find("inf") == std::string::npos) s += ".0";
  return s;
}

std::string quoted(const std::string& s) {
  std::string out = "\"";
  for (char c : s) {
    if (c == '"' || c == '\\') out += '\\';
    out += c;
  }
  return out + "\"";
}

std::string where(const std::string& file, const toml::source_region& region) {
  return file + ":" + std::to_string(region.begin.line) + ":" + std::to_string(region.begin.column);
}

constexpr std::array<std::string_view, 3> kRootKeys = {"source", "created", "ra"};
constexpr std::array<std::string_view, 10> kRaKeys = {
    "model",     "floor_um", "floor_sd_um",   "scale",        "scale_sd", "cov_floor_scale_um",
    "rows",      "rms_before_um", "rms_after_um", "why"};

template <std::size_t N>
void check_keys(const toml::table& t, const std::array<std::string_view, N>& allowed,
                const std::string& file, const std::string& prefix) {
  for (const auto& [key, node] : t) {
    bool ok = false;
    for (std::string_view a : allowed) ok = ok || a == key.str();
    if (ok) continue;
    std::string list;
    for (std::string_view a : allowed) list += (list.empty() ? "" : ", ") + std::string(a);
    throw InputError(where(file, key.source()) + ": unknown key '" + prefix +
                     std::string(key.str()) + "'; allowed keys are " + list);
  }
}

double number(const toml::table& t, std::string_view key, const std::string& file,
              const toml::source_region& owner, double lo) {
  const toml::node* node = t.get(key);
  if (node == nullptr) {
    throw InputError(where(file, owner) + ": ra." + std::string(key) + " is missing");
  }
  const std::optional<double> v = node->value<double>();
  if (!v || !std::isfinite(*v) || *v < lo) {
    throw InputError(where(file, node->source()) + ": ra." + std::string(key) +
                     ": expected a finite number" +
                     (std::isinf(lo) ? std::string() : " >= " + format_number(lo)));
  }
  return *v;
}

}  // namespace

std::string encode_shop_profile(const ShopProfile& p) {
  const ShopCalibration& c = p.ra;
  std::ostringstream o;
  o << "# cuspmap shop profile: measured Ra = floor + scale x kinematic Ra (um)\n"
    << "# written by `cuspmap calibrate`; read by --shop (docs/calibration.md)\n";
  o << "source = " << quoted(p.source) << "\n";
  if (!p.created.empty()) o << "created = " << quoted(p.created) << "\n";
  o << "\n[ra]\n"
    << "model = " << quoted(calibration_model_name(c.model)) << "\n"
    << "floor_um = " << num(c.floor_um) << "\n"
    << "floor_sd_um = " << num(c.floor_sd_um) << "\n"
    << "scale = " << num(c.scale) << "\n"
    << "scale_sd = " << num(c.scale_sd) << "\n"
    << "cov_floor_scale_um = " << num(c.cov_floor_scale_um) << "\n"
    << "rows = " << c.rows << "\n"
    << "rms_before_um = " << num(c.rms_before_um) << "\n"
    << "rms_after_um = " << num(c.rms_after_um) << "\n";
  if (!c.why.empty()) o << "why = " << quoted(c.why) << "\n";
  return o.str();
}

ShopProfile parse_shop_profile(std::string_view text, const std::string& file) {
  toml::table root;
  try {
    root = toml::parse(text, file);
  } catch (const toml::parse_error& e) {
    throw InputError(where(file, e.source()) + ": " + std::string(e.description()));
  }
  check_keys(root, kRootKeys, file, "");
  ShopProfile p;
  p.source = root["source"].value_or(std::string());
  p.created = root["created"].value_or(std::string());
  const toml::table* ra = root["ra"].as_table();
  if (ra == nullptr) {
    throw InputError(where(file, root.source()) + ": [ra] table is missing (write one with "
                     "`cuspmap calibrate`)");
  }
  check_keys(*ra, kRaKeys, file, "ra.");
  ShopCalibration& c = p.ra;
  const std::string model = (*ra)["model"].value_or(std::string());
  if (model == "floor+scale") {
    c.model = CalibrationModel::FloorAndScale;
  } else if (model == "floor") {
    c.model = CalibrationModel::FloorOnly;
  } else {
    throw InputError(where(file, ra->source()) + ": ra.model '" + model +
                     "': allowed values are floor+scale, floor");
  }
  const double any = -std::numeric_limits<double>::infinity();
  c.floor_um = number(*ra, "floor_um", file, ra->source(), any);
  c.floor_sd_um = number(*ra, "floor_sd_um", file, ra->source(), 0.0);
  c.scale = number(*ra, "scale", file, ra->source(), 0.0);
  if (!(c.scale > 0.0)) {
    throw InputError(where(file, ra->source()) + ": ra.scale " + format_number(c.scale) +
                     ": must be > 0");
  }
  c.scale_sd = number(*ra, "scale_sd", file, ra->source(), 0.0);
  c.cov_floor_scale_um = number(*ra, "cov_floor_scale_um", file, ra->source(), any);
  c.rows = static_cast<int>(number(*ra, "rows", file, ra->source(), 1.0));
  c.rms_before_um = number(*ra, "rms_before_um", file, ra->source(), 0.0);
  c.rms_after_um = number(*ra, "rms_after_um", file, ra->source(), 0.0);
  c.why = (*ra)["why"].value_or(std::string());
  return p;
}

ShopProfile read_shop_profile(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  if (!in) throw InputError("--shop " + path + ": cannot read the file");
  std::ostringstream buf;
  buf << in.rdbuf();
  return parse_shop_profile(buf.str(), path);
}

}  // namespace cuspmap

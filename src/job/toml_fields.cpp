// Typed, unit-aware reads of job-file values with located error messages.
// Inputs: toml++ nodes; outputs: mm, deg, counts, choices. Method: toml++ 3 node API.
#include "job/toml_fields.h"

#include <charconv>
#include <cmath>

#include "core/input_error.h"
#include "job/validate_cutter.h"

namespace cuspmap {
namespace {

std::string full_name(std::string_view table_name, std::string_view key) {
  if (table_name.empty()) return std::string(key);
  return std::string(table_name) + "." + std::string(key);
}

}  // namespace

std::string TomlFields::where(const toml::node& node) const {
  const toml::source_region& src = node.source();
  if (src.begin.line == 0) return source_ + ": ";
  return source_ + ":" + std::to_string(src.begin.line) + ":" + std::to_string(src.begin.column) +
         ": ";
}

void TomlFields::fail(const toml::node& node, std::string_view table_name, std::string_view key,
                      const std::string& message) const {
  throw InputError(where(node) + full_name(table_name, key) + " " + message);
}

double TomlFields::to_length_mm(const toml::node& node, std::string_view table_name,
                                std::string_view key) const {
  const double factor = units_ == LengthUnit::Inch ? kMmPerInch : 1.0;
  double mm = 0.0;
  if (const auto* v = node.as_floating_point()) {
    if (!std::isfinite(v->get())) fail(node, table_name, key, "must be a finite number");
    mm = v->get() * factor;
    if (!std::isfinite(mm)) fail(node, table_name, key, format_number(v->get()) + ": out of range");
  } else if (const auto* i = node.as_integer()) {
    mm = static_cast<double>(i->get()) * factor;
  } else if (const auto* t = node.as_string()) {
    try {
      mm = parse_length_mm(t->get(), units_, full_name(table_name, key));
    } catch (const InputError& e) {
      throw InputError(where(node) + e.what());
    }
  } else {
    fail(node, table_name, key, "must be a length: a number or a string such as \"0.3mm\"");
  }
  // Bounds every job length (and feed): a 1e308 diameter would make passes of infinite length.
  if (!(std::abs(mm) <= kMaxJobLengthMm)) {
    fail(node, table_name, key,
         format_number(mm) + " mm: must be within +-" + format_number(kMaxJobLengthMm) + " mm");
  }
  return mm;
}

std::optional<double> TomlFields::length_mm(const toml::table& table, std::string_view table_name,
                                            std::string_view key) const {
  const toml::node* node = table.get(key);
  if (node == nullptr) return std::nullopt;
  return to_length_mm(*node, table_name, key);
}

std::optional<double> TomlFields::angle_deg(const toml::table& table, std::string_view table_name,
                                            std::string_view key) const {
  const toml::node* node = table.get(key);
  if (node == nullptr) return std::nullopt;
  if (const auto* v = node->as_string()) {
    try {
      return parse_angle_deg(v->get(), full_name(table_name, key));
    } catch (const InputError& e) {
      throw InputError(where(*node) + e.what());
    }
  }
  return number(table, table_name, key);
}

std::optional<double> TomlFields::number(const toml::table& table, std::string_view table_name,
                                         std::string_view key) const {
  const toml::node* node = table.get(key);
  if (node == nullptr) return std::nullopt;
  if (const auto* v = node->as_floating_point()) {
    if (!std::isfinite(v->get())) fail(*node, table_name, key, "must be a finite number");
    return v->get();
  }
  if (const auto* v = node->as_integer()) return static_cast<double>(v->get());
  fail(*node, table_name, key, "must be a number");
}

std::optional<long long> TomlFields::integer(const toml::table& table,
                                             std::string_view table_name,
                                             std::string_view key) const {
  const toml::node* node = table.get(key);
  if (node == nullptr) return std::nullopt;
  if (const auto* v = node->as_integer()) return v->get();
  fail(*node, table_name, key, "must be a whole number");
}

std::optional<bool> TomlFields::boolean(const toml::table& table, std::string_view table_name,
                                        std::string_view key) const {
  const toml::node* node = table.get(key);
  if (node == nullptr) return std::nullopt;
  if (const auto* v = node->as_boolean()) return v->get();
  fail(*node, table_name, key, "must be true or false");
}

std::optional<std::string> TomlFields::choice(const toml::table& table,
                                              std::string_view table_name, std::string_view key,
                                              std::initializer_list<std::string_view> allowed) const {
  const toml::node* node = table.get(key);
  if (node == nullptr) return std::nullopt;
  const auto* v = node->as_string();
  std::string list;
  for (std::string_view a : allowed) list += (list.empty() ? "" : ", ") + std::string(a);
  if (v == nullptr) fail(*node, table_name, key, "must be a string: one of " + list);
  if (allowed.size() == 0) return v->get();
  for (std::string_view a : allowed) {
    if (v->get() == a) return v->get();
  }
  fail(*node, table_name, key, "'" + v->get() + "': allowed values are " + list);
}

std::optional<std::vector<double>> TomlFields::lengths_mm(const toml::table& table,
                                                          std::string_view table_name,
                                                          std::string_view key,
                                                          size_t count) const {
  const toml::node* node = table.get(key);
  if (node == nullptr) return std::nullopt;
  const toml::array* arr = node->as_array();
  if (arr == nullptr || (count != 0 && arr->size() != count)) {
    fail(*node, table_name, key,
         count == 2 ? "must be a pair of lengths [x, y]" : "must be an array of lengths");
  }
  std::vector<double> out;
  for (const toml::node& item : *arr) out.push_back(to_length_mm(item, table_name, key));
  return out;
}

std::optional<std::vector<TomlFields::NumberedLength>> TomlFields::numbered_lengths_mm(
    const toml::table& table, std::string_view table_name, std::string_view key) const {
  const toml::node* node = table.get(key);
  if (node == nullptr) return std::nullopt;
  const toml::table* t = node->as_table();
  if (t == nullptr) fail(*node, table_name, key, "must be a table of numbers to lengths, e.g. { 1 = 3.0 }");
  std::vector<NumberedLength> out;
  for (const auto& [k, value] : *t) {
    const std::string_view text = k.str();
    NumberedLength entry;
    const auto [end, ec] = std::from_chars(text.data(), text.data() + text.size(), entry.number);
    if (ec != std::errc() || end != text.data() + text.size()) {
      fail(value, table_name, key, "key '" + std::string(text) + "' must be a whole number");
    }
    entry.mm = to_length_mm(value, table_name, key);
    entry.where = where(value) + full_name(table_name, key);
    out.push_back(std::move(entry));
  }
  return out;
}

std::optional<std::vector<std::pair<double, double>>> TomlFields::points_mm(
    const toml::table& table, std::string_view table_name, std::string_view key) const {
  const toml::node* node = table.get(key);
  if (node == nullptr) return std::nullopt;
  const toml::array* arr = node->as_array();
  if (arr == nullptr) fail(*node, table_name, key, "must be an array of [x, y] points");
  std::vector<std::pair<double, double>> out;
  for (const toml::node& item : *arr) {
    const toml::array* pt = item.as_array();
    if (pt == nullptr || pt->size() != 2) {
      fail(item, table_name, key, "must be an array of [x, y] points");
    }
    out.emplace_back(to_length_mm(*pt->get(0), table_name, key),
                     to_length_mm(*pt->get(1), table_name, key));
  }
  return out;
}

}  // namespace cuspmap

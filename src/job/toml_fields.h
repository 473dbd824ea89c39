// Typed reads of job-file values with units, each error located at file:line:col and naming the
// key: lengths (numbers in the job's units or strings with a suffix), angles, counts, choices.
// Inputs: a toml++ table; outputs: core units (mm, deg). Method: toml++ 3 node API.
#pragma once

#include <toml++/toml.h>

#include <initializer_list>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "core/units.h"

namespace cuspmap {

/// Reads values of one job file; remembers the file name and the unit of bare numbers.
class TomlFields {
 public:
  /// @param[in] source  file name used in messages; @param[in] units  unit of bare numbers
  TomlFields(std::string source, LengthUnit units) : source_(std::move(source)), units_(units) {}

  /// Length in mm from `table.key`: a number (in the job's units) or a string with a suffix.
  std::optional<double> length_mm(const toml::table& table, std::string_view table_name,
                                  std::string_view key) const;
  /// Angle in deg: a number or a string "1.5deg".
  std::optional<double> angle_deg(const toml::table& table, std::string_view table_name,
                                  std::string_view key) const;
  /// Plain number (integer or float), no unit.
  std::optional<double> number(const toml::table& table, std::string_view table_name,
                               std::string_view key) const;
  /// Whole number.
  std::optional<long long> integer(const toml::table& table, std::string_view table_name,
                                   std::string_view key) const;
  /// Boolean.
  std::optional<bool> boolean(const toml::table& table, std::string_view table_name,
                              std::string_view key) const;
  /// String, which must be one of `allowed` when allowed is not empty.
  std::optional<std::string> choice(const toml::table& table, std::string_view table_name,
                                    std::string_view key,
                                    std::initializer_list<std::string_view> allowed) const;
  /// Array of lengths, mm ([x, y] pairs, per-tooth offsets ...); `count` 0 = any length.
  std::optional<std::vector<double>> lengths_mm(const toml::table& table,
                                                std::string_view table_name, std::string_view key,
                                                size_t count) const;
  /// Table of whole-number keys to lengths ({ 1 = 3.0, 2 = "2.5mm" }), mm, in key order; each
  /// entry with its "file:line:col: table.key" position for the caller's own checks.
  struct NumberedLength {
    long long number = 0;   ///< the key as a whole number
    double mm = 0.0;        ///< the value, mm
    std::string where;      ///< "<file>:<line>:<col>: <table>.<key>" of the value
  };
  std::optional<std::vector<NumberedLength>> numbered_lengths_mm(const toml::table& table,
                                                                 std::string_view table_name,
                                                                 std::string_view key) const;
  /// Array of [x, y] points, mm.
  std::optional<std::vector<std::pair<double, double>>> points_mm(
      const toml::table& table, std::string_view table_name, std::string_view key) const;

  /// "<source>:<line>:<col>: " for a node (or "<source>: " when it has no position).
  std::string where(const toml::node& node) const;
  /// Throws InputError "<where>: <table>.<key> <message>".
  [[noreturn]] void fail(const toml::node& node, std::string_view table_name, std::string_view key,
                         const std::string& message) const;

  const std::string& source() const { return source_; }

 private:
  double to_length_mm(const toml::node& node, std::string_view table_name,
                      std::string_view key) const;
  std::string source_;
  LengthUnit units_;
};

}  // namespace cuspmap

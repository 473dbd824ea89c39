// Test helpers: run the real cuspmap binary, temp folders, tolerant comparisons with context.
#pragma once

#include <catch2/catch.hpp>
#include <cmath>
#include <string>
#include <vector>

namespace cuspmap::test {

/// What a run of the cuspmap binary produced.
struct RunResult {
  int exit_code = -1;   ///< process exit status (128 + signal when killed)
  std::string out;      ///< everything on stdout
  std::string err;      ///< everything on stderr
};

/// Runs build/cuspmap with `args` (no shell), capturing stdout and stderr.
RunResult run_cuspmap(const std::vector<std::string>& args);

/// Runs cuspmap with `args` and REQUIREs the bad-input contract: exit 2, nothing on stdout, and
/// exactly the stderr line "cuspmap: error: <line>".
void require_input_error(const std::vector<std::string>& args, const std::string& line);

/// A fresh empty folder under the system temp dir, removed when the object dies.
class TempDir {
 public:
  TempDir();
  ~TempDir();
  TempDir(const TempDir&) = delete;
  TempDir& operator=(const TempDir&) = delete;
  const std::string& path() const { return path_; }
  /// path()/name
  std::string file(const std::string& name) const { return path_ + "/" + name; }
  /// Names of the files in the folder, sorted.
  std::vector<std::string> list() const;

 private:
  std::string path_;
};

/// Writes text to a file (test fixtures only; the product writes through write_file_atomic).
void write_text(const std::string& path, const std::string& text);
/// Reads a whole file.
std::string read_text(const std::string& path);

/// Path of a file under tests/data.
std::string data_path(const std::string& name);
/// Path of a file under the source tree (e.g. "examples/pump_cover_ball.toml").
std::string source_path(const std::string& name);

}  // namespace cuspmap::test

/// REQUIRE |a - b| <= tol, printing both values, the tolerance and any CAPTUREd context.
#define REQUIRE_NEAR(a, b, tol)                                       \
  do {                                                                \
    const double cuspmap_a_ = (a), cuspmap_b_ = (b), cuspmap_t_ = (tol); \
    INFO(#a " = " << cuspmap_a_ << ", " #b " = " << cuspmap_b_        \
                  << ", tol = " << cuspmap_t_);                       \
    REQUIRE(std::abs(cuspmap_a_ - cuspmap_b_) <= cuspmap_t_);         \
  } while (0)

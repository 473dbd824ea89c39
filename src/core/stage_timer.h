// Wall-clock timer for pipeline stages (sweep, texture, write), reported as timings{*_s}.
// Method: std::chrono::steady_clock.
#pragma once

#include <chrono>

namespace cuspmap {

/// Measures elapsed wall time since construction or the last restart().
class StageTimer {
 public:
  StageTimer() : start_(std::chrono::steady_clock::now()) {}
  /// Seconds since start (or last restart).
  double seconds() const {
    return std::chrono::duration<double>(std::chrono::steady_clock::now() - start_).count();
  }
  /// Returns seconds since start and restarts.
  double lap() {
    const auto now = std::chrono::steady_clock::now();
    const double s = std::chrono::duration<double>(now - start_).count();
    start_ = now;
    return s;
  }

 private:
  std::chrono::steady_clock::time_point start_;
};

}  // namespace cuspmap

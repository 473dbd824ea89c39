// Shared checks for the libFuzzer targets: what counts as a finding beyond a crash or a leak.
// A parser may refuse input only with InputError; a value it returns must honour its promises
// (finite numbers, ranges). Any other outcome aborts, so libFuzzer saves the input.
#pragma once

#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <exception>
#include <string>
#include <string_view>

#include "core/input_error.h"

namespace cuspmap::fuzz {

/// Aborts with a one-line reason: libFuzzer then records the input as a crash.
[[noreturn]] inline void finding(const std::string& what) {
  std::fprintf(stderr, "cuspmap fuzz finding: %s\n", what.c_str());
  std::abort();
}

/// Requires a finite number where the API promises one.
inline void require_finite(double value, const char* name) {
  if (!std::isfinite(value)) finding(std::string(name) + " is not finite");
}

/// Requires a condition the API promises for any input it accepts.
inline void require(bool ok, const char* what) {
  if (!ok) finding(what);
}

/// Runs `body`; InputError is the one acceptable refusal and must carry a one-line message.
/// Any other exception is a finding.
template <class Body>
void run_one(Body&& body) {
  try {
    body();
  } catch (const InputError& e) {
    const std::string_view msg = e.what();
    if (msg.empty()) finding("InputError with an empty message");
  } catch (const std::exception& e) {
    finding(std::string("unexpected exception: ") + e.what());
  } catch (...) {
    finding("unexpected non-standard exception");
  }
}

}  // namespace cuspmap::fuzz

// Shared checks for the libFuzzer targets: what counts as a finding beyond a crash or a leak.
// A parser may refuse input only with InputError; a value it returns must honour its promises
// (finite numbers, ranges). Any other outcome aborts, so libFuzzer saves the input.
#pragma once

#include <unistd.h>

#include <cmath>
#include <cstddef>
#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <exception>
#include <string>
#include <string_view>

#include "core/heightfield.h"
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

/// Requires a decoded heightfield to be usable: at least one cell, a grid of the stated size,
/// finite origin, heights finite or NaN (unreached) but never infinite, and a finite cell that is
/// > 0 unless the format does not state it (`cell_known` false: CSV, .npy).
inline void require_heightfield(const Heightfield& hf, bool cell_known) {
  require(hf.nx >= 1 && hf.ny >= 1, "empty heightfield accepted");
  require(hf.z_um.rows() == hf.ny && hf.z_um.cols() == hf.nx, "grid size differs from nx, ny");
  require_finite(hf.origin_x_mm, "origin_x_mm");
  require_finite(hf.origin_y_mm, "origin_y_mm");
  require_finite(hf.cell_mm, "cell_mm");
  if (cell_known) require(hf.cell_mm > 0, "cell_mm <= 0 accepted");
  const float* z = hf.z_um.data();
  for (std::int64_t k = 0; k < hf.cells(); ++k) {
    if (std::isinf(z[k])) finding("infinite height accepted");
  }
}

/// A private folder for this fuzzing process (in /dev/shm when it exists: memory, not disk),
/// for targets whose parser reads a file by name. Created once; libFuzzer runs one input at a time.
inline const std::string& scratch_dir() {
  static const std::string dir = [] {
    std::string templ = std::string(access("/dev/shm", W_OK) == 0 ? "/dev/shm" : "/tmp") +
                        "/cuspmap-fuzz-XXXXXX";
    if (mkdtemp(templ.data()) == nullptr) finding("cannot create a scratch folder");
    return templ;
  }();
  return dir;
}

/// Writes `bytes` to <scratch>/<name> (plain stdio: this is test scaffolding, not product output).
inline std::string scratch_file(const std::string& name, std::string_view bytes) {
  const std::string path = scratch_dir() + "/" + name;
  std::FILE* f = std::fopen(path.c_str(), "wb");
  if (f == nullptr) finding("cannot write " + path);
  if (!bytes.empty() && std::fwrite(bytes.data(), 1, bytes.size(), f) != bytes.size()) {
    finding("short write to " + path);
  }
  std::fclose(f);
  return path;
}

/// One heightmap-reader execution: writes the input to <scratch>/<file_name> and reads it with
/// `read` (the reader under test, called with the path), which must return a usable
/// Heightfield (require_heightfield) or refuse with InputError.
template <class Read>
int fuzz_heightmap_file(const std::uint8_t* data, std::size_t size, const std::string& file_name,
                        Read&& read) {
  const std::string path =
      scratch_file(file_name, std::string_view(reinterpret_cast<const char*>(data), size));
  run_one([&] { require_heightfield(read(path), true); });
  return 0;
}

}  // namespace cuspmap::fuzz

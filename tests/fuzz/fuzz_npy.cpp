// libFuzzer target: the NumPy .npy heightmap reader, through io/read_heightmap as the CLI uses it.
// Input: file bytes, written to a scratch file "fuzz.npy". Accepted files must give a usable
// heightfield (fuzz_check.h). Findings: an exception but InputError, an infinite height, an
// empty or inconsistent grid, a crash, a leak, UB or memory beyond libFuzzer's limit.
// fuzz-requires: src/io/read_heightmap.h
// fuzz-requires: src/io/read_heightmap.cpp
#include <cstddef>
#include <cstdint>
#include <string>

#include "fuzz_check.h"
#include "io/read_heightmap.h"

using namespace cuspmap;

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  HeightmapReadOptions options;
  options.cell_mm = 0.01;  // as --cell would give it (the examples' 10 um cell): the file has none
  return fuzz::fuzz_heightmap_file(data, size, "fuzz.npy", [&](const std::string& path) {
    return read_heightmap(path, options).field;
  });
}

// libFuzzer target: the X3P (ISO 25178-72: zip + main.xml + data.bin) heightmap reader, through io/read_heightmap as the CLI uses it.
// Input: file bytes, written to a scratch file "fuzz.x3p". Accepted files must give a usable
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
  // No --cell: the format states its own cell size.
  return fuzz::fuzz_heightmap_file(data, size, "fuzz.x3p", [](const std::string& path) {
    return read_heightmap(path, HeightmapReadOptions{}).field;
  });
}

// Flags shared by the commands that simulate (`simulate`, `compare`, `plan --simulate`, `demo`):
// threads, memory limit, shared height range; and their parsing.
#pragma once

#include <CLI/CLI.hpp>
#include <cstdint>
#include <optional>
#include <string>

#include "core/units.h"
#include "report/height_image.h"

namespace cuspmap {

/// Run-time flags of a simulation as typed.
struct SimFlags {
  int threads = 0;           ///< 0 = all hardware threads
  std::string max_memory;    ///< e.g. "2GiB"; empty = half of physical memory
  std::string range;         ///< "LO,HI" heights for height.png; empty = auto
};

/// Adds --threads, --max-memory and --range.
void add_sim_flags(CLI::App& sub, SimFlags& flags);

/// Parses a byte count such as "512MiB", "2GiB", "1.5G", "100000" (bytes).
/// @throws InputError naming --max-memory when malformed or not > 0.
std::int64_t parse_bytes(const std::string& text, const char* what);

/// Parses --range "LO,HI" (heights; bare numbers in `unit`, suffixes allowed), HI > LO.
std::optional<HeightRange> parse_height_range(const std::string& text, LengthUnit unit);

}  // namespace cuspmap

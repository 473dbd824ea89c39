// Size limits of built and read toolpaths: how many moves and lines cuspmap accepts before it
// refuses with an InputError instead of exhausting memory. Counts only; no computation.
// Method: memory arithmetic (a Move is ~100 bytes, so 4 million moves stay under ~0.4 GB).
#pragma once

#include <cstddef>

#include "core/units.h"

namespace cuspmap {

/// Most moves one toolpath may hold, built-in or read from G-code. A Move is about 100 bytes,
/// so the limit keeps a path under ~0.4 GB; a 60 x 60 mm floor at a 0.05 mm stepover needs
/// about 1,200 passes, far below it. Larger programs: split them or simulate a smaller patch.
inline constexpr std::size_t kMaxPathMoves = 4'000'000;

/// Longest G-code line, characters (end-of-line excluded). RS274NGC v3 (Kramer, Proctor &
/// Messina 2000, §3.3) allows 256; posts with long comments exceed that, so cuspmap allows 16x
/// more and stops reading a longer line as soon as the limit is passed.
inline constexpr std::size_t kMaxGcodeLineChars = 4096;

/// Most lines one G-code file may have (comments and blank lines included): 10x the move limit,
/// so comment-heavy programs fit while a runaway file stops in seconds, not minutes.
inline constexpr long long kMaxGcodeLines = 40'000'000;

/// Most lines one G-code program may run, counting each pass of a loop or call again: 2.5x the
/// line limit, so a loop that never ends stops with a message within a minute or so.
inline constexpr long long kMaxGcodeLinesRun = 100'000'000;
/// Largest magnitude of a G-code coordinate or arc word (X Y Z I J K R), in the program's units:
/// the job files' length bound as a number, so path lengths and cycle times stay finite and
/// meaningful; a larger number is a corrupt or mis-scaled program.
inline constexpr double kMaxGcodeCoordinate = kMaxJobLengthMm;

}  // namespace cuspmap

// Temp files in flight: names "<target>.tmp-<pid>-<n>" registered in fixed storage so a
// SIGINT/SIGTERM handler can unlink the ones not yet renamed. Shared by write_file_atomic and
// AtomicFileStream. Method: async-signal-safe unlink(2) of names kept in static arrays
// (POSIX.1-2017 §2.4.3 lists unlink among the async-signal-safe functions).
#pragma once

#include <string>

namespace cuspmap {

/// A fresh temp name beside `path`: "<path>.tmp-<pid>-<n>", n counting up within the process.
/// @param[in] path  destination file
std::string temp_file_name(const std::string& path);

/// Registers a temp name so the signal handler removes it.
/// @param[in] name  the temp file's path
/// @return the slot to pass to unregister_temp_file, or -1 when the name is too long or every
///         slot is taken (the file is then still written, just not removed on a signal)
int register_temp_file(const std::string& name);

/// Forgets a registered temp name (after its rename or unlink). A slot of -1 is ignored.
void unregister_temp_file(int slot);

}  // namespace cuspmap

// Writes a whole file atomically: bytes go to a temporary name in the same folder, are flushed,
// then renamed over the target, so a reader never sees a half-written file. The one place that
// writes whole output files (core/atomic_file_stream.h streams one too large to hold). Temp names
// are registered (core/temp_file_registry.h) so a SIGINT/SIGTERM handler can remove them.
// Method: POSIX rename(2) atomicity within one file system (ninja's build log does the same).
#pragma once

#include <string>
#include <string_view>

namespace cuspmap {

/// Writes `bytes` to `path` via "<path>.tmp-<pid>-<n>" + fsync + rename.
/// @param[in] path   destination file; its folder must exist
/// @param[in] bytes  complete file contents
/// @throws std::runtime_error (an internal error, exit 1) when the disk refuses; the temp file
///         is removed first.
void write_file_atomic(const std::string& path, std::string_view bytes);

/// Installs SIGINT/SIGTERM handlers that unlink every temp file still being written (by
/// write_file_atomic or an AtomicFileStream), then re-raise the signal. Call once from main.
/// Defined in core/temp_file_registry.cpp, beside the registry it reads.
void install_temp_cleanup_handlers();

}  // namespace cuspmap

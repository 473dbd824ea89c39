// Atomic whole-file writes: one AtomicFileStream appended once and committed (temp name in the
// same folder, fsync, rename). Inputs: destination path and bytes; output: the file, complete or
// absent. Method: POSIX open/write/fsync/rename; signal cleanup in core/temp_file_registry.cpp.
#include "core/write_file_atomic.h"

#include "core/atomic_file_stream.h"

namespace cuspmap {

void write_file_atomic(const std::string& path, std::string_view bytes) {
  AtomicFileStream file(path);
  file.append(bytes);
  file.commit();
}

}  // namespace cuspmap

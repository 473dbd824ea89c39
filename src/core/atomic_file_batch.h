// Several output files published together: each is written to its own temp name when added,
// and commit() makes them all durable, then renames them, so the disk's journal commits about
// once for the whole set instead of once per file; an abandoned batch leaves none of them.
// Method: POSIX rename(2) atomicity as core/atomic_file_stream.h; Linux sync_file_range(2) to
// start each file's write-back as soon as it is written, before any fsync(2) waits.
#pragma once

#include <memory>
#include <span>
#include <string>
#include <string_view>
#include <vector>

#include "core/atomic_file_stream.h"

namespace cuspmap {

/// Files staged under temp names and published by one commit().
class AtomicFileBatch {
 public:
  /// Writes `bytes` to a temp name beside `path` now and starts its write-back (not yet fsynced
  /// or renamed).
  /// @param[in] path   destination file; its folder must exist
  /// @param[in] bytes  complete file contents
  /// @throws std::runtime_error as AtomicFileStream (the temp file is removed first)
  void add(const std::string& path, std::string_view bytes);
  /// As add(path, bytes) for a file given in parts (written in order, never joined in memory).
  void add(const std::string& path, std::span<const std::string_view> parts);

  /// Waits for every file's write-back (fsync), renames each over its
  /// destination in the order added, then fsyncs their folders once each. Call once.
  /// @throws std::runtime_error as AtomicFileStream::commit(); files not yet renamed are removed
  void commit();

  /// Files added so far.
  std::size_t size() const { return files_.size(); }

 private:
  std::vector<std::unique_ptr<AtomicFileStream>> files_;
};

}  // namespace cuspmap

// A file written piece by piece yet published atomically: bytes are appended to a registered
// temp name in the target's folder, and only commit() (flush, fsync, rename) makes the target
// appear; an abandoned stream (exception, early return, signal) leaves no temp and no target.
// Method: POSIX rename(2) atomicity within one file system, as write_file_atomic.
#pragma once

#include <cstdint>
#include <string>
#include <string_view>

namespace cuspmap {

/// One output file being streamed to disk.
class AtomicFileStream {
 public:
  /// Opens "<path>.tmp-<pid>-<n>" (registered for SIGINT/SIGTERM cleanup).
  /// @param[in] path  destination file; its folder must exist
  /// @throws std::runtime_error "cannot write <path>: open: <reason>" (an internal error)
  explicit AtomicFileStream(std::string path);
  /// Unlinks the temp file unless commit() succeeded.
  ~AtomicFileStream();
  AtomicFileStream(const AtomicFileStream&) = delete;
  AtomicFileStream& operator=(const AtomicFileStream&) = delete;

  /// Appends bytes (written through to the temp file; no user-space buffer).
  /// @param[in] bytes  next part of the file; empty is allowed
  /// @throws std::runtime_error "cannot write <path>: write: <reason>" (e.g. disk full); the
  ///         temp file is removed first and the stream can no longer be used
  void append(std::string_view bytes);

  /// Flushes, fsyncs and renames the temp file over `path`. Call once.
  /// @throws std::runtime_error "cannot write <path>: flush|rename: <reason>"; the temp file is
  ///         removed first
  void commit();

  /// commit() in steps, for several files published together (core/atomic_file_batch.h):
  /// start_flush() starts writing the bytes back without waiting; flush() waits for them to
  /// reach the disk (fsync) and closes the temp; publish() renames it over `path`. Each once, in
  /// that order (start_flush may be skipped).
  /// @throws std::runtime_error as commit()
  void start_flush();
  void flush();
  void publish();

  /// Bytes appended so far.
  std::int64_t bytes_written() const { return written_; }
  /// The destination path.
  const std::string& path() const { return path_; }

 private:
  void abandon();  // close and unlink the temp, forget its slot
  [[noreturn]] void fail(const char* what, int err);

  std::string path_;
  std::string temp_;
  int slot_ = -1;
  int fd_ = -1;
  bool temp_exists_ = false;  // the temp file is on disk, not yet renamed
  std::int64_t written_ = 0;
};

}  // namespace cuspmap

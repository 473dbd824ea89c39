// Streamed atomic file: registered temp name, write(2) appends, fsync + rename on commit,
// unlink when abandoned. Inputs: destination path, byte pieces; output: the file, whole or absent.
// Method: POSIX open/write/fsync/rename; temp names from core/temp_file_registry.
#include "core/atomic_file_stream.h"

#include <fcntl.h>
#include <unistd.h>

#include <cassert>
#include <cerrno>
#include <cstdio>
#include <cstring>
#include <stdexcept>

#include "core/temp_file_registry.h"

namespace cuspmap {

AtomicFileStream::AtomicFileStream(std::string path)
    : path_(std::move(path)), temp_(temp_file_name(path_)) {
  slot_ = register_temp_file(temp_);
  fd_ = open(temp_.c_str(), O_WRONLY | O_CREAT | O_TRUNC | O_CLOEXEC, 0644);
  temp_exists_ = fd_ >= 0;
  if (fd_ < 0) {
    const int err = errno;
    unregister_temp_file(slot_);
    slot_ = -1;
    fail("open", err);
  }
}

AtomicFileStream::~AtomicFileStream() { abandon(); }

void AtomicFileStream::abandon() {
  if (fd_ >= 0) {
    close(fd_);
    fd_ = -1;
  }
  if (temp_exists_) unlink(temp_.c_str());
  temp_exists_ = false;
  unregister_temp_file(slot_);
  slot_ = -1;
}

void AtomicFileStream::fail(const char* what, int err) {
  abandon();
  throw std::runtime_error("cannot write " + path_ + ": " + what + ": " + std::strerror(err));
}

void AtomicFileStream::append(std::string_view bytes) {
  assert(fd_ >= 0 && "append after commit or after a failure");
  size_t done = 0;
  while (done < bytes.size()) {
    const ssize_t n = write(fd_, bytes.data() + done, bytes.size() - done);
    if (n < 0 && errno == EINTR) continue;
    if (n <= 0) fail("write", n < 0 ? errno : ENOSPC);
    done += static_cast<size_t>(n);
  }
  written_ += static_cast<std::int64_t>(bytes.size());
}

void AtomicFileStream::commit() {
  flush();
  publish();
}

void AtomicFileStream::start_flush() {
  assert(fd_ >= 0 && "start_flush after flush or after a failure");
  // Only a hint: flush() below reports any write-back error through fsync.
  (void)sync_file_range(fd_, 0, 0, SYNC_FILE_RANGE_WRITE);
}

void AtomicFileStream::flush() {
  assert(fd_ >= 0 && "flush twice or after a failure");
  if (fsync(fd_) != 0) fail("flush", errno);
  const int fd = fd_;
  fd_ = -1;  // closed below either way
  if (close(fd) != 0) fail("flush", errno);
}

void AtomicFileStream::publish() {
  assert(fd_ < 0 && temp_exists_ && "publish before flush, or twice");
  if (std::rename(temp_.c_str(), path_.c_str()) != 0) fail("rename", errno);
  temp_exists_ = false;
  unregister_temp_file(slot_);
  slot_ = -1;
}

}  // namespace cuspmap

// Atomic whole-file writes (temp name in the same folder, fsync, rename) and signal-time cleanup.
// Inputs: destination path and bytes; output: the file, complete or absent.
// Method: POSIX open/write/fsync/rename; async-signal-safe unlink of registered temp names.
#include "core/write_file_atomic.h"

#include <fcntl.h>
#include <unistd.h>

#include <array>
#include <atomic>
#include <cerrno>
#include <csignal>
#include <cstdio>
#include <cstring>
#include <mutex>
#include <stdexcept>

namespace cuspmap {
namespace {

// Temp names in flight, kept in fixed storage so a signal handler can read them safely.
constexpr int kMaxInFlight = 64;
constexpr int kMaxPath = 4096;
// Slot states: a slot is claimed, its name written, and only then published as ready, so the
// signal handler never unlinks a half-written (or stale) name.
constexpr int kFree = 0, kClaimed = 1, kReady = 2;
std::array<std::array<char, kMaxPath>, kMaxInFlight> g_temp_names{};
std::array<std::atomic<int>, kMaxInFlight> g_temp_state{};
std::atomic<unsigned> g_counter{0};

int register_temp(const std::string& name) {
  // A truncated name could be some other file: such a temp is written but not signal-cleaned.
  if (name.size() >= static_cast<size_t>(kMaxPath)) return -1;
  for (int k = 0; k < kMaxInFlight; ++k) {
    int expected = kFree;
    if (g_temp_state[k].compare_exchange_strong(expected, kClaimed)) {
      std::snprintf(g_temp_names[k].data(), kMaxPath, "%s", name.c_str());
      g_temp_state[k].store(kReady);
      return k;
    }
  }
  return -1;  // too many writers at once: the file is still written, just not cleaned on signal
}

void unregister_temp(int slot) {
  if (slot >= 0) g_temp_state[slot].store(kFree);
}

extern "C" void cleanup_and_reraise(int sig) {
  for (int k = 0; k < kMaxInFlight; ++k) {
    if (g_temp_state[k].load() == kReady) unlink(g_temp_names[k].data());
  }
  std::signal(sig, SIG_DFL);
  std::raise(sig);
}

[[noreturn]] void fail(const std::string& what, const std::string& path, int err) {
  throw std::runtime_error("cannot write " + path + ": " + what + ": " + std::strerror(err));
}

}  // namespace

void write_file_atomic(const std::string& path, std::string_view bytes) {
  const std::string temp = path + ".tmp-" + std::to_string(getpid()) + "-" +
                           std::to_string(g_counter.fetch_add(1));
  const int slot = register_temp(temp);
  const int fd = open(temp.c_str(), O_WRONLY | O_CREAT | O_TRUNC | O_CLOEXEC, 0644);
  if (fd < 0) {
    const int err = errno;
    unregister_temp(slot);
    fail("open", path, err);
  }
  size_t done = 0;
  while (done < bytes.size()) {
    const ssize_t n = write(fd, bytes.data() + done, bytes.size() - done);
    if (n < 0 && errno == EINTR) continue;
    if (n <= 0) {
      const int err = errno;
      close(fd);
      unlink(temp.c_str());
      unregister_temp(slot);
      fail("write", path, err);
    }
    done += static_cast<size_t>(n);
  }
  if (fsync(fd) != 0 || close(fd) != 0) {
    const int err = errno;
    unlink(temp.c_str());
    unregister_temp(slot);
    fail("flush", path, err);
  }
  if (std::rename(temp.c_str(), path.c_str()) != 0) {
    const int err = errno;
    unlink(temp.c_str());
    unregister_temp(slot);
    fail("rename", path, err);
  }
  unregister_temp(slot);
}

void install_temp_cleanup_handlers() {
  std::signal(SIGINT, cleanup_and_reraise);
  std::signal(SIGTERM, cleanup_and_reraise);
}

}  // namespace cuspmap

// Registry of temp files being written, and the signal handlers that unlink them.
// Inputs: temp names; output: none (signal-time unlink). Method: see temp_file_registry.h.
#include "core/temp_file_registry.h"

#include <unistd.h>

#include <array>
#include <atomic>
#include <csignal>
#include <cstdio>

#include "core/write_file_atomic.h"  // declares install_temp_cleanup_handlers

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

extern "C" void cleanup_and_reraise(int sig) {
  for (int k = 0; k < kMaxInFlight; ++k) {
    if (g_temp_state[k].load() == kReady) unlink(g_temp_names[k].data());
  }
  std::signal(sig, SIG_DFL);
  std::raise(sig);
}

}  // namespace

std::string temp_file_name(const std::string& path) {
  return path + ".tmp-" + std::to_string(getpid()) + "-" + std::to_string(g_counter.fetch_add(1));
}

int register_temp_file(const std::string& name) {
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

void unregister_temp_file(int slot) {
  if (slot >= 0) g_temp_state[slot].store(kFree);
}

void install_temp_cleanup_handlers() {
  std::signal(SIGINT, cleanup_and_reraise);
  std::signal(SIGTERM, cleanup_and_reraise);
}

}  // namespace cuspmap

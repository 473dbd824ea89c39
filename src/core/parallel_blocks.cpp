// Numbered blocks on std::thread workers with an atomic counter; errors carried to the caller.
// Inputs: block count, threads, work; output: none. Cost: the work / threads.
// Method: dynamic scheduling over a shared counter (the calling thread works too).
#include "core/parallel_blocks.h"

#include <algorithm>
#include <atomic>
#include <exception>
#include <thread>
#include <vector>

namespace cuspmap {

void parallel_blocks(int blocks, int threads, const std::function<void(int)>& work) {
  if (blocks <= 0) return;
  if (threads <= 0) threads = static_cast<int>(std::thread::hardware_concurrency());
  threads = std::clamp(threads, 1, blocks);
  std::atomic<int> next{0};
  std::vector<std::exception_ptr> errors(static_cast<size_t>(threads));
  auto worker = [&](int id) {
    try {
      for (int b = next.fetch_add(1); b < blocks; b = next.fetch_add(1)) work(b);
    } catch (...) {
      errors[static_cast<size_t>(id)] = std::current_exception();
      next.store(blocks);  // the others stop after their current block
    }
  };
  std::vector<std::thread> pool;
  pool.reserve(static_cast<size_t>(threads - 1));
  for (int id = 1; id < threads; ++id) pool.emplace_back(worker, id);
  worker(0);
  for (std::thread& th : pool) th.join();
  for (const std::exception_ptr& e : errors) {
    if (e) std::rethrow_exception(e);
  }
}

}  // namespace cuspmap

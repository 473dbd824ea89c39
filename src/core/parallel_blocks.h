// Runs independent numbered blocks of work on std::thread workers (the calling thread is one of
// them). Each block's result may depend only on its index, never on the worker that ran it, so
// callers that combine per-block results in index order are bit-identical for any thread count.
// Cost: the blocks' work / threads. Method: shared atomic block counter (dynamic scheduling).
#pragma once

#include <functional>

namespace cuspmap {

/// Calls work(b) once for every b in [0, blocks), on up to `threads` threads.
/// @param[in] blocks   number of blocks, >= 0
/// @param[in] threads  workers, 0 = all hardware threads (clamped to [1, blocks])
/// @param[in] work     must be safe to call concurrently for different b
/// @throws the first exception a block threw, after every worker stopped
void parallel_blocks(int blocks, int threads, const std::function<void(int)>& work);

}  // namespace cuspmap

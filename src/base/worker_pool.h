// The one worker pool of the parallel tools (tee search, spread): a fixed
// number of std::threads, each running `worker(id)` to completion, while the
// calling thread calls `tick()` at a steady interval (progress bars,
// cancellation checks). Work division and determinism are the caller's: the
// tools hand out blocks by index, so results never depend on the count.
#ifndef HUSHGAIN_BASE_WORKER_POOL_H_
#define HUSHGAIN_BASE_WORKER_POOL_H_

#include <functional>

namespace hushgain {

// The documented range of every --threads option is 0 (one per hardware
// thread) to this.
inline constexpr int kMaxWorkerThreads = 256;

// `requested` threads, 0 meaning one per hardware thread (at least 1),
// never more than `useful` (the number of independent pieces of work).
int WorkerCount(int requested, long useful);

// Runs worker(0) .. worker(threads - 1) on `threads` threads and returns when
// all have returned. With a `tick`, the calling thread calls it about every
// `tick_ms` milliseconds while they run, and once more at the end. Throws
// std::system_error when a thread cannot be started (after joining the
// started ones).
void RunWorkers(int threads, const std::function<void(int)>& worker,
                const std::function<void()>& tick = {}, int tick_ms = 100);

// fn(0) .. fn(count - 1) on up to `threads` threads, interleaved statically
// (index i on thread i mod threads), so the work each index does never
// depends on the thread count.
void ParallelFor(long count, int threads, const std::function<void(long)>& fn);

}  // namespace hushgain

#endif  // HUSHGAIN_BASE_WORKER_POOL_H_

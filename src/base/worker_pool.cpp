#include "base/worker_pool.h"

#include <algorithm>
#include <atomic>
#include <chrono>
#include <thread>
#include <vector>

namespace hushgain {

int WorkerCount(int requested, long useful) {
  long n = requested > 0 ? requested
                         : static_cast<long>(std::max(
                               1u, std::thread::hardware_concurrency()));
  n = std::min<long>(n, kMaxWorkerThreads);
  n = std::min(n, std::max(1L, useful));
  return static_cast<int>(n);
}

void RunWorkers(int threads, const std::function<void(int)>& worker,
                const std::function<void()>& tick, int tick_ms) {
  threads = std::max(1, threads);
  if (threads == 1 && !tick) {
    worker(0);
    return;
  }
  std::atomic<int> running{threads};
  auto run = [&](int id) {
    worker(id);
    running.fetch_sub(1, std::memory_order_release);
  };
  std::vector<std::thread> pool;
  pool.reserve(threads);
  try {
    for (int t = 0; t < threads; ++t) pool.emplace_back(run, t);
  } catch (...) {
    // Threads that did start finish their share; the caller sees the error.
    running.fetch_sub(threads - static_cast<int>(pool.size()));
    for (std::thread& th : pool) th.join();
    throw;
  }
  if (tick) {
    while (running.load(std::memory_order_acquire) > 0) {
      tick();
      std::this_thread::sleep_for(std::chrono::milliseconds(tick_ms));
    }
  }
  for (std::thread& th : pool) th.join();
  if (tick) tick();
}

void ParallelFor(long count, int threads, const std::function<void(long)>& fn) {
  const int n = WorkerCount(threads, count);
  RunWorkers(n, [&](int t) {
    for (long i = t; i < count; i += n) fn(i);
  });
}

}  // namespace hushgain

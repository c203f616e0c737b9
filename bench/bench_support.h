// Small helpers for the benchmark binary: medians of repeated timings and
// the one output format, a line `name: value unit` per figure.
// Speed is printed, never asserted (scripts/bench runs this).
#ifndef HUSHGAIN_BENCH_BENCH_SUPPORT_H_
#define HUSHGAIN_BENCH_BENCH_SUPPORT_H_

#include <algorithm>
#include <chrono>
#include <cstdio>
#include <string>
#include <vector>

namespace hushgain::bench {

// The median of `values` (the mean of the middle two for an even count).
inline double Median(std::vector<double> values) {
  if (values.empty()) return 0;
  std::sort(values.begin(), values.end());
  const std::size_t n = values.size();
  return n % 2 ? values[n / 2] : 0.5 * (values[n / 2 - 1] + values[n / 2]);
}

// Runs `body` `warmup` times untimed, then `runs` times, and returns the
// median wall-clock time of one run in seconds.
template <typename Body>
double MedianSeconds(int runs, int warmup, Body&& body) {
  for (int i = 0; i < warmup; ++i) body();
  std::vector<double> seconds;
  seconds.reserve(runs);
  for (int i = 0; i < runs; ++i) {
    const auto start = std::chrono::steady_clock::now();
    body();
    const auto stop = std::chrono::steady_clock::now();
    seconds.push_back(std::chrono::duration<double>(stop - start).count());
  }
  return Median(seconds);
}

// Prints `name: value unit`: 4 significant digits, whole numbers from 1e4
// up ("246400", not "2.464e+05").
inline void PrintFigure(const std::string& name, double value,
                        const std::string& unit) {
  if (value >= 1e4)
    std::printf("%s: %.0f %s\n", name.c_str(), value, unit.c_str());
  else
    std::printf("%s: %.4g %s\n", name.c_str(), value, unit.c_str());
  std::fflush(stdout);
}

// Prints `name: failed (why)` when a benchmark cannot run, so a broken
// benchmark is visible and never a silent gap.
inline void PrintFailure(const std::string& name, const std::string& why) {
  std::printf("%s: failed (%s)\n", name.c_str(), why.c_str());
  std::fflush(stdout);
}

}  // namespace hushgain::bench

#endif  // HUSHGAIN_BENCH_BENCH_SUPPORT_H_

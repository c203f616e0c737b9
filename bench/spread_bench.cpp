// The spread benchmark: 1e5 Monte Carlo samples of a T-network stage (gain
// error, offset and integrated noise per sample, finite GBW), on every
// hardware thread. Prints `spread_tee_1e5: <s> s`, the median of 5 runs.
#include "bench/spread_bench.h"

#include <algorithm>
#include <chrono>
#include <cstdio>
#include <vector>

#include "circuit/stage.h"
#include "montecarlo/spread.h"
#include "tests/fixture_stages.h"

namespace hushgain {

void RunSpreadBenchmarks() {
  const Stage stage = test::JfetTeeStage();
  SpreadOptions options;
  options.samples = 100000;
  options.seed = 7;
  std::vector<double> seconds;
  for (int run = 0; run < 5; ++run) {
    const auto start = std::chrono::steady_clock::now();
    const SpreadRun result = RunSpread(stage, options);
    const auto stop = std::chrono::steady_clock::now();
    if (!result.status.ok) {
      std::fprintf(stderr, "spread benchmark failed: %s\n",
                   result.status.message.c_str());
      return;
    }
    seconds.push_back(std::chrono::duration<double>(stop - start).count());
  }
  std::sort(seconds.begin(), seconds.end());
  std::printf("spread_tee_1e5: %.3f s\n", seconds[seconds.size() / 2]);
}

}  // namespace hushgain

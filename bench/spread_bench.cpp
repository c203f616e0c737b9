// The spread benchmarks:
//   spread_tee_1e5  1e5 Monte Carlo samples of a T-network stage (gain
//                   error, offset and integrated noise per sample, finite
//                   GBW, tolerances and a temperature range), in process,
//                   on every hardware thread; the median of 5 runs (s)
//   spread_tee_1e6  the whole `hushgain spread` process on the T-network
//                   example (examples/geophone-preamp.json), 1e6 samples
//                   on 2 threads, report to /dev/null: its wall time (s)
//                   and its peak resident memory (MB, the kernel's
//                   ru_maxrss of the process), the medians of 3 runs
#include "bench/spread_bench.h"

#include <fcntl.h>
#include <spawn.h>
#include <sys/resource.h>
#include <sys/wait.h>
#include <unistd.h>

#include <algorithm>
#include <chrono>
#include <cstdio>
#include <string>
#include <vector>

#include "bench/bench_support.h"
#include "circuit/stage.h"
#include "montecarlo/spread.h"
#include "tests/fixture_stages.h"

extern char** environ;

namespace hushgain {
namespace {

void BenchInProcess() {
  const Stage stage = test::JfetTeeStage();
  SpreadOptions options;
  options.samples = 100000;
  options.seed = 7;
  std::vector<double> seconds;
  for (int run = 0; run < 5; ++run) {
    const auto start = std::chrono::steady_clock::now();
    const SpreadRun result = RunSpread(stage, options);
    const auto stop = std::chrono::steady_clock::now();
    if (!result.status.ok)
      return bench::PrintFailure("spread_tee_1e5", result.status.message);
    seconds.push_back(std::chrono::duration<double>(stop - start).count());
  }
  std::sort(seconds.begin(), seconds.end());
  std::printf("spread_tee_1e5: %.3f s\n", seconds[seconds.size() / 2]);
}

void BenchProcess() {
  const std::string binary = HUSHGAIN_BINARY;
  const std::string stage_path =
      std::string(HUSHGAIN_SOURCE_DIR) + "/examples/geophone-preamp.json";
  std::vector<std::string> storage = {
      binary, "spread", stage_path, "--samples", "1000000", "--threads", "2"};
  std::vector<char*> argv;
  for (std::string& a : storage) argv.push_back(a.data());
  argv.push_back(nullptr);
  std::vector<double> seconds, megabytes;
  for (int run = 0; run < 3; ++run) {
    posix_spawn_file_actions_t actions;
    posix_spawn_file_actions_init(&actions);
    posix_spawn_file_actions_addopen(&actions, STDOUT_FILENO, "/dev/null",
                                     O_WRONLY, 0);
    const auto start = std::chrono::steady_clock::now();
    pid_t pid = -1;
    const int spawned = posix_spawn(&pid, binary.c_str(), &actions, nullptr,
                                    argv.data(), environ);
    posix_spawn_file_actions_destroy(&actions);
    if (spawned != 0)
      return bench::PrintFailure("spread_tee_1e6", "cannot start " + binary);
    int status = 0;
    struct rusage usage {};
    if (wait4(pid, &status, 0, &usage) < 0 || !WIFEXITED(status) ||
        WEXITSTATUS(status) != 0)
      return bench::PrintFailure("spread_tee_1e6", binary + " did not exit 0");
    const auto stop = std::chrono::steady_clock::now();
    seconds.push_back(std::chrono::duration<double>(stop - start).count());
    megabytes.push_back(static_cast<double>(usage.ru_maxrss) / 1024.0);
  }
  bench::PrintFigure("spread_tee_1e6", bench::Median(seconds), "s");
  bench::PrintFigure("spread_tee_1e6_peak_memory", bench::Median(megabytes),
                     "MB");
}

}  // namespace

void RunSpreadBenchmarks() {
  BenchInProcess();
  BenchProcess();
}

}  // namespace hushgain

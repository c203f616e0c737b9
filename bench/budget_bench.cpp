#include "bench/budget_bench.h"

#include <fcntl.h>
#include <spawn.h>
#include <sys/wait.h>
#include <unistd.h>

#include <cmath>
#include <complex>
#include <string>
#include <vector>

#include "bench/bench_support.h"
#include "budget/compute_budget.h"
#include "circuit/expand_stage.h"
#include "io/device_library.h"
#include "io/error.h"
#include "io/stage_parser.h"
#include "noise/spectrum_evaluator.h"
#include "review/review.h"

extern char** environ;

namespace hushgain::bench {
namespace {

const std::string kSourceDir = HUSHGAIN_SOURCE_DIR;
// The T-network example with finite GBW: 10 M equivalent from 100 k parts.
const std::string kTeeExample = "examples/geophone-preamp.json";
const std::string kPlainExample = "examples/load-cell-bridge.json";
// A photodiode stage whose feedback capacitor is chosen by the budget
// ("capacitor": "auto", Butterworth target).
const std::string kAutoCapacitorExample =
    "examples/smoke-chamber-receiver.json";

Stage LoadExample(const std::string& relative) {
  const DeviceLibrary library = LoadDeviceLibrary(kSourceDir + "/devices");
  return LoadStageFile(kSourceDir + "/" + relative, library);
}

// One full budget (default options: relative tolerance 1e-4, every
// contributor, and for a T network the plain comparison) per run.
void BenchBudget(const std::string& name, const std::string& example) {
  const Stage stage = LoadExample(example);
  const ReviewOptions options;
  bool ok = true;
  std::string why;
  const double seconds = MedianSeconds(201, 10, [&] {
    BudgetOutcome outcome = ReviewStage(stage, options);
    if (!outcome.status.ok) {
      ok = false;
      why = outcome.status.message;
    }
  });
  if (!ok) return PrintFailure(name, why);
  PrintFigure(name, seconds * 1e6, "us");
}

// AdjointSolver::SolveAt and the transfer of every noise source and of the
// signal, at frequencies spread over the band in log f.
void BenchAcSolves() {
  const Stage stage = LoadExample(kTeeExample);
  const Netlist netlist = ExpandStage(stage);
  SpectrumEvaluator evaluator;
  Status s =
      SpectrumEvaluator::Create(netlist, stage.temperature_k, &evaluator);
  if (!s.ok) return PrintFailure("ac_solves_per_s", s.message);
  const Port signal = evaluator.Compile(netlist.signal);
  constexpr int kFrequencies = 1000;
  std::vector<double> f(kFrequencies);
  for (int i = 0; i < kFrequencies; ++i)
    f[i] = stage.band_low_hz * std::pow(stage.band_high_hz / stage.band_low_hz,
                                        i / double(kFrequencies - 1));
  volatile double sink = 0;
  bool ok = true;
  const double seconds = MedianSeconds(15, 2, [&] {
    double sum = 0;
    for (double fi : f) {
      ok = evaluator.SolveAt(fi).ok && ok;
      for (int k = 0; k < evaluator.source_count(); ++k)
        sum += std::norm(evaluator.SourceTransfer(k));
      sum += std::norm(evaluator.Transfer(signal));
    }
    sink = sink + sum;
  });
  if (!ok) return PrintFailure("ac_solves_per_s", "a solve failed");
  PrintFigure("ac_solves_per_s", kFrequencies / seconds, "1/s");
}

// The whole process: `hushgain budget <tee example>`, stdout to /dev/null,
// spawned and waited for.
void BenchProcess() {
  const std::string binary = HUSHGAIN_BINARY;
  const std::string stage_path = kSourceDir + "/" + kTeeExample;
  std::vector<std::string> storage = {binary, "budget", stage_path};
  std::vector<char*> argv;
  for (std::string& a : storage) argv.push_back(a.data());
  argv.push_back(nullptr);
  bool ok = true;
  const double seconds = MedianSeconds(30, 3, [&] {
    posix_spawn_file_actions_t actions;
    posix_spawn_file_actions_init(&actions);
    posix_spawn_file_actions_addopen(&actions, STDOUT_FILENO, "/dev/null",
                                     O_WRONLY, 0);
    pid_t pid = -1;
    if (posix_spawn(&pid, binary.c_str(), &actions, nullptr, argv.data(),
                    environ) != 0) {
      ok = false;
    } else {
      int status = 0;
      if (waitpid(pid, &status, 0) < 0 || !WIFEXITED(status) ||
          WEXITSTATUS(status) != 0)
        ok = false;
    }
    posix_spawn_file_actions_destroy(&actions);
  });
  if (!ok) return PrintFailure("budget_process", binary + " did not exit 0");
  PrintFigure("budget_process", seconds * 1e3, "ms");
}

}  // namespace

void RunBudgetBenchmarks() {
  try {
    BenchBudget("budget_tee_full", kTeeExample);
    BenchAcSolves();
    BenchProcess();
    BenchBudget("budget_plain_full", kPlainExample);
    BenchBudget("budget_smoke_auto_cf", kAutoCapacitorExample);
  } catch (const Error& e) {
    PrintFailure("budget", e.what());
  }
}

}  // namespace hushgain::bench

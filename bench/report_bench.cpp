#include "bench/report_bench.h"

#include <fcntl.h>
#include <spawn.h>
#include <sys/wait.h>
#include <unistd.h>

#include <cmath>
#include <cstdio>
#include <string>
#include <vector>

#include "bench/bench_support.h"
#include "budget/compute_budget.h"
#include "budget/frequency_grid.h"
#include "budget/sample_spectra.h"
#include "integrate/cumulative_power.h"
#include "io/device_library.h"
#include "io/error.h"
#include "io/stage_parser.h"
#include "report/plot_script.h"
#include "report/run_gnuplot.h"

extern char** environ;

namespace hushgain::bench {
namespace {

const std::string kSourceDir = HUSHGAIN_SOURCE_DIR;
const std::string kTeeExample = "examples/geophone-preamp.json";

// The plot grid of the command: 50 points per decade over the plot range,
// band edges on the grid.
std::vector<double> PlotGrid(const Budget& b) {
  const auto [lo, hi] = PlotFrequencyRangeHz(b);
  return JoinGrids({LogFrequencyGrid(lo, b.band_low_hz, 50),
                    LogFrequencyGrid(b.band_low_hz, b.band_high_hz, 50),
                    LogFrequencyGrid(b.band_high_hz, hi, 50)});
}

// Spawns `args` with stdout and stderr to /dev/null; true on exit 0.
bool Spawn(std::vector<std::string> args) {
  std::vector<char*> argv;
  for (std::string& a : args) argv.push_back(a.data());
  argv.push_back(nullptr);
  posix_spawn_file_actions_t actions;
  posix_spawn_file_actions_init(&actions);
  posix_spawn_file_actions_addopen(&actions, STDOUT_FILENO, "/dev/null",
                                   O_WRONLY, 0);
  posix_spawn_file_actions_addopen(&actions, STDERR_FILENO, "/dev/null",
                                   O_WRONLY, 0);
  pid_t pid = -1;
  bool ok =
      posix_spawn(&pid, argv[0], &actions, nullptr, argv.data(), environ) == 0;
  posix_spawn_file_actions_destroy(&actions);
  int status = 0;
  if (ok)
    ok = waitpid(pid, &status, 0) >= 0 && WIFEXITED(status) &&
         WEXITSTATUS(status) == 0;
  return ok;
}

void BenchSamplingAndScript() {
  const DeviceLibrary library = LoadDeviceLibrary(kSourceDir + "/devices");
  const Stage stage = LoadStageFile(kSourceDir + "/" + kTeeExample, library);
  const BudgetOutcome budget = ComputeBudget(stage, BudgetOptions{});
  if (!budget.status.ok)
    return PrintFailure("plot_grid_sampling", budget.status.message);
  const Stage sampled = StageAsBudgeted(stage, budget.budget);
  const std::vector<double> grid = PlotGrid(budget.budget);
  SpectrumOutcome spectrum;
  const double sampling =
      MedianSeconds(51, 3, [&] { spectrum = SampleSpectra(sampled, grid); });
  if (!spectrum.status.ok)
    return PrintFailure("plot_grid_sampling", spectrum.status.message);
  PrintFigure("plot_grid_sampling", sampling * 1e6, "us");
  PrintFigure("plot_grid_points", static_cast<double>(grid.size()), "points");

  PlotData data;
  data.samples = spectrum.samples;
  std::vector<double> psd;
  for (std::size_t i = 0; i < grid.size(); ++i)
    if (grid[i] >= budget.budget.band_low_hz &&
        grid[i] <= budget.budget.band_high_hz) {
      data.cumulative_f_hz.push_back(grid[i]);
      psd.push_back(spectrum.samples.total_v_per_rthz[i] *
                    spectrum.samples.total_v_per_rthz[i]);
    }
  for (double p : CumulativeLogTrapezoid(data.cumulative_f_hz, psd))
    data.cumulative_rms_v.push_back(std::sqrt(p));
  PlotScriptOptions options;
  options.output_path = "/dev/null";
  std::size_t bytes = 0;
  const double script = MedianSeconds(51, 3, [&] {
    bytes = BuildPlotScript(budget.budget, data, options).size();
  });
  PrintFigure("plot_script_build", script * 1e6, "us");
  PrintFigure("plot_script_size", bytes / 1024.0, "KiB");
}

// `hushgain plot <tee example> -o <tmp>.png`, gnuplot included.
void BenchPlotProcess() {
  if (FindGnuplot().empty())
    return PrintFailure("plot_process_png", "gnuplot not on PATH");
  char dir[] = "/tmp/hushgain-bench-XXXXXX";
  if (::mkdtemp(dir) == nullptr)
    return PrintFailure("plot_process_png", "no temporary folder");
  const std::string png = std::string(dir) + "/sheet.png";
  bool ok = true;
  const double seconds = MedianSeconds(9, 1, [&] {
    ok = Spawn({HUSHGAIN_BINARY, "plot", kSourceDir + "/" + kTeeExample, "-o",
                png}) &&
         ok;
  });
  std::remove(png.c_str());
  ::rmdir(dir);
  if (!ok) return PrintFailure("plot_process_png", "hushgain plot failed");
  PrintFigure("plot_process_png", seconds * 1e3, "ms");
}

}  // namespace

void RunReportBenchmarks() {
  try {
    BenchSamplingAndScript();
    BenchPlotProcess();
  } catch (const Error& e) {
    PrintFailure("report", e.what());
  }
}

}  // namespace hushgain::bench

#include "cli/spread_command.h"

#include <unistd.h>

#include <atomic>
#include <csignal>
#include <cstdio>
#include <filesystem>
#include <iostream>
#include <optional>

#include "cli/diagnostics.h"
#include "cli/draw_picture.h"
#include "cli/exit_codes.h"
#include "cli/interrupt.h"
#include "cli/option_values.h"
#include "cli/output_files.h"
#include "cli/output_format.h"
#include "cli/progress_bar.h"
#include "cli/stage_input.h"
#include "cli/text_output.h"
#include "io/device_library.h"
#include "io/error.h"
#include "io/read_file.h"
#include "io/stage_parser.h"
#include "io/units.h"
#include "montecarlo/spread.h"
#include "montecarlo/spread_statistics.h"
#include "report/spread_plot_script.h"
#include "report/spread_report.h"

namespace hushgain {
namespace {

std::optional<double> Limit(const std::string& text, const char* option,
                            Quantity quantity) {
  if (text.empty()) return std::nullopt;
  std::string why;
  std::optional<double> v = ParseQuantity(text, quantity, &why);
  if (!v)
    throw Error("command line", "",
                std::string(option) + ": expected " +
                    std::string(QuantityName(quantity)) + ", got \"" + text +
                    "\" (" + why + ")");
  if (!(*v > 0))
    throw Error("command line", "",
                std::string(option) + ": expected a positive limit, got \"" +
                    text + "\"");
  return v;
}

}  // namespace

int RunSpreadCommand(const SpreadCommandOptions& options) {
  SpreadOptions spread;
  spread.samples = options.samples;
  spread.seed = options.seed;
  spread.threads = options.threads;
  ThrowIfInvalid(spread.Validate(), {{"samples", "--samples"},
                                     {"threads", "--threads"},
                                     {"relative_tolerance", "--tolerance"}});
  const std::string format =
      ResolveOutputFormat(options.format, options.json, /*csv=*/false);
  SpreadLimits limits;
  limits.gain_error =
      Limit(options.gain_error_limit, "--gain-error-limit", Quantity::kRatio);
  limits.offset_v =
      Limit(options.offset_limit, "--offset-limit", Quantity::kVoltage);
  limits.noise_v =
      Limit(options.noise_limit, "--noise-limit", Quantity::kVoltage);

  SpreadPlotOptions plot;
  plot.seed = options.seed;
  std::string gnuplot;
  if (!options.plot_path.empty()) {
    plot.format = PictureFormat("--plot", options.plot_path);
    gnuplot = GnuplotOrExplain("spread --plot");
    if (gnuplot.empty()) return kExitToolFailed;
  }
  const DeviceLibrary library = LoadDeviceLibrary(options.devices_dir);
  const Stage stage =
      LoadStageForCommand(options.stage_path, library, options.device);
  // Refuse an unwritable place before the run, not after it.
  OutputFiles outputs;
  std::optional<OutputFiles::Id> csv_file, plot_file;
  if (!options.csv_path.empty())
    csv_file = outputs.AddText("--csv", options.csv_path, /*stdout_ok=*/true);
  if (!options.plot_path.empty())
    plot_file = outputs.AddPicture("--plot", options.plot_path, plot.format);
  outputs.Check(CommandInputs(options.stage_path, library, options.device));

  SpreadControl control;
  ProgressBar bar("sampling");
  if (bar.enabled())
    control.progress = [&bar](long done, long total) {
      bar.Show(static_cast<double>(done) /
               static_cast<double>(total > 0 ? total : 1));
    };
  InterruptScope interrupt;
  control.stop = interrupt.flag();
  const SpreadRun run = RunSpread(stage, spread, control);
  bar.Clear();
  const auto interrupted = [] {
    std::cerr << "\n";
    ReportInterrupted("no report, no CSV and no picture written");
    return kExitInterrupted;
  };
  if (run.interrupted) return interrupted();
  if (!run.status.ok)
    return ReportRefusal(options.stage_path, run.status.message);
  const SpreadSummary summary = Summarize(run, limits);
  // The samples' CSV is written as it is formatted, a few thousand rows at
  // a time: a million samples never sit in memory as text.
  if (csv_file)
    outputs.SetTextProducer(*csv_file, [&run](const OutputFiles::Write& write) {
      std::string why = write(SpreadCsvHeader(run));
      constexpr std::size_t kRows = 4096;
      for (std::size_t i = 0; why.empty() && i < run.size(); i += kRows)
        why = write(SpreadCsvRows(run, i, i + kRows));
      return why;
    });
  if (plot_file) {
    const int drawn = DrawPicture(
        gnuplot, outputs, *plot_file,
        [&](const std::string& temporary) {
          SpreadPlotOptions drawing = plot;
          drawing.output_path = temporary;
          return BuildSpreadPlotScript(run, summary, limits, drawing);
        },
        control.stop);
    if (drawn == kExitInterrupted) return interrupted();
    if (drawn != kExitOk) return drawn;
  }
  const int written = outputs.Commit(control.stop);
  if (written == kExitInterrupted) return interrupted();
  if (written != kExitOk) return written;
  if (!outputs.TakesStdout())
    WriteReport(SpreadReport(format, run, summary, limits, options.seed),
                format);
  return kExitOk;
}

}  // namespace hushgain

#include "cli/budget_command.h"

#include <cstdio>
#include <iostream>
#include <optional>
#include <vector>

#include "budget/compute_budget.h"
#include "budget/frequency_grid.h"
#include "budget/sample_spectra.h"
#include "cli/diagnostics.h"
#include "cli/exit_codes.h"
#include "cli/option_values.h"
#include "cli/output_files.h"
#include "cli/output_format.h"
#include "cli/stage_input.h"
#include "cli/text_output.h"
#include "io/device_library.h"
#include "io/error.h"
#include "io/read_file.h"
#include "io/stage_parser.h"
#include "report/chain_tables.h"
#include "report/csv_report.h"
#include "report/json_report.h"
#include "report/markdown_report.h"
#include "report/table.h"
#include "report/text_report.h"
#include "review/review.h"

namespace hushgain {
namespace {

std::string Render(const Budget& budget, const std::string& format) {
  if (format == "json") return BudgetToJson(budget);
  if (format == "markdown") return BudgetToMarkdown(budget);
  if (format == "csv") return BudgetToCsv(budget);
  return BudgetToText(budget);
}

}  // namespace

int RunBudgetCommand(const BudgetCommandOptions& options) {
  const std::string format =
      ResolveOutputFormat(options.format, options.json, false);
  ReviewOptions tolerance_only;
  tolerance_only.budget.integration.relative_tolerance = options.tolerance;
  ThrowIfInvalid(tolerance_only.Validate(),
                 {{"relative_tolerance", "--tolerance"}});

  const DeviceLibrary library = LoadDeviceLibrary(options.devices_dir);
  const Stage stage =
      LoadStageForCommand(options.stage_path, library, options.device);
  if (!options.chain_csv_path.empty() && !stage.chain)
    throw Error("command line", "",
                "--chain-csv: the stage has no \"chain\" block");
  OutputFiles outputs;
  std::optional<OutputFiles::Id> spectrum_file, chain_file;
  if (!options.spectrum_path.empty())
    spectrum_file = outputs.AddText("--spectrum", options.spectrum_path,
                                    /*stdout_ok=*/true);
  if (!options.chain_csv_path.empty())
    chain_file = outputs.AddText("--chain-csv", options.chain_csv_path,
                                 /*stdout_ok=*/true);
  outputs.Check(CommandInputs(options.stage_path, library, options.device));
  ReviewOptions review_options = FullReviewOptions(library, options.tolerance);
  review_options.sensitivity = options.sensitivity || format == "json";
  const BudgetOutcome outcome = ReviewStage(stage, review_options);
  if (!outcome.status.ok)
    return ReportRefusal(options.stage_path, outcome.status.message);
  if (spectrum_file) {
    const SpectrumOutcome spectrum =
        SampleSpectra(StageAsBudgeted(stage, outcome.budget),
                      LogFrequencyGrid(stage.band_low_hz, stage.band_high_hz,
                                       kSpectrumPointsPerDecade));
    if (!spectrum.status.ok)
      return ReportRefusal(options.stage_path, spectrum.status.message);
    outputs.SetText(*spectrum_file,
                    SpectrumToCsv(outcome.budget, spectrum.samples));
  }
  if (chain_file)
    outputs.SetText(*chain_file,
                    RenderCsv(ChainTable(outcome.budget, ChainCells::kCsv)));
  const std::string text = Render(outcome.budget, format);
  ReportWarnings(outcome.budget.warnings);
  if (const int written = outputs.Commit(); written != kExitOk) return written;
  // An output on standard output takes it: the report is not mixed in.
  if (!outputs.TakesStdout()) WriteReport(text, format);
  return kExitOk;
}

}  // namespace hushgain

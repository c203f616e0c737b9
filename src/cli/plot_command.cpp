#include "cli/plot_command.h"

#include <cmath>
#include <cstdio>
#include <iostream>
#include <optional>
#include <vector>

#include "budget/compute_budget.h"
#include "budget/frequency_grid.h"
#include "budget/sample_spectra.h"
#include "chain/chain_budget.h"
#include "circuit/stage_at_temperature.h"
#include "cli/diagnostics.h"
#include "cli/draw_picture.h"
#include "cli/exit_codes.h"
#include "cli/output_files.h"
#include "cli/stage_input.h"
#include "integrate/cumulative_power.h"
#include "io/device_library.h"
#include "io/error.h"
#include "io/read_file.h"
#include "io/stage_parser.h"
#include "io/suggest.h"
#include "report/plot_script.h"
#include "review/review.h"

namespace hushgain {
namespace {

PlotScriptOptions ScriptOptions(const PlotCommandOptions& options) {
  PlotScriptOptions script;
  script.format = PictureFormat("-o", options.output_path);
  const std::vector<std::string> panels = {"spectrum", "cumulative", "gain",
                                           "chain"};
  if (options.only == "spectrum")
    script.panels = {PlotPanel::kSpectrum};
  else if (options.only == "cumulative")
    script.panels = {PlotPanel::kCumulative};
  else if (options.only == "gain")
    script.panels = {PlotPanel::kGain};
  else if (options.only == "chain")
    script.panels = {PlotPanel::kChain};
  else if (!options.only.empty())
    throw Error("command line", "",
                "--only: expected spectrum, cumulative, gain or chain, got \"" +
                    options.only + "\"" + DidYouMean(options.only, panels));
  return script;
}

int Refused(const PlotCommandOptions& options, const std::string& why) {
  return ReportRefusal(options.stage_path, why);
}

// The picture data: samples on the plot grid, and the cumulative rms on its
// band part (the grid holds both band edges exactly).
PlotData CumulativeOnBand(const Budget& budget, SpectrumSamples samples) {
  PlotData data;
  std::vector<double> psd;
  for (std::size_t i = 0; i < samples.f_hz.size(); ++i) {
    const double f = samples.f_hz[i];
    if (f < budget.band_low_hz || f > budget.band_high_hz) continue;
    data.cumulative_f_hz.push_back(f);
    psd.push_back(samples.total_v_per_rthz[i] * samples.total_v_per_rthz[i]);
  }
  for (double p : CumulativeLogTrapezoid(data.cumulative_f_hz, psd))
    data.cumulative_rms_v.push_back(std::sqrt(p));
  data.samples = std::move(samples);
  return data;
}

// The chain panel's data: from the band's low edge to where the chain's
// count stopped, the cumulative analog rms at the converter's input and the
// filter's response in dB, on the stage as the budget computed it.
Status SampleChainPanel(const Stage& stage, const Budget& budget,
                        PlotData* data) {
  const ChainBlock& c = *budget.chain;
  const std::vector<double> grid = LogFrequencyGrid(
      budget.band_low_hz, c.counted_to_hz, kPlotPointsPerDecade);
  const ChainSamplesOutcome chain = SampleChain(
      StageAtTemperature(StageAsBudgeted(stage, budget), stage.temperature_k),
      grid);
  if (!chain.status.ok) return chain.status;
  data->chain_f_hz = chain.samples.f_hz;
  for (double p :
       CumulativeLogTrapezoid(chain.samples.f_hz, chain.samples.analog_psd))
    data->chain_cumulative_rms_v.push_back(std::sqrt(p));
  for (double h : chain.samples.filter_abs)
    data->chain_filter_db.push_back(20 * std::log10(h));
  return Status::Ok();
}

}  // namespace

SheetData SampleSheet(const Stage& stage, const Budget& budget) {
  const auto [f_min, f_max] = PlotFrequencyRangeHz(budget);
  const std::vector<double> grid = JoinGrids(
      {LogFrequencyGrid(f_min, budget.band_low_hz, kPlotPointsPerDecade),
       LogFrequencyGrid(budget.band_low_hz, budget.band_high_hz,
                        kPlotPointsPerDecade),
       LogFrequencyGrid(budget.band_high_hz, f_max, kPlotPointsPerDecade)});
  SpectrumOutcome spectrum =
      SampleSpectra(StageAsBudgeted(stage, budget), grid);
  SheetData sheet;
  sheet.status = spectrum.status;
  if (spectrum.status.ok)
    sheet.data = CumulativeOnBand(budget, std::move(spectrum.samples));
  if (sheet.status.ok && budget.chain)
    sheet.status = SampleChainPanel(stage, budget, &sheet.data);
  return sheet;
}

int RunPlotCommand(const PlotCommandOptions& options) {
  PlotScriptOptions script_options = ScriptOptions(options);
  const DeviceLibrary library = LoadDeviceLibrary(options.devices_dir);
  const Stage stage =
      LoadStageForCommand(options.stage_path, library, options.device);
  OutputFiles outputs;
  const OutputFiles::Id picture =
      outputs.AddPicture("-o", options.output_path, script_options.format);
  std::optional<OutputFiles::Id> script_file;
  if (!options.script_path.empty())
    script_file =
        outputs.AddText("--script", options.script_path, /*stdout_ok=*/true);
  outputs.Check(CommandInputs(options.stage_path, library, options.device));

  const std::string gnuplot = GnuplotOrExplain("plot");
  if (gnuplot.empty()) return kExitToolFailed;

  // The budget with its chain block, if any (the other review blocks draw
  // nothing).
  ReviewOptions review;
  review.compare_tee = false;
  review.temperature_corners = false;
  review.compensation = false;
  const BudgetOutcome outcome = ReviewStage(stage, review);
  if (!outcome.status.ok) return Refused(options, outcome.status.message);
  if (options.only.empty())
    script_options.panels = DefaultPlotPanels(outcome.budget);
  else if (options.only == "chain" && !outcome.budget.chain)
    throw Error("command line", "",
                "--only chain: the stage has no \"chain\" block");
  const Budget& budget = outcome.budget;
  const SheetData sheet = SampleSheet(stage, budget);
  if (!sheet.status.ok) return Refused(options, sheet.status.message);
  const PlotData& data = sheet.data;

  const int drawn =
      DrawPicture(gnuplot, outputs, picture, [&](const std::string& temporary) {
        PlotScriptOptions drawing = script_options;
        drawing.output_path = temporary;
        return BuildPlotScript(budget, data, drawing);
      });
  if (drawn != kExitOk) return drawn;
  if (script_file) {
    // The saved script draws to the picture's own name.
    PlotScriptOptions saved = script_options;
    saved.output_path = options.output_path;
    outputs.SetText(*script_file, BuildPlotScript(budget, data, saved));
  }
  ReportWarnings(budget.warnings);
  return outputs.Commit();
}

}  // namespace hushgain

#include "cli/compare_command.h"

#include <optional>
#include <set>
#include <vector>

#include "cli/diagnostics.h"
#include "cli/draw_picture.h"
#include "cli/exit_codes.h"
#include "cli/option_values.h"
#include "cli/output_files.h"
#include "cli/output_format.h"
#include "cli/stage_input.h"
#include "cli/text_output.h"
#include "design/opamp_comparison.h"
#include "io/device_library.h"
#include "io/error.h"
#include "io/read_file.h"
#include "io/suggest.h"
#include "report/compare_plot_script.h"
#include "report/compare_report.h"
#include "report/enum_words.h"

namespace hushgain {
namespace {

OpAmpRanking ParseOpAmpRanking(const std::string& text) {
  std::vector<std::string> words;
  for (OpAmpRanking r : {OpAmpRanking::kInputNoise, OpAmpRanking::kOffset}) {
    if (text == OpAmpRankingWord(r)) return r;
    words.push_back(OpAmpRankingWord(r));
  }
  throw OptionError("--rank", "expected input-noise or offset, got \"" + text +
                                  "\"" + DidYouMean(text, words));
}

// The op-amps to compare: every one of the folder, or the list's, each
// found as --device finds it (a name, or a part file).
std::vector<NamedOpAmp> DevicesToCompare(const DeviceLibrary& library,
                                         const CompareCommandOptions& options) {
  std::vector<NamedOpAmp> out;
  if (options.devices_list.empty()) {
    for (const auto& [name, model] : library.opamps)
      out.push_back({name, model});
    if (out.empty())
      throw Error(options.devices_dir, "",
                  "no op-amp devices in the folder; name some with "
                  "--devices-list");
    return out;
  }
  std::set<std::string> seen;
  std::size_t start = 0;
  while (start <= options.devices_list.size()) {
    std::size_t comma = options.devices_list.find(',', start);
    if (comma == std::string::npos) comma = options.devices_list.size();
    const std::string name = options.devices_list.substr(start, comma - start);
    if (name.empty())
      throw OptionError("--devices-list",
                        "expected device names or part files separated by "
                        "commas, got \"" +
                            options.devices_list + "\"");
    if (!seen.insert(name).second)
      throw OptionError("--devices-list",
                        "device \"" + name + "\" is named twice");
    out.push_back(
        {name, FindOpAmp(library, name, "command line", "--devices-list",
                         [](const std::string& path) {
                           return ReadTextFile(path);
                         })});
    start = comma + 1;
  }
  return out;
}

}  // namespace

int RunCompareCommand(const CompareCommandOptions& options) {
  const std::string format =
      ResolveOutputFormat(options.format, options.json, options.csv);
  OpAmpComparisonOptions compare;
  compare.ranking = ParseOpAmpRanking(options.rank);
  compare.review.budget.integration.relative_tolerance = options.tolerance;
  ThrowIfInvalid(compare.Validate(), {{"relative_tolerance", "--tolerance"}});

  const DeviceLibrary library = LoadDeviceLibrary(options.devices_dir);
  const Stage stage = LoadStageForCommand(options.stage_path, library, "");
  const std::vector<NamedOpAmp> devices = DevicesToCompare(library, options);

  PlotFormat plot_format = PlotFormat::kPng;
  std::string gnuplot;
  if (!options.plot_path.empty()) {
    plot_format = PictureFormat("--plot", options.plot_path);
    gnuplot = GnuplotOrExplain("compare --plot");
    if (gnuplot.empty()) return kExitToolFailed;
  }
  OutputFiles outputs;
  std::optional<OutputFiles::Id> plot_file;
  if (!options.plot_path.empty())
    plot_file = outputs.AddPicture("--plot", options.plot_path, plot_format);
  std::vector<InputFile> inputs =
      CommandInputs(options.stage_path, library, "");
  if (!options.devices_list.empty())
    for (const NamedOpAmp& d : devices)
      inputs.push_back({"the --devices-list file", d.name});
  outputs.Check(inputs);
  // The same review as `budget`, so each row is that command's budget.
  compare.review = FullReviewOptions(library, options.tolerance);

  const OpAmpComparison result = CompareOpAmps(stage, devices, compare);
  bool any = false;
  for (const OpAmpComparisonRow& row : result.rows) {
    if (row.status.ok) {
      any = true;
      ReportWarnings(row.budget.warnings, row.device);
    } else {
      ReportWarning("analysis refused: " + row.status.message, row.device);
    }
  }
  if (plot_file) {
    const int drawn = DrawPicture(
        gnuplot, outputs, *plot_file, [&](const std::string& temporary) {
          ComparePlotOptions drawing;
          drawing.format = plot_format;
          drawing.output_path = temporary;
          return BuildComparePlotScript(stage, result, drawing);
        });
    if (drawn != kExitOk) return drawn;
  }
  if (const int written = outputs.Commit(); written != kExitOk) return written;
  WriteReport(CompareReport(format, stage, result), format);
  if (!any)
    return ReportNoResult(options.stage_path,
                          "no op-amp budgets this stage (each was refused)");
  return kExitOk;
}

}  // namespace hushgain

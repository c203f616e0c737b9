#include "cli/tia_snr_command.h"

#include <optional>

#include "cli/diagnostics.h"
#include "cli/draw_picture.h"
#include "cli/exit_codes.h"
#include "cli/option_values.h"
#include "cli/output_format.h"
#include "cli/stage_input.h"
#include "cli/text_output.h"
#include "design/tia_snr.h"
#include "io/device_library.h"
#include "io/error.h"
#include "io/stage_parser.h"
#include "report/tia_snr_plot_script.h"
#include "report/tia_snr_report.h"

namespace hushgain {
namespace {

// "LOW..HIGH" as two optical powers.
void ParsePowerRange(const std::string& text, TiaSnrOptions* options) {
  const std::size_t dots = text.find("..");
  if (dots == std::string::npos)
    throw OptionError("--power-range",
                      "expected LOW..HIGH optical powers such as 1n..1m, "
                      "got \"" +
                          text + "\"");
  options->power_min_w = PositiveQuantityOption(
      "--power-range", text.substr(0, dots), Quantity::kPower);
  options->power_max_w = PositiveQuantityOption(
      "--power-range", text.substr(dots + 2), Quantity::kPower);
}

}  // namespace

int RunTiaSnrCommand(const TiaSnrCommandOptions& options) {
  const std::string format =
      ResolveOutputFormat(options.format, options.json, options.csv);
  if (options.power_range.empty())
    throw OptionError("--power-range", "required");
  TiaSnrOptions snr;
  ParsePowerRange(options.power_range, &snr);
  snr.points = options.points;
  ThrowIfInvalid(snr.Validate(), {{"power_min_w", "--power-range"},
                                  {"power_max_w", "--power-range"},
                                  {"points", "--points"}});

  const DeviceLibrary library = LoadDeviceLibrary(options.devices_dir);
  const Stage stage =
      LoadStageForCommand(options.stage_path, library, options.device);
  if (stage.topology != Topology::kTransimpedance)
    throw Error(options.stage_path, "/stage/topology",
                "tia snr needs a \"transimpedance\" stage");
  if (!(stage.photodiode.responsivity_a_per_w > 0))
    throw Error(options.stage_path, "/source/photodiode",
                "tia snr needs the photodiode's \"responsivity\" (A/W)");

  PlotFormat plot_format = PlotFormat::kPng;
  std::string gnuplot;
  if (!options.plot_path.empty()) {
    plot_format = PictureFormat("--plot", options.plot_path);
    gnuplot = GnuplotOrExplain("tia snr --plot");
    if (gnuplot.empty()) return kExitToolFailed;
  }
  OutputFiles outputs;
  std::optional<OutputFiles::Id> plot_file;
  if (!options.plot_path.empty())
    plot_file = outputs.AddPicture("--plot", options.plot_path, plot_format);
  outputs.Check(CommandInputs(options.stage_path, library, options.device));

  const TiaSnrResult result = ComputeTiaSnr(stage, snr);
  if (!result.status.ok)
    return ReportRefusal(options.stage_path, result.status.message);
  ReportWarnings(result.warnings);
  if (plot_file) {
    const int drawn = DrawPicture(
        gnuplot, outputs, *plot_file, [&](const std::string& temporary) {
          TiaSnrPlotOptions drawing;
          drawing.format = plot_format;
          drawing.output_path = temporary;
          return BuildTiaSnrPlotScript(stage, result, drawing);
        });
    if (drawn != kExitOk) return drawn;
  }
  if (const int written = outputs.Commit(); written != kExitOk) return written;
  WriteReport(TiaSnrReport(format, stage, result), format);
  return kExitOk;
}

}  // namespace hushgain

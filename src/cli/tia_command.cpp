#include "cli/tia_command.h"

#include <cstdio>
#include <iostream>

#include "base/printf.h"
#include "circuit/preferred_series.h"
#include "cli/diagnostics.h"
#include "cli/exit_codes.h"
#include "cli/option_values.h"
#include "cli/output_format.h"
#include "cli/stage_input.h"
#include "cli/text_output.h"
#include "design/tia_suggest.h"
#include "io/device_library.h"
#include "io/error.h"
#include "io/stage_parser.h"
#include "io/suggest.h"
#include "io/units.h"
#include "report/table.h"
#include "report/tia_report.h"

namespace hushgain {
namespace {

constexpr const char* kCommandLine = "command line";

}  // namespace

int RunTiaSuggestCommand(const TiaSuggestCommandOptions& options) {
  const std::string format =
      ResolveOutputFormat(options.format, options.json, options.csv);
  if (options.bandwidth.empty())
    throw Error(kCommandLine, "", "--bandwidth: required");
  const double bandwidth = PositiveQuantityOption(
      "--bandwidth", options.bandwidth, Quantity::kFrequency);
  const double lo =
      PositiveQuantityOption("--min", options.min, Quantity::kResistance);
  const double hi =
      PositiveQuantityOption("--max", options.max, Quantity::kResistance);
  if (hi < lo)
    throw Error(kCommandLine, "",
                "--max: " + options.max + " is below --min " + options.min);
  const std::optional<PreferredSeries> series = SeriesFromName(options.series);
  if (!series)
    throw Error(kCommandLine, "",
                "--series: unknown series \"" + options.series + "\"" +
                    DidYouMean(options.series, SeriesNames()));

  std::optional<PreferredSeries> cap_series;
  if (!options.cap_series.empty()) {
    cap_series = SeriesFromName(options.cap_series);
    if (!cap_series)
      throw Error(kCommandLine, "",
                  "--cap-series: unknown series \"" + options.cap_series +
                      "\"" + DidYouMean(options.cap_series, SeriesNames()));
  }
  std::optional<double> background, full_scale;
  if (!options.background.empty()) {
    background =
        QuantityOption("--background", options.background, Quantity::kCurrent);
    if (!(*background >= 0))
      throw OptionError("--background",
                        "expected a non-negative current, got \"" +
                            options.background + "\"");
  }
  if (!options.full_scale.empty())
    full_scale = PositiveQuantityOption("--full-scale", options.full_scale,
                                        Quantity::kVoltage);

  const DeviceLibrary library = LoadDeviceLibrary(options.devices_dir);
  Stage stage =
      LoadStageForCommand(options.stage_path, library, options.device);
  if (stage.topology != Topology::kTransimpedance)
    throw Error(options.stage_path, "/stage/topology",
                "tia suggest needs a \"transimpedance\" stage");
  stage.reference_hz = ReferenceFrequencyHz(stage);
  if (background) stage.photodiode.photocurrent_a = *background;
  if (full_scale) stage.full_scale_output_v = *full_scale;

  TiaSuggestOptions suggest;
  suggest.bandwidth_hz = bandwidth;
  suggest.resistors_ohm = SeriesValuesInRange(*series, lo, hi);
  suggest.rows = options.rows;
  suggest.capacitor_series = cap_series;
  suggest.parasitic_capacitance_f = stage.feedback.parasitic_capacitance_f;
  if (suggest.resistors_ohm.empty())
    throw Error(kCommandLine, "",
                "no " + options.series + " value lies between " + options.min +
                    " and " + options.max);
  ThrowIfInvalid(suggest.Validate(),
                 {{"bandwidth_hz", "--bandwidth"}, {"rows", "--rows"}});
  const TiaSuggestion s = SuggestTransimpedance(stage, suggest);
  if (!s.status.ok) return ReportRefusal(options.stage_path, s.status.message);
  WriteReport(TiaSuggestionReport(format, stage, s, bandwidth), format);
  return kExitOk;
}

}  // namespace hushgain

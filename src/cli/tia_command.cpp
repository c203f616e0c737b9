#include "cli/tia_command.h"

#include <cstdio>
#include <iostream>
#include <nlohmann/json.hpp>

#include "budget/tia_suggest.h"
#include "circuit/preferred_series.h"
#include "cli/exit_codes.h"
#include "io/device_library.h"
#include "io/error.h"
#include "io/stage_parser.h"
#include "io/suggest.h"
#include "io/units.h"
#include "report/printf.h"
#include "report/table.h"

namespace hushgain {
namespace {

constexpr const char* kCommandLine = "command line";

double ParseOption(const std::string& flag, const std::string& text,
                   Quantity quantity) {
  std::string why;
  std::optional<double> v = ParseQuantity(text, quantity, &why);
  if (!v || !(*v > 0))
    throw Error(kCommandLine, "",
                flag + ": expected a positive " +
                    std::string(QuantityName(quantity)).substr(2) + ", got \"" +
                    text + "\"" + (why.empty() ? "" : " (" + why + ")"));
  return *v;
}

std::string RenderTable(const Stage& stage, const TiaSuggestion& s,
                        double target_hz) {
  const char* per_rthz = "/\xE2\x88\x9AHz";
  Table t;
  t.header = {
      "R_f",
      "C_f",
      "-3 dB",
      "flat limit",
      "margin",
      "peaking",
      std::string("input noise @ ") + FormatEng(*stage.reference_hz, "Hz", 3),
      "input noise rms",
      "NEP",
      ""};
  t.align.assign(t.header.size(), Table::Align::kRight);
  t.align.back() = Table::Align::kLeft;
  for (std::size_t i = 0; i < s.rows.size(); ++i) {
    const TiaCandidate& r = s.rows[i];
    std::string note = static_cast<int>(i) == s.best
                           ? "largest R_f that meets the target"
                       : r.meets_target ? ""
                                        : "misses the target (flat C_f)";
    t.AddRow(
        {FormatEng(r.rf_ohm, "\xCE\xA9", 3), FormatEng(r.cf_f, "F"),
         FormatEng(r.bandwidth_3db_hz, "Hz"),
         FormatEng(r.butterworth_bandwidth_hz, "Hz"),
         Printf("%.1f\xC2\xB0", r.phase_margin_deg),
         Printf("%.2f dB", r.peaking_db),
         FormatEng(r.input_density_a_per_rthz, std::string("A") + per_rthz),
         FormatEng(r.input_rms_a, "A"),
         r.nep_w_per_rthz > 0
             ? FormatEng(r.nep_w_per_rthz, std::string("W") + per_rthz)
             : "-",
         note});
  }
  std::string out = stage.name + "\n";
  out += "  transimpedance proposals for a -3 dB bandwidth of " +
         FormatEng(target_hz, "Hz") +
         " (C_f set to put the -3 dB point on the target; \"flat limit\" is "
         "the bandwidth of the "
         "Butterworth C_f)\n";
  out += "  textbook estimate of the largest R_f: GBW / (2 pi C f^2) = " +
         FormatEng(s.largest_rf_estimate_ohm, "\xCE\xA9") + "\n\n";
  out += RenderText(t);
  out += "  input noise over " + FormatEng(stage.band_low_hz, "Hz") + " to " +
         FormatEng(stage.band_high_hz, "Hz") + "\n";
  return out;
}

std::string RenderJson(const TiaSuggestion& s, double target_hz) {
  nlohmann::json rows = nlohmann::json::array();
  for (const TiaCandidate& r : s.rows)
    rows.push_back(
        {{"rf_ohm", r.rf_ohm},
         {"cf_F", r.cf_f},
         {"meets_target", r.meets_target},
         {"bandwidth_3db_Hz", r.bandwidth_3db_hz},
         {"butterworth_bandwidth_Hz", r.butterworth_bandwidth_hz},
         {"phase_margin_deg", r.phase_margin_deg},
         {"peaking_dB", r.peaking_db},
         {"output_rms_V", r.output_rms_v},
         {"input_referred_rms_A", r.input_rms_a},
         {"input_referred_density_A_per_rtHz", r.input_density_a_per_rthz},
         {"nep_W_per_rtHz", r.nep_w_per_rthz}});
  nlohmann::json out = {{"bandwidth_target_Hz", target_hz},
                        {"largest_rf_estimate_ohm", s.largest_rf_estimate_ohm},
                        {"best", s.best},
                        {"rows", rows}};
  return out.dump(2) + "\n";
}

}  // namespace

int RunTiaSuggestCommand(const TiaSuggestCommandOptions& options) {
  if (options.bandwidth.empty())
    throw Error(kCommandLine, "", "--bandwidth: required");
  const double bandwidth =
      ParseOption("--bandwidth", options.bandwidth, Quantity::kFrequency);
  const double lo = ParseOption("--min", options.min, Quantity::kResistance);
  const double hi = ParseOption("--max", options.max, Quantity::kResistance);
  if (hi < lo)
    throw Error(kCommandLine, "",
                "--max: " + options.max + " is below --min " + options.min);
  const std::optional<PreferredSeries> series = SeriesFromName(options.series);
  if (!series)
    throw Error(kCommandLine, "",
                "--series: unknown series \"" + options.series + "\"" +
                    DidYouMean(options.series, SeriesNames()));
  if (options.rows < 1)
    throw Error(
        kCommandLine, "",
        "--rows: expected at least 1, got " + std::to_string(options.rows));

  const DeviceLibrary library = LoadDeviceLibrary(options.devices_dir);
  Stage stage = LoadStageFile(options.stage_path, library);
  if (stage.topology != Topology::kTransimpedance)
    throw Error(options.stage_path, "/stage/topology",
                "tia suggest needs a \"transimpedance\" stage");
  stage.reference_hz = ReferenceFrequencyHz(stage);

  TiaSuggestOptions suggest;
  suggest.bandwidth_hz = bandwidth;
  suggest.resistors_ohm = SeriesValuesInRange(*series, lo, hi);
  suggest.rows = options.rows;
  if (suggest.resistors_ohm.empty())
    throw Error(kCommandLine, "",
                "no " + options.series + " value lies between " + options.min +
                    " and " + options.max);
  const TiaSuggestion s = SuggestTransimpedance(stage, suggest);
  if (!s.status.ok) {
    std::cerr << "error: " << options.stage_path << ": " << s.status.message
              << "\n";
    return kExitAnalysisRefused;
  }
  std::cout << (options.json ? RenderJson(s, bandwidth)
                             : RenderTable(stage, s, bandwidth))
            << std::flush;
  return kExitOk;
}

}  // namespace hushgain

#include "report/tia_snr_report.h"

#include <cmath>
#include <nlohmann/json.hpp>

#include "base/printf.h"
#include "io/units.h"
#include "report/csv_report.h"
#include "report/table.h"
#include "report/text_escape.h"

namespace hushgain {
namespace {

double Db(double ratio) { return 20.0 * std::log10(ratio); }

Table DisplayTable(const TiaSnrResult& r) {
  Table t;
  t.header = {"optical power", "signal current", "input noise rms", "SNR",
              "SNR dB",        "shot share",     "DC output",       ""};
  t.align.assign(t.header.size(), Table::Align::kRight);
  t.align.back() = Table::Align::kLeft;
  for (const TiaSnrPoint& p : r.points)
    t.AddRow({FormatEng(p.power_w, "W"), FormatEng(p.signal_current_a, "A"),
              FormatEng(p.input_rms_a, "A"), Printf("%.4g", p.snr),
              Printf("%.1f", Db(p.snr)),
              Printf("%.1f %%", 100.0 * p.shot_share),
              FormatEng(p.dc_output_v, "V"), p.saturated ? "saturated" : ""});
  return t;
}

Table CsvTable(const TiaSnrResult& r) {
  Table t;
  t.header = {"optical_power_W",
              "signal_current_A",
              "input_referred_rms_A",
              "output_rms_V",
              "snr",
              "snr_dB",
              "shot_share",
              "dc_output_V",
              "saturated"};
  for (const TiaSnrPoint& p : r.points)
    t.AddRow({CsvNumber(p.power_w), CsvNumber(p.signal_current_a),
              CsvNumber(p.input_rms_a), CsvNumber(p.output_rms_v),
              CsvNumber(p.snr), CsvNumber(Db(p.snr)), CsvNumber(p.shot_share),
              CsvNumber(p.dc_output_v), p.saturated ? "true" : "false"});
  return t;
}

std::string LightLine(const TiaSnrResult& r) {
  return "responsivity " + Printf("%.3g A/W", r.responsivity_a_per_w) +
         ", background photocurrent " + FormatEng(r.background_current_a, "A") +
         " (signal light adds R x P; its shot noise 2 q I grows with it)";
}

std::string NepLine(const TiaSnrResult& r) {
  return "NEP over " + FormatEng(r.band_low_hz, "Hz") + " to " +
         FormatEng(r.band_high_hz, "Hz") + ": " + FormatEng(r.nep_w, "W") +
         " (SNR = 1; input noise floor without signal light " +
         FormatEng(r.noise_floor_a, "A") + " rms)";
}

std::string SaturationLine(const TiaSnrResult& r) {
  const std::string limit = r.limit_name + " " + FormatEng(r.limit_v, "V");
  if (r.saturation_power_w > 0)
    return "saturates above " + FormatEng(r.saturation_power_w, "W") +
           " (DC output plus worst-case offset " +
           FormatEng(r.offset_worst_case_v, "V") + " reach the " + limit + ")";
  return "saturated without signal light (" + limit + ")";
}

std::string Json(const TiaSnrResult& r) {
  nlohmann::json points = nlohmann::json::array();
  for (const TiaSnrPoint& p : r.points)
    points.push_back({{"optical_power_W", p.power_w},
                      {"signal_current_A", p.signal_current_a},
                      {"input_referred_rms_A", p.input_rms_a},
                      {"output_rms_V", p.output_rms_v},
                      {"snr", p.snr},
                      {"snr_dB", Db(p.snr)},
                      {"shot_share", p.shot_share},
                      {"dc_output_V", p.dc_output_v},
                      {"saturated", p.saturated}});
  nlohmann::json out = {
      {"responsivity_A_per_W", r.responsivity_a_per_w},
      {"background_photocurrent_A", r.background_current_a},
      {"band_Hz", {{"low", r.band_low_hz}, {"high", r.band_high_hz}}},
      {"noise_floor_A", r.noise_floor_a},
      {"nep_W", r.nep_w},
      {"dc_transimpedance_ohm", r.dc_transimpedance_ohm},
      {"offset_worst_case_V", r.offset_worst_case_v},
      {"limit_V", r.limit_v},
      {"limit", r.limit_name},
      {"saturation_power_W", r.saturation_power_w},
      {"points", points},
      {"warnings", r.warnings}};
  return out.dump(2) + "\n";
}

}  // namespace

std::string TiaSnrReport(const std::string& format, const Stage& stage,
                         const TiaSnrResult& r) {
  if (format == "json") return Json(r);
  if (format == "csv") return RenderCsv(CsvTable(r));
  const Table table = DisplayTable(r);
  std::string warnings;
  if (format == "markdown") {
    for (const std::string& w : r.warnings)
      warnings += "\n**warning:** " + EscapeMarkdown(w) + "\n";
    return "## " + EscapeMarkdown(stage.name) +
           ": SNR against optical power\n\n" + "- " +
           EscapeMarkdown(LightLine(r)) + "\n- " + EscapeMarkdown(NepLine(r)) +
           "\n- " + EscapeMarkdown(SaturationLine(r)) + "\n\n" +
           RenderMarkdown(table) + warnings;
  }
  for (const std::string& w : r.warnings) warnings += "\nwarning: " + w + "\n";
  return EscapeText(stage.name) +
         "\n  SNR against optical power over the band: signal " +
         "current R x P against the input noise rms\n  " + LightLine(r) +
         "\n  " + NepLine(r) + "\n  " + SaturationLine(r) + "\n\n" +
         RenderText(table) + warnings;
}

}  // namespace hushgain

#include "report/tia_report.h"

#include <nlohmann/json.hpp>

#include "base/printf.h"
#include "io/units.h"
#include "report/csv_report.h"
#include "report/enum_words.h"
#include "report/table.h"
#include "report/text_escape.h"
#include "report/unit_symbols.h"

namespace hushgain {
namespace {

std::string Note(const TiaSuggestion& s, std::size_t i) {
  const TiaCandidate& r = s.rows[i];
  if (static_cast<int>(i) == s.best)
    return std::string("largest R_f that meets the target (") +
           TiaLimitWord(s.limited_by) + " binds)";
  if (!r.fits_headroom) return "beyond the headroom";
  return r.meets_target ? "" : "misses the target (flat C_f)";
}

bool WithSeries(const TiaSuggestion& s) {
  for (const TiaCandidate& r : s.rows)
    if (r.capacitor_part_f > 0 || r.parasitic_alone) return true;
  return false;
}

std::string Part(const TiaCandidate& r) {
  return r.parasitic_alone ? std::string("parasitic alone")
                           : FormatEng(r.capacitor_part_f, "F");
}

// The display table: one row per proposal, units in the cells.
Table DisplayTable(const Stage& stage, const TiaSuggestion& s) {
  Table t;
  const bool parts = WithSeries(s);
  t.header = {
      "R_f",
      "C_f",
      "part",
      "-3 dB",
      "flat limit",
      "margin",
      "peaking",
      std::string("input noise @ ") + FormatEng(*stage.reference_hz, "Hz", 3),
      "input noise rms",
      "NEP",
      "DC out",
      "headroom",
      ""};
  t.align.assign(t.header.size(), Table::Align::kRight);
  t.align.back() = Table::Align::kLeft;
  for (std::size_t i = 0; i < s.rows.size(); ++i) {
    const TiaCandidate& r = s.rows[i];
    t.AddRow(
        {FormatEng(r.rf_ohm, "\xCE\xA9", 3), FormatEng(r.cf_f, "F"),
         parts ? Part(r) : std::string("-"),
         r.bandwidth_3db_hz > 0 ? FormatEng(r.bandwidth_3db_hz, "Hz")
                                : std::string("not found"),
         r.butterworth_bandwidth_hz > 0
             ? FormatEng(r.butterworth_bandwidth_hz, "Hz")
             : std::string("not found"),
         Printf("%.1f\xC2\xB0", r.phase_margin_deg),
         Printf("%.2f dB", r.peaking_db),
         FormatEng(r.input_density_a_per_rthz, std::string("A") + kPerRtHz),
         FormatEng(r.input_rms_a, "A"),
         r.nep_w_per_rthz > 0
             ? FormatEng(r.nep_w_per_rthz, std::string("W") + kPerRtHz)
             : "-",
         FormatEng(r.dc_output_v, "V"),
         Printf("%.0f %%", 100.0 * r.headroom_used_v / s.headroom_limit_v),
         Note(s, i)});
  }
  if (!parts) {  // no capacitor series: no part column
    t.header.erase(t.header.begin() + 2);
    t.align.erase(t.align.begin() + 2);
    for (auto& row : t.rows) row.erase(row.begin() + 2);
  }
  return t;
}

// The same rows as SI numbers, for CSV.
Table CsvTable(const TiaSuggestion& s) {
  Table t;
  t.header = {"rf_ohm",
              "cf_F",
              "bandwidth_3db_Hz",
              "butterworth_bandwidth_Hz",
              "phase_margin_deg",
              "peaking_dB",
              "input_referred_density_A_per_rtHz",
              "input_referred_rms_A",
              "nep_W_per_rtHz",
              "output_rms_V",
              "meets_target",
              "best",
              "capacitor_part_F",
              "parasitic_alone",
              "dc_output_V",
              "headroom_used_V",
              "fits_headroom"};
  for (std::size_t i = 0; i < s.rows.size(); ++i) {
    const TiaCandidate& r = s.rows[i];
    t.AddRow(
        {CsvNumber(r.rf_ohm), CsvNumber(r.cf_f), CsvNumber(r.bandwidth_3db_hz),
         CsvNumber(r.butterworth_bandwidth_hz), CsvNumber(r.phase_margin_deg),
         CsvNumber(r.peaking_db), CsvNumber(r.input_density_a_per_rthz),
         CsvNumber(r.input_rms_a),
         r.nep_w_per_rthz > 0 ? CsvNumber(r.nep_w_per_rthz) : "",
         CsvNumber(r.output_rms_v), r.meets_target ? "true" : "false",
         static_cast<int>(i) == s.best ? "true" : "false",
         CsvNumber(r.capacitor_part_f), r.parasitic_alone ? "true" : "false",
         CsvNumber(r.dc_output_v), CsvNumber(r.headroom_used_v),
         r.fits_headroom ? "true" : "false"});
  }
  return t;
}

std::string TargetLine(double target_hz) {
  return "transimpedance proposals for a -3 dB bandwidth of " +
         FormatEng(target_hz, "Hz") +
         " (C_f set to put the -3 dB point on the target; \"flat limit\" is "
         "the bandwidth of the Butterworth C_f)";
}

std::string EstimateLine(const TiaSuggestion& s) {
  return "textbook estimate of the largest R_f: GBW / (2 pi C f^2) = " +
         FormatEng(s.largest_rf_estimate_ohm, "\xCE\xA9");
}

std::string BandLine(const Stage& stage) {
  return "input noise over " + FormatEng(stage.band_low_hz, "Hz") + " to " +
         FormatEng(stage.band_high_hz, "Hz");
}

std::string HeadroomLine(const TiaSuggestion& s) {
  return "headroom: the DC output of " +
         FormatEng(s.background_current_a, "A") +
         " of background photocurrent and dark current plus the worst-case "
         "offset, against the " +
         s.headroom_limit_name + " " + FormatEng(s.headroom_limit_v, "V");
}

std::string Json(const TiaSuggestion& s, double target_hz) {
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
         {"nep_W_per_rtHz", r.nep_w_per_rthz},
         {"capacitor_part_F", r.capacitor_part_f},
         {"parasitic_alone", r.parasitic_alone},
         {"dc_output_V", r.dc_output_v},
         {"headroom_used_V", r.headroom_used_v},
         {"fits_headroom", r.fits_headroom}});
  nlohmann::json out = {{"bandwidth_target_Hz", target_hz},
                        {"largest_rf_estimate_ohm", s.largest_rf_estimate_ohm},
                        {"best", s.best},
                        {"limited_by", TiaLimitWord(s.limited_by)},
                        {"headroom_limit_V", s.headroom_limit_v},
                        {"headroom_limit", s.headroom_limit_name},
                        {"background_current_A", s.background_current_a},
                        {"rows", rows}};
  return out.dump(2) + "\n";
}

}  // namespace

std::string TiaSuggestionReport(const std::string& format, const Stage& stage,
                                const TiaSuggestion& s, double target_hz) {
  if (format == "json") return Json(s, target_hz);
  if (format == "csv") return RenderCsv(CsvTable(s));
  const Table table = DisplayTable(stage, s);
  if (format == "markdown")
    return "## " + EscapeMarkdown(stage.name) + "\n\n" +
           EscapeMarkdown(TargetLine(target_hz)) + "; " +
           EscapeMarkdown(EstimateLine(s)) + ".\n\n" + RenderMarkdown(table) +
           "\n" + EscapeMarkdown(BandLine(stage)) + "; " +
           EscapeMarkdown(HeadroomLine(s)) + ".\n";
  return EscapeText(stage.name) + "\n  " + TargetLine(target_hz) + "\n  " +
         EstimateLine(s) + "\n\n" + RenderText(table) + "  " + BandLine(stage) +
         "\n  " + HeadroomLine(s) + "\n";
}

}  // namespace hushgain

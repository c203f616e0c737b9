#include "report/spread_report.h"

#include <cmath>
#include <cstdio>
#include <nlohmann/json.hpp>
#include <optional>
#include <vector>

#include "base/physical_constants.h"
#include "base/printf.h"
#include "io/units.h"
#include "report/csv_report.h"
#include "report/enum_words.h"
#include "report/table.h"
#include "report/text_escape.h"

namespace hushgain {
namespace {

std::string Ppm(double relative) { return Printf("%.1f ppm", relative * 1e6); }

std::string YieldText(const std::optional<double>& y) {
  return y ? Printf("%.3f %%", 100.0 * *y) : std::string("-");
}

}  // namespace

namespace {

// The header lines shared by text and Markdown, without indentation.
std::vector<std::string> HeaderLines(const SpreadRun& run, std::uint64_t seed) {
  const Budget& b = run.nominal;
  const std::string gain_unit = b.input_unit == "A" ? "V/A" : "V/V";
  return {
      "Monte Carlo: " + std::to_string(run.size()) + " samples, seed " +
          std::to_string(seed),
      "nominal: " +
          (run.gain_hz > 0 ? "|gain| at " + FormatEng(run.gain_hz, "Hz") + " "
                           : std::string("DC gain ")) +
          Printf("%.6g", run.nominal_gain) + " " + gain_unit +
          ", output noise " + FormatEng(b.output_rms_v, "V") +
          " rms, offset worst case " + FormatEng(b.offset.worst_case_v, "V") +
          " at " + Printf("%.2f", b.temperature_k - kZeroCelsiusK) +
          " \xC2\xB0"
          "C",
      std::string("draws: resistors ") +
          (run.capacitor_names.empty() ? "" : "and capacitors ") +
          "uniform within their tolerance; Vos and Ios " +
          (run.gaussian_offsets ? "Gaussian (the device values as sigma)"
                                : "uniform within the device values") +
          "; Vos drift uniform within its value; temperature uniform over the "
          "range"};
}

Table DistributionTable(const SpreadSummary& s) {
  Table t;
  t.header = {"figure", "mean", "sigma", "0.135 %", "99.865 %", "min", "max"};
  t.align = {Table::Align::kLeft,  Table::Align::kRight, Table::Align::kRight,
             Table::Align::kRight, Table::Align::kRight, Table::Align::kRight,
             Table::Align::kRight};
  t.AddRow({"gain error", Ppm(s.gain_error.mean), Ppm(s.gain_error.sigma),
            Ppm(s.gain_error.p_low), Ppm(s.gain_error.p_high),
            Ppm(s.gain_error.min), Ppm(s.gain_error.max)});
  t.AddRow({"output offset", FormatEng(s.offset.mean, "V"),
            FormatEng(s.offset.sigma, "V"), FormatEng(s.offset.p_low, "V"),
            FormatEng(s.offset.p_high, "V"), FormatEng(s.offset.min, "V"),
            FormatEng(s.offset.max, "V")});
  t.AddRow({"output noise rms", FormatEng(s.noise.mean, "V"),
            FormatEng(s.noise.sigma, "V"), FormatEng(s.noise.p_low, "V"),
            FormatEng(s.noise.p_high, "V"), FormatEng(s.noise.min, "V"),
            FormatEng(s.noise.max, "V")});
  return t;
}

const char* kPercentileNote =
    "(the percentiles are the +-3 sigma points of a Gaussian; linear "
    "interpolation between samples)";

// "" when no sample is flagged; else how many cannot work as asked, by
// flag (budget/headroom.h on each sample).
std::string FlaggedLine(const SpreadRun& run) {
  long flagged = 0;
  long by_kind[kStageProblemCount] = {};
  for (const std::uint8_t problems : run.figures.problems) {
    if (problems != 0) ++flagged;
    for (int i = 0; i < kStageProblemCount; ++i)
      if (problems & StageProblemBit(static_cast<StageProblem>(i)))
        ++by_kind[i];
  }
  if (flagged == 0) return "";
  std::string kinds;
  for (int i = 0; i < kStageProblemCount; ++i)
    if (by_kind[i] > 0)
      kinds += (kinds.empty() ? "" : ", ") +
               std::string(StageProblemWord(static_cast<StageProblem>(i))) +
               " " + std::to_string(by_kind[i]);
  return "flagged: " + std::to_string(flagged) + " of " +
         std::to_string(run.size()) + " samples cannot work as asked (" +
         kinds + "; the flags column of --csv names each)";
}

std::string WorstCaseLine(const SpreadRun& run) {
  return "worst-case offset over the tolerance corners and the range: "
         "\xC2\xB1" +
         FormatEng(run.worst_case_offset_v, "V") +
         (run.gaussian_offsets
              ? " (Vos and Ios at their 1-sigma values: Gaussian "
                "samples may go beyond it)"
              : " (bounds every sample: Vos and Ios are uniform)");
}

// Empty (no rows) without limits.
Table YieldTable(const SpreadSummary& s, const SpreadLimits& limits) {
  Table y;
  y.header = {"limit", "value", "inside"};
  y.align = {Table::Align::kLeft, Table::Align::kRight, Table::Align::kRight};
  if (!s.yield.all) return y;
  if (limits.gain_error)
    y.AddRow({"|gain error|", Printf("%.4g %%", 100.0 * *limits.gain_error),
              YieldText(s.yield.gain_error)});
  if (limits.offset_v)
    y.AddRow({"|output offset|", FormatEng(*limits.offset_v, "V"),
              YieldText(s.yield.offset)});
  if (limits.noise_v)
    y.AddRow({"output noise rms", FormatEng(*limits.noise_v, "V"),
              YieldText(s.yield.noise)});
  y.AddRule();
  y.AddRow({"all limits", "", YieldText(s.yield.all)});
  return y;
}

std::string Text(const SpreadRun& run, const SpreadSummary& s,
                 const SpreadLimits& limits, std::uint64_t seed) {
  std::string out = EscapeText(run.nominal.stage_name) + "\n";
  for (const std::string& line : HeaderLines(run, seed))
    out += "  " + line + "\n";
  out += "\n" + RenderText(DistributionTable(s));
  out += std::string("  ") + kPercentileNote + "\n";
  if (run.worst_case_offset_v > 0) out += "  " + WorstCaseLine(run) + "\n";
  if (const std::string f = FlaggedLine(run); !f.empty())
    out += "  " + f + "\n";
  const Table yield = YieldTable(s, limits);
  if (!yield.rows.empty()) out += "\nYield\n" + RenderText(yield);
  return out;
}

std::string Markdown(const SpreadRun& run, const SpreadSummary& s,
                     const SpreadLimits& limits, std::uint64_t seed) {
  std::string out =
      "## Monte Carlo: " + EscapeMarkdown(run.nominal.stage_name) + "\n\n";
  for (const std::string& line : HeaderLines(run, seed))
    out += "- " + EscapeMarkdown(line) + "\n";
  out += "\n" + RenderMarkdown(DistributionTable(s)) + "\n" +
         EscapeMarkdown(kPercentileNote) + "\n";
  if (run.worst_case_offset_v > 0)
    out += "\n" + EscapeMarkdown(WorstCaseLine(run)) + "\n";
  if (const std::string f = FlaggedLine(run); !f.empty())
    out += "\n" + EscapeMarkdown(f) + "\n";
  const Table yield = YieldTable(s, limits);
  if (!yield.rows.empty()) out += "\n### Yield\n\n" + RenderMarkdown(yield);
  return out;
}

// One record per figure, SI numbers (the gain error as a ratio); the limit
// and its yield empty when no limit was given.
std::string Csv(const SpreadSummary& s, const SpreadLimits& limits) {
  Table t;
  t.header = {
      "figure", "mean",  "sigma", "p_0.135_percent", "p_99.865_percent", "min",
      "max",    "limit", "yield"};
  const auto row = [&t](const std::string& name, const Distribution& d,
                        const std::optional<double>& limit,
                        const std::optional<double>& yield) {
    t.AddRow({name, CsvNumber(d.mean), CsvNumber(d.sigma), CsvNumber(d.p_low),
              CsvNumber(d.p_high), CsvNumber(d.min), CsvNumber(d.max),
              limit ? CsvNumber(*limit) : "", yield ? CsvNumber(*yield) : ""});
  };
  row("gain_error", s.gain_error, limits.gain_error, s.yield.gain_error);
  row("offset_V", s.offset, limits.offset_v, s.yield.offset);
  row("noise_rms_V", s.noise, limits.noise_v, s.yield.noise);
  return RenderCsv(t);
}

nlohmann::json DistributionJson(const Distribution& d) {
  return {{"mean", d.mean},     {"sigma", d.sigma}, {"p_low", d.p_low},
          {"p_high", d.p_high}, {"min", d.min},     {"max", d.max}};
}

std::string Json(const SpreadRun& run, const SpreadSummary& s,
                 const SpreadLimits& limits, std::uint64_t seed) {
  const auto optional = [](const std::optional<double>& v) {
    return v ? nlohmann::json(*v) : nlohmann::json(nullptr);
  };
  nlohmann::json out = {
      {"stage", run.nominal.stage_name},
      {"samples", run.size()},
      {"seed", seed},
      {"gaussian_offsets", run.gaussian_offsets},
      {"percentiles", {kLowPercentile, kHighPercentile}},
      {"nominal",
       {{"gain", run.nominal_gain},
        {"gain_Hz", run.gain_hz},
        {"output_rms_V", run.nominal.output_rms_v},
        {"offset_worst_case_V", run.nominal.offset.worst_case_v}}},
      {"gain_error", DistributionJson(s.gain_error)},
      {"offset_V", DistributionJson(s.offset)},
      {"noise_rms_V", DistributionJson(s.noise)},
      {"worst_case_offset_V", run.worst_case_offset_v},
      {"limits",
       {{"gain_error", optional(limits.gain_error)},
        {"offset_V", optional(limits.offset_v)},
        {"noise_rms_V", optional(limits.noise_v)}}},
      {"yield",
       {{"gain_error", optional(s.yield.gain_error)},
        {"offset", optional(s.yield.offset)},
        {"noise", optional(s.yield.noise)},
        {"all", optional(s.yield.all)}}}};
  // How many samples each flag of the headroom check marks.
  nlohmann::json flagged = nlohmann::json::object();
  long any = 0;
  for (const std::uint8_t problems : run.figures.problems) any += problems != 0;
  for (int i = 0; i < kStageProblemCount; ++i) {
    long n = 0;
    for (const std::uint8_t problems : run.figures.problems)
      n += (problems & StageProblemBit(static_cast<StageProblem>(i))) != 0;
    if (n > 0) flagged[StageProblemWord(static_cast<StageProblem>(i))] = n;
  }
  out["flagged_samples"] = any;
  out["flags"] = flagged;
  return out.dump(2) + "\n";
}

}  // namespace

std::string SpreadReport(const std::string& format, const SpreadRun& run,
                         const SpreadSummary& summary,
                         const SpreadLimits& limits, std::uint64_t seed) {
  if (format == "json") return Json(run, summary, limits, seed);
  if (format == "csv") return Csv(summary, limits);
  if (format == "markdown") return Markdown(run, summary, limits, seed);
  return Text(run, summary, limits, seed);
}

std::string SpreadCsvHeader(const SpreadRun& run) {
  std::string out =
      "index,temperature_C,vos_V,ios_A,gain,gain_error,offset_V,noise_rms_V,"
      "flags";
  for (const std::string& name : run.resistor_names) out += "," + name + "_ohm";
  for (const std::string& name : run.capacitor_names) out += "," + name + "_F";
  return out + "\n";
}

std::string SpreadCsvRows(const SpreadRun& run, std::size_t begin,
                          std::size_t end) {
  std::string out;
  std::vector<double> ohms, farads;
  char buf[64];
  for (std::size_t i = begin; i < end && i < run.size(); ++i) {
    const SpreadSample s = run.Sample(i, &ohms, &farads);
    out += std::to_string(i);
    for (double v : {s.temperature_k - kZeroCelsiusK, s.vos_v, s.ios_a, s.gain,
                     s.gain_error, s.offset_v, s.noise_rms_v}) {
      std::snprintf(buf, sizeof buf, ",%.17g", v);
      out += buf;
    }
    out += "," + StageProblemFlags(s.problems);
    for (double v : ohms) {
      std::snprintf(buf, sizeof buf, ",%.17g", v);
      out += buf;
    }
    for (double v : farads) {
      std::snprintf(buf, sizeof buf, ",%.17g", v);
      out += buf;
    }
    out += "\n";
  }
  return out;
}

std::string SpreadToCsv(const SpreadRun& run) {
  return SpreadCsvHeader(run) + SpreadCsvRows(run, 0, run.size());
}

}  // namespace hushgain

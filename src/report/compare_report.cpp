#include "report/compare_report.h"

#include <functional>
#include <nlohmann/json.hpp>
#include <set>
#include <vector>

#include "base/printf.h"
#include "budget/budget.h"
#include "io/units.h"
#include "report/budget_tables.h"
#include "report/csv_report.h"
#include "report/enum_words.h"
#include "report/table.h"
#include "report/text_escape.h"
#include "report/unit_symbols.h"

namespace hushgain {
namespace {

constexpr const char* kDegree = "\xC2\xB0";  // "°"
constexpr const char* kNone = "-";

using Row = OpAmpComparisonRow;

// One column: its header and cell in each style; an empty header leaves the
// column out of that style.
struct CompareColumn {
  std::string display_header;
  std::string csv_header;
  std::function<std::string(const Row&)> display;
  std::function<std::string(const Row&)> csv;
  Table::Align align = Table::Align::kRight;
};

enum class Cells { kDisplay, kCsv };

Table Build(const std::vector<CompareColumn>& columns,
            const std::vector<Row>& rows, Cells cells) {
  const bool display = cells == Cells::kDisplay;
  Table t;
  std::vector<const CompareColumn*> shown;
  for (const CompareColumn& c : columns) {
    const std::string& header = display ? c.display_header : c.csv_header;
    if (header.empty()) continue;
    shown.push_back(&c);
    t.header.push_back(header);
    t.align.push_back(c.align);
  }
  for (const Row& r : rows) {
    std::vector<std::string> cells_of_row;
    for (const CompareColumn* c : shown)
      cells_of_row.push_back(display ? c->display(r) : c->csv(r));
    t.AddRow(std::move(cells_of_row));
  }
  return t;
}

// A figure of a budgeted row, "-" (display) or "" (CSV) for a refused one.
std::function<std::string(const Row&)> Shown(
    std::function<std::string(const Row&)> cell, const char* refused) {
  return [cell, refused](const Row& r) {
    return r.status.ok ? cell(r) : std::string(refused);
  };
}
std::function<std::string(const Row&)> Display(
    std::function<std::string(const Row&)> cell) {
  return Shown(std::move(cell), kNone);
}
std::function<std::string(const Row&)> Csv(
    std::function<double(const Row&)> v) {
  return Shown([v](const Row& r) { return CsvNumber(v(r)); }, "");
}

std::string DominantText(const Row& r) {
  if (r.budget.contributors.empty()) return kNone;
  const Contributor& c = r.budget.contributors.front();
  return c.name + " " + FormatShare(c.share);
}

std::string PhaseMarginText(const Budget& b) {
  if (!b.loop.crossover_found) return "no crossover";
  return Printf("%.1f", b.loop.phase_margin_deg) + kDegree;
}

std::string BandwidthCell(const Budget& b) {
  return b.bandwidth_3db_hz > 0 ? FormatEng(b.bandwidth_3db_hz, "Hz")
                                : std::string("not found");
}

// The columns of the ranking table (display) and of the CSV record.
std::vector<CompareColumn> RankingColumns(const OpAmpComparison& c) {
  const std::string unit = c.input_unit;
  const std::string f_ref = FormatEng(c.reference_hz, "Hz");
  std::vector<CompareColumn> cols;
  cols.push_back({"rank", "rank",
                  [](const Row& r) {
                    return r.rank > 0 ? std::to_string(r.rank)
                                      : std::string(kNone);
                  },
                  [](const Row& r) {
                    return r.rank > 0 ? std::to_string(r.rank) : std::string();
                  }});
  cols.push_back({"device", "device", [](const Row& r) { return r.device; },
                  [](const Row& r) { return r.device; }, Table::Align::kLeft});
  cols.push_back({"class", "class", [](const Row& r) { return r.class_name; },
                  [](const Row& r) { return r.class_name; },
                  Table::Align::kLeft});
  cols.push_back({"input noise rms", "input_referred_rms_" + unit,
                  Display([unit](const Row& r) {
                    return FormatEng(r.budget.input_rms, unit);
                  }),
                  Csv([](const Row& r) { return r.budget.input_rms; })});
  cols.push_back(
      {"at " + f_ref, "input_referred_density_" + unit + "_per_rtHz",
       Display([unit](const Row& r) {
         return FormatEng(r.budget.input_density_ref_per_rthz, unit + kPerRtHz);
       }),
       Csv([](const Row& r) { return r.budget.input_density_ref_per_rthz; })});
  cols.push_back({"", "output_rms_V", nullptr,
                  Csv([](const Row& r) { return r.budget.output_rms_v; })});
  cols.push_back({"dominant", "dominant", Display(DominantText),
                  Shown(
                      [](const Row& r) {
                        return r.budget.contributors.empty()
                                   ? std::string()
                                   : r.budget.contributors.front().name;
                      },
                      ""),
                  Table::Align::kLeft});
  cols.push_back({"", "dominant_share", nullptr, Csv([](const Row& r) {
                    return r.budget.contributors.empty()
                               ? 0.0
                               : r.budget.contributors.front().share;
                  })});
  cols.push_back(
      {"offset (worst)", "offset_worst_case_V", Display([](const Row& r) {
         return FormatEng(r.budget.offset.worst_case_v, "V");
       }),
       Csv([](const Row& r) { return r.budget.offset.worst_case_v; })});
  cols.push_back({"phase margin", "phase_margin_deg", Display([](const Row& r) {
                    return PhaseMarginText(r.budget);
                  }),
                  Shown(
                      [](const Row& r) {
                        return r.budget.loop.crossover_found
                                   ? CsvNumber(r.budget.loop.phase_margin_deg)
                                   : std::string();
                      },
                      "")});
  cols.push_back({"-3 dB", "bandwidth_3db_Hz",
                  Display([](const Row& r) { return BandwidthCell(r.budget); }),
                  Csv([](const Row& r) { return r.budget.bandwidth_3db_hz; })});
  cols.push_back(
      {"verdict", "verdict", [](const Row& r) { return OpAmpVerdict(r); },
       [](const Row& r) { return OpAmpVerdict(r); }, Table::Align::kLeft});
  return cols;
}

// The columns of the "why" table (display) and the rest of the CSV record.
std::vector<CompareColumn> WhyColumns(const OpAmpComparison& c, bool display) {
  const std::string f_ref = FormatEng(c.reference_hz, "Hz");
  std::vector<CompareColumn> cols;
  if (display)
    cols.push_back({"device", "", [](const Row& r) { return r.device; },
                    nullptr, Table::Align::kLeft});
  const auto share = [](double NoiseKindShares::*field) {
    return Display(
        [field](const Row& r) { return FormatShare(r.shares.*field); });
  };
  const auto share_csv = [](double NoiseKindShares::*field) {
    return Csv([field](const Row& r) { return r.shares.*field; });
  };
  cols.push_back({"e_n x NG", "share_voltage_noise",
                  share(&NoiseKindShares::voltage_noise),
                  share_csv(&NoiseKindShares::voltage_noise)});
  cols.push_back({"i_n", "share_current_noise",
                  share(&NoiseKindShares::current_noise),
                  share_csv(&NoiseKindShares::current_noise)});
  cols.push_back({"resistors", "share_resistor",
                  share(&NoiseKindShares::resistor),
                  share_csv(&NoiseKindShares::resistor)});
  cols.push_back({"other", "share_other", share(&NoiseKindShares::other),
                  share_csv(&NoiseKindShares::other)});
  cols.push_back(
      {"e_n at " + f_ref, "e_n_at_reference_V_per_rtHz",
       [](const Row& r) {
         return FormatEng(r.e_n_ref_v_per_rthz, std::string("V") + kPerRtHz);
       },
       [](const Row& r) { return CsvNumber(r.e_n_ref_v_per_rthz); }});
  cols.push_back(
      {"i_n at " + f_ref, "i_n_at_reference_A_per_rtHz",
       [](const Row& r) {
         return FormatEng(r.i_n_ref_a_per_rthz, std::string("A") + kPerRtHz);
       },
       [](const Row& r) { return CsvNumber(r.i_n_ref_a_per_rthz); }});
  if (c.voltage_source) {
    cols.push_back({"R_opt = e_n/i_n", "optimum_source_resistance_ohm",
                    [](const Row& r) {
                      return r.optimum_source_ohm
                                 ? FormatEng(*r.optimum_source_ohm, kOhm)
                                 : std::string("none (i_n = 0)");
                    },
                    [](const Row& r) {
                      return r.optimum_source_ohm
                                 ? CsvNumber(*r.optimum_source_ohm)
                                 : std::string();
                    }});
    cols.push_back({"source / R_opt", "source_to_optimum_ratio",
                    [](const Row& r) {
                      return r.source_to_optimum
                                 ? Printf("%.3g", *r.source_to_optimum)
                                 : std::string(kNone);
                    },
                    [](const Row& r) {
                      return r.source_to_optimum
                                 ? CsvNumber(*r.source_to_optimum)
                                 : std::string();
                    }});
  }
  return cols;
}

Table RankingTable(const OpAmpComparison& c) {
  return Build(RankingColumns(c), c.rows, Cells::kDisplay);
}

Table WhyTable(const OpAmpComparison& c) {
  return Build(WhyColumns(c, true), c.rows, Cells::kDisplay);
}

Table CsvTable(const OpAmpComparison& c) {
  std::vector<CompareColumn> cols = RankingColumns(c);
  // The verdict closes the record.
  CompareColumn verdict = cols.back();
  cols.pop_back();
  for (CompareColumn& w : WhyColumns(c, false)) cols.push_back(std::move(w));
  cols.push_back(std::move(verdict));
  return Build(cols, c.rows, Cells::kCsv);
}

std::string RankingText(const OpAmpComparison& c) {
  return c.ranking == OpAmpRanking::kOffset ? "worst-case offset"
                                            : "input-referred noise rms";
}

// The lines above the tables.
std::vector<std::string> HeadLines(const OpAmpComparison& c) {
  std::vector<std::string> lines;
  lines.push_back(
      "the stage with each op-amp, each a full budget (the stage's op-amp "
      "replaced whole, its \"set\" overrides included, as budget --device "
      "does)");
  lines.push_back("band " + FormatEng(c.band_low_hz, "Hz") + " to " +
                  FormatEng(c.band_high_hz, "Hz") + ", reference " +
                  FormatEng(c.reference_hz, "Hz") + "; ranked by " +
                  RankingText(c) +
                  ", smallest first, the op-amps that fit before those that "
                  "fail a check");
  return lines;
}

// The lines between the two tables.
std::vector<std::string> WhyLines(const OpAmpComparison& c) {
  std::vector<std::string> lines;
  lines.push_back(
      "why: the output noise power by kind of contributor (e_n through the "
      "noise gain, i_n at both inputs, the resistors' thermal and excess "
      "noise, the rest), and each class's densities at the reference");
  if (c.voltage_source)
    lines.push_back(
        "the optimum source resistance R_opt = e_n/i_n balances the e_n and "
        "i_n terms; the source as the op-amp sees it is R_source + R_in = " +
        FormatEng(c.source_resistance_seen_ohm, kOhm) +
        " (below R_opt the class is e_n-bound, above it i_n-bound)");
  return lines;
}

// The meaning of each verdict word that appears, and the refused devices.
std::vector<std::string> NoteLines(const OpAmpComparison& c) {
  std::set<std::string> seen;
  for (const Row& r : c.rows)
    for (const std::string& w : OpAmpVerdictWords(r)) seen.insert(w);
  std::vector<std::string> lines;
  if (seen.count("phase-margin"))
    lines.push_back(Printf("phase-margin: below %.0f", kLowPhaseMarginDeg) +
                    kDegree);
  if (seen.count("bandwidth"))
    lines.push_back(
        "bandwidth: the -3 dB bandwidth is below the band's upper edge");
  if (seen.count("low-corner"))
    lines.push_back(
        "low-corner: the low -3 dB corner is above the band's "
        "lower edge");
  std::string flags;
  for (const std::string& w : seen)
    if (w != "phase-margin" && w != "bandwidth" && w != "low-corner" &&
        w != "refused")
      flags += (flags.empty() ? "" : ", ") + w;
  if (!flags.empty())
    lines.push_back(flags +
                    ": the budget's flags of a stage that cannot work (its "
                    "warnings say more)");
  for (const Row& r : c.rows)
    if (!r.status.ok)
      lines.push_back("refused: " + r.device + ": " + r.status.message);
  return lines;
}

nlohmann::json Nullable(bool present, double value) {
  return present ? nlohmann::json(value) : nlohmann::json(nullptr);
}

std::string Json(const Stage& stage, const OpAmpComparison& c) {
  using nlohmann::json;
  json devices = json::array();
  for (const Row& r : c.rows) {
    const Budget& b = r.budget;
    const bool ok = r.status.ok;
    json d = {
        {"rank", r.rank > 0 ? json(r.rank) : json(nullptr)},
        {"device", r.device},
        {"class", r.class_name},
        {"status", ok ? "ok" : "refused"},
        {"refusal", ok ? json(nullptr) : json(r.status.message)},
        {"input_referred_rms", Nullable(ok, b.input_rms)},
        {"input_referred_density_per_rtHz",
         Nullable(ok, b.input_density_ref_per_rthz)},
        {"output_rms_V", Nullable(ok, b.output_rms_v)},
        {"dominant", nullptr},
        {"shares", nullptr},
        {"offset_worst_case_V", Nullable(ok, b.offset.worst_case_v)},
        {"phase_margin_deg",
         Nullable(ok && b.loop.crossover_found, b.loop.phase_margin_deg)},
        {"crossover_Hz",
         Nullable(ok && b.loop.crossover_found, b.loop.crossover_hz)},
        {"bandwidth_3db_Hz", Nullable(ok, b.bandwidth_3db_hz)},
        {"bandwidth_low_Hz", Nullable(ok, b.bandwidth_low_hz)},
        {"e_n_at_reference_V_per_rtHz", r.e_n_ref_v_per_rthz},
        {"i_n_at_reference_A_per_rtHz", r.i_n_ref_a_per_rthz},
        {"optimum_source_resistance_ohm",
         Nullable(r.optimum_source_ohm.has_value(),
                  r.optimum_source_ohm.value_or(0))},
        {"source_to_optimum_ratio", Nullable(r.source_to_optimum.has_value(),
                                             r.source_to_optimum.value_or(0))},
        {"verdict", OpAmpVerdict(r)},
        {"checks", OpAmpVerdictWords(r)},
        {"warnings", b.warnings},
    };
    if (ok && !b.contributors.empty())
      d["dominant"] = {{"name", b.contributors.front().name},
                       {"kind", NoiseKindWord(b.contributors.front().kind)},
                       {"share", b.contributors.front().share}};
    if (ok)
      d["shares"] = {{"voltage_noise", r.shares.voltage_noise},
                     {"current_noise", r.shares.current_noise},
                     {"resistor", r.shares.resistor},
                     {"other", r.shares.other}};
    devices.push_back(d);
  }
  json out = {{"stage", stage.name},
              {"ranking", OpAmpRankingWord(c.ranking)},
              {"band_Hz", {{"low", c.band_low_hz}, {"high", c.band_high_hz}}},
              {"reference_frequency_Hz", c.reference_hz},
              {"input_referred_unit", c.input_unit},
              {"source_resistance_seen_ohm",
               Nullable(c.voltage_source, c.source_resistance_seen_ohm)},
              {"devices", devices}};
  return out.dump(2) + "\n";
}

}  // namespace

std::string CompareReport(const std::string& format, const Stage& stage,
                          const OpAmpComparison& c) {
  if (format == "json") return Json(stage, c);
  if (format == "csv") return RenderCsv(CsvTable(c));
  const Table ranking = RankingTable(c);
  const Table why = WhyTable(c);
  std::string out;
  if (format == "markdown") {
    out = "## " + EscapeMarkdown(stage.name) + ": op-amp classes compared\n\n";
    for (const std::string& l : HeadLines(c))
      out += "- " + EscapeMarkdown(l) + "\n";
    out += "\n" + RenderMarkdown(ranking) + "\n";
    for (const std::string& l : WhyLines(c))
      out += "- " + EscapeMarkdown(l) + "\n";
    out += "\n" + RenderMarkdown(why);
    const std::vector<std::string> notes = NoteLines(c);
    if (!notes.empty()) out += "\n";
    for (const std::string& l : notes) out += "- " + EscapeMarkdown(l) + "\n";
    return out;
  }
  out = EscapeText(stage.name) + "\n";
  for (const std::string& l : HeadLines(c)) out += "  " + l + "\n";
  out += "\n" + RenderText(ranking) + "\n";
  for (const std::string& l : WhyLines(c)) out += "  " + l + "\n";
  out += "\n" + RenderText(why);
  const std::vector<std::string> notes = NoteLines(c);
  if (!notes.empty()) out += "\n";
  for (const std::string& l : notes) out += "  " + EscapeText(l) + "\n";
  return out;
}

}  // namespace hushgain

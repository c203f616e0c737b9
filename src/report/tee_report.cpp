#include "report/tee_report.h"

#include <cmath>
#include <cstdio>
#include <nlohmann/json.hpp>

#include "base/physical_constants.h"
#include "base/printf.h"
#include "io/units.h"
#include "report/budget_tables.h"
#include "report/enum_words.h"
#include "report/table.h"
#include "report/text_escape.h"

namespace hushgain {
namespace {

nlohmann::json Flags(const Budget& b) {
  nlohmann::json out = nlohmann::json::array();
  for (StageProblem p : b.problems) out.push_back(StageProblemWord(p));
  return out;
}

nlohmann::json BudgetFigures(const Budget& b) {
  return {
      {"noise_gain_dc", b.noise_gain_dc},
      {"noise_gain_at_reference", b.noise_gain_ref},
      {"signal_gain_dc", b.signal_gain_dc},
      {"output_rms_V", b.output_rms_v},
      {"input_rms_" + b.input_unit, b.input_rms},
      {"offset_worst_case_V", b.offset.worst_case_v},
      {"offset_rss_V", b.offset.rss_v},
      {"bandwidth_3db_Hz", b.bandwidth_3db_hz},
      {"flags", Flags(b)},
  };
}

const Budget* FirstBudget(const TeeSweepResult& s) {
  return s.rows.empty() ? nullptr : &s.rows.front().budget;
}

std::string Band(const Budget& b) {
  return FormatEng(b.band_low_hz, "Hz") + " to " +
         FormatEng(b.band_high_hz, "Hz");
}

// The lines above a search table, shared by text and Markdown: the values
// searched, the gain window and ranking, and how much was evaluated.
std::string SearchSpace(const TeeSearchQuery& q) {
  std::string out = q.series + " values " + FormatOhms(q.min_ohm) + " to " +
                    FormatOhms(q.max_ohm) + " for R1, R2, R3";
  if (q.input_min_ohm)
    out += "; R_in " + FormatOhms(*q.input_min_ohm) + " to " +
           FormatOhms(*q.input_max_ohm);
  return out;
}

std::string SearchGain(const TeeSearchQuery& q) {
  std::string out = Printf("%.6g", q.target_gain) + " within " +
                    Printf("%.3g %%", 100 * q.gain_tolerance) + "; ranked by " +
                    TeeRankingWord(q.ranking);
  if (q.ranking == TeeRanking::kWeighted)
    out += Printf(" (offset weight %.3g)", q.offset_weight);
  return out;
}

std::string SearchCounts(const TeeSearchResult& s) {
  return Printf("%.4g", static_cast<double>(s.combinations)) +
         " combinations, " + std::to_string(s.verified) +
         " verified by the full engine";
}

const char* kGainErrorNote = "the full engine's DC gain against the target";
const char* kNoiseCostNote = "output rms / one resistor of the same Req";

std::string Temperature(const Budget& b) {
  return Printf("%.2f", b.temperature_k - kZeroCelsiusK) +
         " \xC2\xB0"
         "C (" +
         Printf("%.2f", b.temperature_k) + " K)";
}

}  // namespace

std::string SweepToText(const TeeSweepResult& s) {
  const Budget* first = FirstBudget(s);
  if (!first) return "";
  std::string out = EscapeText(first->stage_name) + "\n";
  out += "  T-network sweep at Req = " + FormatOhms(s.equivalent_ohm) +
         " (gain kept), largest resistor " +
         FormatOhms(s.rows.front().largest_ohm) + " down to " +
         FormatOhms(s.rows.back().largest_ohm) + "\n";
  out += "  band " + Band(*first) +
         "; the first row is the plain resistor; noise cost = output rms / "
         "the plain row's\n\n";
  out += RenderText(SweepTable(s, TeeCells::kDisplay));
  return out;
}

std::string SweepToCsv(const TeeSweepResult& s) {
  return RenderCsv(SweepTable(s, TeeCells::kCsv));
}

std::string SweepToMarkdown(const TeeSweepResult& s) {
  const Budget* first = FirstBudget(s);
  if (!first) return "";
  std::string out =
      "## T-network sweep: " + EscapeMarkdown(first->stage_name) + "\n\n";
  out += MarkdownItem("temperature", Temperature(*first));
  out += MarkdownItem("band", Band(*first));
  out += MarkdownItem("gain kept",
                      Printf("%.4g", std::fabs(first->signal_gain_dc)) +
                          (first->input_unit == "A" ? " V/A" : " V/V") +
                          " at DC (the plain resistor's), Req = " +
                          FormatOhms(s.equivalent_ohm));
  out += MarkdownItem("largest resistor",
                      FormatOhms(s.rows.front().largest_ohm) +
                          " (the plain resistor) down to " +
                          FormatOhms(s.rows.back().largest_ohm));
  out += "\n" + RenderMarkdown(SweepTable(s, TeeCells::kDisplay)) + "\n";
  out += MarkdownItem("noise cost",
                      "output rms / the plain resistor's (first row)");
  return out;
}

std::string SweepToJson(const TeeSweepResult& s) {
  using nlohmann::json;
  json out;
  const Budget* first = FirstBudget(s);
  out["stage"] = first ? first->stage_name : "";
  out["equivalent_resistance_ohm"] = s.equivalent_ohm;
  json rows = json::array();
  for (const TeeSweepRow& r : s.rows) {
    json row = BudgetFigures(r.budget);
    row["largest_ohm"] = r.largest_ohm;
    row["plain"] = r.plain;
    row["r1_ohm"] = r.tee.r1_ohm;
    if (!r.plain) {
      row["r2_ohm"] = r.tee.r2_ohm;
      row["r3_ohm"] = r.tee.r3_ohm;
    }
    row["noise_cost_ratio"] = r.noise_cost_ratio;
    rows.push_back(row);
  }
  out["rows"] = rows;
  return out.dump(2) + "\n";
}

std::string SearchToText(const TeeSearchResult& s, const TeeSearchQuery& q) {
  std::string out;
  if (!s.best.empty())
    out += EscapeText(s.best.front().budget.stage_name) + "\n";
  out += "  " + SearchSpace(q) + "\n";
  out += "  gain " + SearchGain(q) + "\n";
  out += "  " + SearchCounts(s) + "\n";
  if (s.cancelled)
    out += "  interrupted: the best of the part searched so far\n";
  out += "\n";
  out += RenderText(SearchTable(s, q, TeeCells::kDisplay));
  out += std::string("  gain err: ") + kGainErrorNote +
         "; noise cost: " + kNoiseCostNote + "\n";
  return out;
}

std::string SearchToCsv(const TeeSearchResult& s, const TeeSearchQuery& q) {
  return RenderCsv(SearchTable(s, q, TeeCells::kCsv));
}

std::string SearchToMarkdown(const TeeSearchResult& s,
                             const TeeSearchQuery& q) {
  const Budget* first = s.best.empty() ? nullptr : &s.best.front().budget;
  std::string out =
      "## T-network search: " + EscapeMarkdown(first ? first->stage_name : "") +
      "\n\n";
  if (first) {
    out += MarkdownItem("temperature", Temperature(*first));
    out += MarkdownItem("band", Band(*first));
  }
  out += MarkdownItem("target gain", SearchGain(q));
  out += MarkdownItem("search space", SearchSpace(q));
  out += MarkdownItem("searched", SearchCounts(s));
  if (s.cancelled)
    out += MarkdownItem("interrupted", "the best of the part searched so far");
  out += "\n" + RenderMarkdown(SearchTable(s, q, TeeCells::kDisplay)) + "\n";
  out += MarkdownItem("gain err", kGainErrorNote);
  out += MarkdownItem("noise cost", kNoiseCostNote);
  return out;
}

std::string SearchToJson(const TeeSearchResult& s, const TeeSearchQuery& q) {
  using nlohmann::json;
  json out;
  out["stage"] = s.best.empty() ? "" : s.best.front().budget.stage_name;
  out["series"] = q.series;
  out["range_ohm"] = {q.min_ohm, q.max_ohm};
  if (q.input_min_ohm)
    out["input_range_ohm"] = {*q.input_min_ohm, *q.input_max_ohm};
  out["target_gain"] = q.target_gain;
  out["gain_tolerance"] = q.gain_tolerance;
  out["ranking"] = TeeRankingWord(q.ranking);
  if (q.ranking == TeeRanking::kWeighted)
    out["offset_weight"] = q.offset_weight;
  out["combinations"] = s.combinations;
  out["verified_full_engine"] = s.verified;
  out["cancelled"] = s.cancelled;
  json best = json::array();
  for (const TeeCandidate& c : s.best) {
    json row = BudgetFigures(c.budget);
    row["r_in_ohm"] = c.r_in_ohm;
    row["r1_ohm"] = c.r1_ohm;
    row["r2_ohm"] = c.r2_ohm;
    row["r3_ohm"] = c.r3_ohm;
    row["gain_error"] = TeeGainError(c.budget, q.target_gain);
    row["noise_cost_ratio"] = TeeNoiseCost(c.budget);
    row["score"] = c.score;
    best.push_back(row);
  }
  out["best"] = best;
  return out.dump(2) + "\n";
}

}  // namespace hushgain

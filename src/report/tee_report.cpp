#include "report/tee_report.h"

#include <cmath>
#include <cstdio>
#include <nlohmann/json.hpp>

#include "io/units.h"
#include "report/table.h"

namespace hushgain {
namespace {

constexpr const char* kOhm = "\xCE\xA9";

std::string Printf(const char* format, double value) {
  char buf[64];
  std::snprintf(buf, sizeof buf, format, value);
  return buf;
}

std::string Number(double value) { return Printf("%.9g", value); }

std::string Ohms(double value) { return FormatEng(value, kOhm); }

std::string Ratio(double value) { return Printf("x%.4f", value); }

double NoiseCost(const Budget& b) {
  return b.tee ? b.tee->noise_cost_ratio : 1.0;
}

double GainError(const Budget& b, double target) {
  return std::fabs(b.signal_gain_dc) / target - 1;
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
  };
}

const Budget* FirstBudget(const TeeSweepResult& s) {
  return s.rows.empty() ? nullptr : &s.rows.front().budget;
}

}  // namespace

std::string SweepToText(const TeeSweepResult& s) {
  const Budget* first = FirstBudget(s);
  if (!first) return "";
  const std::string unit = first->input_unit;
  std::string out = first->stage_name + "\n";
  out += "  T-network sweep at Req = " + Ohms(s.equivalent_ohm) +
         " (gain kept), largest resistor " + Ohms(s.rows.front().largest_ohm) +
         " down to " + Ohms(s.rows.back().largest_ohm) + "\n";
  out += "  band " + FormatEng(first->band_low_hz, "Hz") + " to " +
         FormatEng(first->band_high_hz, "Hz") +
         "; the first row is the plain resistor; noise cost = output rms / "
         "the plain row's\n\n";
  Table t;
  t.header = {"largest",    "R1",        "R2",           "R3",        "e_n NG",
              "output rms", "input rms", "offset worst", "noise cost"};
  t.align.assign(t.header.size(), Table::Align::kRight);
  for (const TeeSweepRow& r : s.rows) {
    const Budget& b = r.budget;
    t.AddRow({Ohms(r.largest_ohm), Ohms(r.tee.r1_ohm),
              r.plain ? std::string("-") : Ohms(r.tee.r2_ohm),
              r.plain ? std::string("(plain)") : Ohms(r.tee.r3_ohm),
              Printf("%.4g", b.noise_gain_dc), FormatEng(b.output_rms_v, "V"),
              FormatEng(b.input_rms, unit),
              FormatEng(b.offset.worst_case_v, "V"),
              Ratio(r.noise_cost_ratio)});
  }
  out += RenderText(t);
  return out;
}

std::string SweepToCsv(const TeeSweepResult& s) {
  const Budget* first = FirstBudget(s);
  const std::string unit = first ? first->input_unit : "V";
  std::string out =
      "largest_ohm,r1_ohm,r2_ohm,r3_ohm,plain,noise_gain_dc,output_rms_V,"
      "input_rms_" +
      unit + ",offset_worst_case_V,noise_cost_ratio\n";
  for (const TeeSweepRow& r : s.rows) {
    const Budget& b = r.budget;
    out += Number(r.largest_ohm) + "," + Number(r.tee.r1_ohm) + "," +
           Number(r.tee.r2_ohm) + "," + Number(r.tee.r3_ohm) + "," +
           (r.plain ? "1" : "0") + "," + Number(b.noise_gain_dc) + "," +
           Number(b.output_rms_v) + "," + Number(b.input_rms) + "," +
           Number(b.offset.worst_case_v) + "," + Number(r.noise_cost_ratio) +
           "\n";
  }
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
  const std::string unit =
      s.best.empty() ? std::string("V") : s.best.front().budget.input_unit;
  if (!s.best.empty()) out += s.best.front().budget.stage_name + "\n";
  out += "  " + q.series + " values " + Ohms(q.min_ohm) + " to " +
         Ohms(q.max_ohm) + " for R1, R2, R3";
  if (q.input_min_ohm)
    out += "; R_in " + Ohms(*q.input_min_ohm) + " to " + Ohms(*q.input_max_ohm);
  out += "\n  gain " + Printf("%.6g", q.target_gain) + " within " +
         Printf("%.3g %%", 100 * q.gain_tolerance) + "; ranked by " + q.ranking;
  if (q.ranking == "weighted")
    out += Printf(" (offset weight %.3g)", q.offset_weight);
  out += "\n  " + Printf("%.4g", static_cast<double>(s.combinations)) +
         " combinations, " + std::to_string(s.in_tolerance) +
         " evaluated in closed form, " + std::to_string(s.verified) +
         " verified by the full engine\n";
  if (s.cancelled)
    out += "  interrupted: the best of the part searched so far\n";
  out += "\n";
  Table t;
  t.header = {"#",         "R_in",         "R1",        "R2",
              "R3",        "gain err",     "e_n NG",    "output rms",
              "input rms", "offset worst", "noise cost"};
  if (q.ranking == "weighted") t.header.push_back("score");
  t.align.assign(t.header.size(), Table::Align::kRight);
  int rank = 0;
  for (const TeeCandidate& c : s.best) {
    const Budget& b = c.budget;
    std::vector<std::string> row = {
        std::to_string(++rank),
        Ohms(c.r_in_ohm),
        Ohms(c.r1_ohm),
        Ohms(c.r2_ohm),
        Ohms(c.r3_ohm),
        Printf("%+.3f %%", 100 * GainError(b, q.target_gain)),
        Printf("%.4g", b.noise_gain_dc),
        FormatEng(b.output_rms_v, "V"),
        FormatEng(b.input_rms, unit),
        FormatEng(b.offset.worst_case_v, "V"),
        Ratio(NoiseCost(b))};
    if (q.ranking == "weighted") row.push_back(Printf("%.4f", c.score));
    t.AddRow(row);
  }
  out += RenderText(t);
  out +=
      "  gain err: the full engine's DC gain against the target; noise "
      "cost: output rms / one resistor of the same Req\n";
  return out;
}

std::string SearchToCsv(const TeeSearchResult& s, const TeeSearchQuery& q) {
  const std::string unit =
      s.best.empty() ? std::string("V") : s.best.front().budget.input_unit;
  std::string out =
      "rank,r_in_ohm,r1_ohm,r2_ohm,r3_ohm,signal_gain_dc,gain_error,"
      "noise_gain_dc,output_rms_V,input_rms_" +
      unit + ",offset_worst_case_V,noise_cost_ratio,score\n";
  int rank = 0;
  for (const TeeCandidate& c : s.best) {
    const Budget& b = c.budget;
    out += std::to_string(++rank) + "," + Number(c.r_in_ohm) + "," +
           Number(c.r1_ohm) + "," + Number(c.r2_ohm) + "," + Number(c.r3_ohm) +
           "," + Number(b.signal_gain_dc) + "," +
           Number(GainError(b, q.target_gain)) + "," + Number(b.noise_gain_dc) +
           "," + Number(b.output_rms_v) + "," + Number(b.input_rms) + "," +
           Number(b.offset.worst_case_v) + "," + Number(NoiseCost(b)) + "," +
           Number(c.score) + "\n";
  }
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
  out["ranking"] = q.ranking;
  if (q.ranking == "weighted") out["offset_weight"] = q.offset_weight;
  out["combinations"] = s.combinations;
  out["evaluated_closed_form"] = s.in_tolerance;
  out["verified_full_engine"] = s.verified;
  out["cancelled"] = s.cancelled;
  json best = json::array();
  for (const TeeCandidate& c : s.best) {
    json row = BudgetFigures(c.budget);
    row["r_in_ohm"] = c.r_in_ohm;
    row["r1_ohm"] = c.r1_ohm;
    row["r2_ohm"] = c.r2_ohm;
    row["r3_ohm"] = c.r3_ohm;
    row["gain_error"] = GainError(c.budget, q.target_gain);
    row["noise_cost_ratio"] = NoiseCost(c.budget);
    row["score"] = c.score;
    best.push_back(row);
  }
  out["best"] = best;
  return out.dump(2) + "\n";
}

}  // namespace hushgain

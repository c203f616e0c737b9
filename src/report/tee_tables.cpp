#include "report/tee_tables.h"

#include <cmath>
#include <cstdio>
#include <functional>
#include <vector>

#include "base/printf.h"
#include "io/units.h"
#include "report/budget_tables.h"
#include "report/csv_report.h"
#include "report/enum_words.h"

namespace hushgain {
namespace {

std::string Ratio(double value) { return Printf("x%.4f", value); }

// One column of a report table: its header and cell in each style; an
// empty header leaves the column out of that style.
template <typename Row>
struct Column {
  std::string display_header;
  std::string csv_header;
  std::function<std::string(const Row&)> display;
  std::function<std::string(const Row&)> csv;
};

template <typename Row>
Table Build(const std::vector<Column<Row>>& columns,
            const std::vector<Row>& rows, TeeCells cells) {
  const bool display = cells == TeeCells::kDisplay;
  Table t;
  std::vector<const Column<Row>*> shown;
  for (const Column<Row>& c : columns) {
    const std::string& header = display ? c.display_header : c.csv_header;
    if (header.empty()) continue;
    shown.push_back(&c);
    t.header.push_back(header);
  }
  t.align.assign(t.header.size(), Table::Align::kRight);
  for (const Row& r : rows) {
    std::vector<std::string> cells_of_row;
    for (const Column<Row>* c : shown)
      cells_of_row.push_back(display ? c->display(r) : c->csv(r));
    t.AddRow(std::move(cells_of_row));
  }
  return t;
}

// The columns every budget row shares: e_n noise gain, output and input
// rms, worst-case offset.
template <typename Row, typename BudgetOf>
void AddBudgetColumns(std::vector<Column<Row>>& columns,
                      const std::string& unit, BudgetOf budget_of) {
  columns.push_back(
      {"e_n NG", "noise_gain_dc",
       [=](const Row& r) { return Printf("%.4g", budget_of(r).noise_gain_dc); },
       [=](const Row& r) { return CsvNumber(budget_of(r).noise_gain_dc); }});
  columns.push_back(
      {"output rms", "output_rms_V",
       [=](const Row& r) { return FormatEng(budget_of(r).output_rms_v, "V"); },
       [=](const Row& r) { return CsvNumber(budget_of(r).output_rms_v); }});
  columns.push_back(
      {"input rms", "input_rms_" + unit,
       [=](const Row& r) { return FormatEng(budget_of(r).input_rms, unit); },
       [=](const Row& r) { return CsvNumber(budget_of(r).input_rms); }});
  columns.push_back({"offset worst", "offset_worst_case_V",
                     [=](const Row& r) {
                       return FormatEng(budget_of(r).offset.worst_case_v, "V");
                     },
                     [=](const Row& r) {
                       return CsvNumber(budget_of(r).offset.worst_case_v);
                     }});
}

// The last columns of every row: the current the T's output arm (pi
// equivalent, S/R1) draws at full scale ("-" for a plain resistor or
// without a full scale), and why the stage cannot work
// (budget/stage_problem.h), "-" when nothing is wrong.
template <typename Row, typename BudgetOf>
void AddLoadAndFlagsColumns(std::vector<Column<Row>>& columns,
                            BudgetOf budget_of) {
  columns.push_back({"out-arm I", "output_arm_current_A",
                     [=](const Row& r) {
                       const Budget& b = budget_of(r);
                       return b.tee_pi && b.tee_pi->output_arm_current_a
                                  ? FormatEng(*b.tee_pi->output_arm_current_a,
                                              "A")
                                  : std::string("-");
                     },
                     [=](const Row& r) {
                       const Budget& b = budget_of(r);
                       return b.tee_pi && b.tee_pi->output_arm_current_a
                                  ? CsvNumber(*b.tee_pi->output_arm_current_a)
                                  : std::string("");
                     }});
  columns.push_back(
      {"flags", "flags",
       [=](const Row& r) { return StageProblemFlags(budget_of(r).problems); },
       [=](const Row& r) { return StageProblemFlags(budget_of(r).problems); }});
}

struct RankedCandidate {
  int rank = 0;
  const TeeCandidate* candidate = nullptr;
};

}  // namespace

double TeeGainError(const Budget& b, double target_gain) {
  return std::fabs(b.signal_gain_dc) / target_gain - 1;
}

double TeeNoiseCost(const Budget& b) {
  return b.tee ? b.tee->noise_cost_ratio : 1.0;
}

Table SweepTable(const TeeSweepResult& s, TeeCells cells) {
  using Row = const TeeSweepRow*;
  const std::string unit =
      s.rows.empty() ? std::string("V") : s.rows.front().budget.input_unit;
  std::vector<Column<Row>> columns = {
      {"largest", "largest_ohm",
       [](Row r) { return FormatOhms(r->largest_ohm); },
       [](Row r) { return CsvNumber(r->largest_ohm); }},
      {"R1", "r1_ohm", [](Row r) { return FormatOhms(r->tee.r1_ohm); },
       [](Row r) { return CsvNumber(r->tee.r1_ohm); }},
      {"R2", "r2_ohm",
       [](Row r) {
         return r->plain ? std::string("-") : FormatOhms(r->tee.r2_ohm);
       },
       [](Row r) { return CsvNumber(r->tee.r2_ohm); }},
      {"R3", "r3_ohm",
       [](Row r) {
         return r->plain ? std::string("(plain)") : FormatOhms(r->tee.r3_ohm);
       },
       [](Row r) { return CsvNumber(r->tee.r3_ohm); }},
      {"", "plain", nullptr,
       [](Row r) { return std::string(r->plain ? "1" : "0"); }},
  };
  AddBudgetColumns(columns, unit,
                   [](Row r) -> const Budget& { return r->budget; });
  columns.push_back({"noise cost", "noise_cost_ratio",
                     [](Row r) { return Ratio(r->noise_cost_ratio); },
                     [](Row r) { return CsvNumber(r->noise_cost_ratio); }});
  AddLoadAndFlagsColumns(columns,
                         [](Row r) -> const Budget& { return r->budget; });
  std::vector<Row> rows;
  for (const TeeSweepRow& r : s.rows) rows.push_back(&r);
  return Build(columns, rows, cells);
}

Table SearchTable(const TeeSearchResult& s, const TeeSearchQuery& q,
                  TeeCells cells) {
  using Row = RankedCandidate;
  const std::string unit =
      s.best.empty() ? std::string("V") : s.best.front().budget.input_unit;
  const double target = q.target_gain;
  auto ohm_column = [](const char* display, const char* csv,
                       double TeeCandidate::*field) {
    return Column<Row>{
        display, csv,
        [=](const Row& r) { return FormatOhms(r.candidate->*field); },
        [=](const Row& r) { return CsvNumber(r.candidate->*field); }};
  };
  std::vector<Column<Row>> columns = {
      {"#", "rank", [](const Row& r) { return std::to_string(r.rank); },
       [](const Row& r) { return std::to_string(r.rank); }},
      ohm_column("R_in", "r_in_ohm", &TeeCandidate::r_in_ohm),
      ohm_column("R1", "r1_ohm", &TeeCandidate::r1_ohm),
      ohm_column("R2", "r2_ohm", &TeeCandidate::r2_ohm),
      ohm_column("R3", "r3_ohm", &TeeCandidate::r3_ohm),
      {"", "signal_gain_dc", nullptr,
       [](const Row& r) {
         return CsvNumber(r.candidate->budget.signal_gain_dc);
       }},
      {"gain err", "gain_error",
       [=](const Row& r) {
         return Printf("%+.3f %%",
                       100 * TeeGainError(r.candidate->budget, target));
       },
       [=](const Row& r) {
         return CsvNumber(TeeGainError(r.candidate->budget, target));
       }},
  };
  AddBudgetColumns(columns, unit, [](const Row& r) -> const Budget& {
    return r.candidate->budget;
  });
  columns.push_back(
      {"noise cost", "noise_cost_ratio",
       [](const Row& r) { return Ratio(TeeNoiseCost(r.candidate->budget)); },
       [](const Row& r) {
         return CsvNumber(TeeNoiseCost(r.candidate->budget));
       }});
  columns.push_back(
      {q.ranking == TeeRanking::kWeighted ? "score" : "", "score",
       [](const Row& r) { return Printf("%.4f", r.candidate->score); },
       [](const Row& r) { return CsvNumber(r.candidate->score); }});
  AddLoadAndFlagsColumns(columns, [](const Row& r) -> const Budget& {
    return r.candidate->budget;
  });
  std::vector<Row> rows;
  for (std::size_t i = 0; i < s.best.size(); ++i)
    rows.push_back({static_cast<int>(i) + 1, &s.best[i]});
  return Build(columns, rows, cells);
}

}  // namespace hushgain

// The T-network sweep and search tables, built once as Table values
// (report/table.h) from one list of columns, so the text, Markdown and CSV
// renderings hold the same figures:
//   TeeCells::kDisplay  engineering notation with units ("1.000 kΩ",
//                       "929.6 µV", "x1.0603"), for RenderText and
//                       RenderMarkdown;
//   TeeCells::kCsv      SI numbers without prefixes ("%.9g"), the unit in
//                       each column name ("output_rms_V"), for RenderCsv.
// Sweep columns (display / CSV): largest / largest_ohm, R1 / r1_ohm,
//   R2 / r2_ohm, R3 / r3_ohm, (CSV only) plain, e_n NG / noise_gain_dc,
//   output rms / output_rms_V, input rms / input_rms_<V or A>,
//   offset worst / offset_worst_case_V, noise cost / noise_cost_ratio.
//   The plain row shows R2 "-" and R3 "(plain)" (0 in CSV, plain = 1).
// Search columns: # / rank, R_in / r_in_ohm, R1, R2, R3, (CSV only)
//   signal_gain_dc, gain err / gain_error (|gain| / target - 1), e_n NG,
//   output rms, input rms, offset worst, noise cost / noise_cost_ratio
//   (output rms / one resistor of the same Req), score (display only with
//   the weighted ranking; always in CSV).
// Every figure is the full engine's budget of the row.
#ifndef HUSHGAIN_REPORT_TEE_TABLES_H_
#define HUSHGAIN_REPORT_TEE_TABLES_H_

#include <optional>
#include <string>

#include "design/tee_search.h"
#include "design/tee_sweep.h"
#include "report/table.h"

namespace hushgain {

// What a search was asked, for its report header.
struct TeeSearchQuery {
  std::string series;  // "E96"
  double min_ohm = 0;
  double max_ohm = 0;
  std::optional<double> input_min_ohm;  // set with a free input resistor
  std::optional<double> input_max_ohm;
  double target_gain = 0;
  double gain_tolerance = 0;
  TeeRanking ranking = TeeRanking::kInputNoise;
  double offset_weight = 0;
};

enum class TeeCells { kDisplay, kCsv };

Table SweepTable(const TeeSweepResult& sweep, TeeCells cells);
Table SearchTable(const TeeSearchResult& search, const TeeSearchQuery& query,
                  TeeCells cells);

// The relative gain error of a candidate: |signal gain at DC| / target - 1.
double TeeGainError(const Budget& budget, double target_gain);
// Output rms over that of one resistor of the same Req (1 without a tee).
double TeeNoiseCost(const Budget& budget);

}  // namespace hushgain

#endif  // HUSHGAIN_REPORT_TEE_TABLES_H_

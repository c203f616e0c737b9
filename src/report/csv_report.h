// Tables as CSV (RFC 4180, report/table.h RenderCsv) for spreadsheets and
// scripts: SI numbers without prefixes, the unit in each column name.
//
// BudgetToCsv: one record per contributor, then a "total" record:
//   contributor, kind, output_rms_V, share, output_density_V_per_rtHz,
//   gain_to_output, gain_unit, source_density_per_rtHz, source_unit,
//   reference_frequency_Hz
// where the densities and gain are at the reference frequency, gain_unit is
// V/V or V/A (a current source: i_n, shot) and source_unit V or A.
//
// SpectrumToCsv: one record per frequency of the samples:
//   f_Hz, <contributor>_V_per_rtHz ..., total_V_per_rtHz,
//   signal_gain_V_per_V (or _V_per_A), noise_gain_V_per_V, loop_gain_V_per_V
// (magnitudes; the loop gain is the op-amp's return ratio).
// contributors in the budget's order (largest share first).
#ifndef HUSHGAIN_REPORT_CSV_REPORT_H_
#define HUSHGAIN_REPORT_CSV_REPORT_H_

#include <string>

#include "budget/budget.h"
#include "budget/sample_spectra.h"

namespace hushgain {

std::string BudgetToCsv(const Budget& budget);

// `samples` come from SampleSpectra on the budget's stage.
std::string SpectrumToCsv(const Budget& budget, const SpectrumSamples& samples);

// A number for a CSV cell: "%.9g", enough to read back any value the tool
// prints to well under its last digit.
std::string CsvNumber(double value);

}  // namespace hushgain

#endif  // HUSHGAIN_REPORT_CSV_REPORT_H_

// The budget's tables, built once as Table values (report/table.h) so the
// text and Markdown reports show the same cells: the noise table (one row
// per contributor, then the total), the offset terms, and for a T network
// the comparison with the plain resistor and the per-contributor changes.
// Cells are formatted in engineering notation with units.
#ifndef HUSHGAIN_REPORT_BUDGET_TABLES_H_
#define HUSHGAIN_REPORT_BUDGET_TABLES_H_

#include <string>

#include "budget/budget.h"
#include "report/table.h"

namespace hushgain {

// Columns: contributor, kind, source @ f_ref, gain @ f_ref, output @ f_ref,
// output rms, share; a rule, then the "total" row.
Table ContributorTable(const Budget& budget);

// Vos x noise gain, Ib, Ios (and for a photodiode the dark current); a
// rule; worst case, root-sum-square.
Table OffsetTable(const Budget& budget);

// Requires budget.tee. Rows: output and input-referred rms, e_n noise gain
// at DC and at the reference, bandwidth, worst-case offset; columns T
// network, plain R_f, ratio.
Table TeeSummaryTable(const Budget& budget);

// Requires budget.tee. One row per contributor of either stage.
Table TeeChangesTable(const Budget& budget);

// The response line's text, shared by text and Markdown: "19.17 kHz (against
// the DC gain)", or for a stage that blocks DC "12.0 Hz to 19.17 kHz
// (against the in-band gain 1000 at 1 kHz)", then ", peaking ..." when the
// response rises more than 0.01 dB above its passband.
std::string BandwidthText(const Budget& budget);

// "" when the two input-referred definitions agree within
// kInputRmsDefinitionsDiffer; otherwise one sentence saying which one is
// printed and why, with the other's value.
std::string InputRmsNote(const Budget& budget);

// Shared cell formats: "%.4g" for gains, engineering notation with
// "<unit>/√Hz" for densities, "12.3 %" (or "<0.1 %") for shares.
std::string FormatGain(double value);
std::string FormatDensity(double value, const std::string& unit);
std::string FormatShare(double fraction);

}  // namespace hushgain

#endif  // HUSHGAIN_REPORT_BUDGET_TABLES_H_

// The budget's tables, built once as Table values (report/table.h) so the
// text and Markdown reports show the same cells: the noise table (one row
// per contributor, then the total), the offset terms, and for a T network
// the comparison with the plain resistor and the per-contributor changes.
// Cells are formatted in engineering notation with units.
#ifndef HUSHGAIN_REPORT_BUDGET_TABLES_H_
#define HUSHGAIN_REPORT_BUDGET_TABLES_H_

#include <string>
#include <utility>
#include <vector>

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

// Requires budget.tee_pi. The pi equivalent's three arms: value, where it
// sits, and its current (the input arm's as a fraction of the bridge's at
// DC, the reference and the band's upper edge; the output arm's at full
// scale with its share of the op-amp's output current).
Table TeePiTable(const Budget& budget);

// Requires budget.tee_pi. The lines under TeePiTable as (label, text):
// why the T costs noise gain, and (outside a photodiode stage, whose header
// says it) the noise-equivalent resistance.
std::vector<std::pair<std::string, std::string>> TeePiSentences(
    const Budget& budget);

// Requires budget.sensitivity. One row per parameter, largest first:
// parameter, value, and d ln F / d ln x for the output noise, the
// worst-case offset and the bandwidth ("-" where the figure is zero).
Table SensitivityTable(const Budget& budget);

// Requires budget.sensitivity. The lines under SensitivityTable as (label,
// text): the change that pays most, and how the numbers were found.
std::vector<std::pair<std::string, std::string>> SensitivityNotes(
    const Budget& budget);

// The response line's text, shared by text and Markdown: "19.17 kHz (against
// the DC gain)", or for a stage that blocks DC "12.0 Hz to 19.17 kHz
// (against the in-band gain 1000 at 1 kHz)", then ", peaking ..." when the
// response rises more than 0.01 dB above its passband.
std::string BandwidthText(const Budget& budget);

// "" when the two input-referred definitions agree within
// kInputRmsDefinitionsDiffer; otherwise one sentence saying which one is
// printed and why, with the other's value.
std::string InputRmsNote(const Budget& budget);

// A capacitive sensor's lines (budget.charge required), shared by text and
// Markdown:
//   gain       "10 mV/pC in the passband (|gain| 10 V/V from the sensor's
//              open-circuit voltage, C_s 1 nF); 9.95 V/V at 1 kHz"
//   sensor     "C_s 1 nF, leakage 10 GΩ, straight into the - input; low
//              corner 1/(2 pi R_f C_f) = 1.592 Hz" (R_eq for a T network)
//   noise      "352.1 aC rms (2198 electrons), ... C/√Hz at 1 kHz (the
//              input-referred volts x C_s)"
//   e_n x C    "the e_n noise gain rises to 11 at ... (1 + (C_s + C_in)/C_f
//              = 11 with C_s + C_in = 1 nF)", "" with R_in or without C_f
std::string ChargeGainText(const Budget& budget);
std::string ChargeSensorText(const Budget& budget);
std::string ChargeNoiseText(const Budget& budget);
std::string ChargeNoiseGainText(const Budget& budget);

// The AC-coupling lines (budget.ac_coupling required), shared by text and
// Markdown: "C3 1 µF in series with R3: the T network's whole gain above
// 1/(2 pi R3 C3) = 15.92 Hz; at DC the feedback is R1 + R2 = 200 kΩ (DC
// noise gain 21)", "C_input 10 µF in series with R_in: no DC passes;
// 1/(2 pi (R_source + R_in) C_input) = 1.59 Hz"; one or two entries.
std::vector<std::string> AcCouplingTexts(const Budget& budget);

// A charge in engineering notation, below 1 fC in aC: "352.1 aC".
std::string FormatCharge(double coulombs);
// A charge gain in the trade's unit: "10.00 mV/pC".
std::string FormatChargeGain(double v_per_c);

// Shared cell formats: "%.4g" for gains, engineering notation with
// "<unit>/√Hz" for densities and with "Ω" for resistances, "12.3 %" (or
// "<0.1 %") for shares.
std::string FormatGain(double value);
std::string FormatOhms(double ohms);
std::string FormatDensity(double value, const std::string& unit);
std::string FormatShare(double fraction);

}  // namespace hushgain

#endif  // HUSHGAIN_REPORT_BUDGET_TABLES_H_

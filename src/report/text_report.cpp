#include "report/text_report.h"

#include <algorithm>
#include <cmath>
#include <cstdio>

#include "base/physical_constants.h"
#include "base/printf.h"
#include "io/units.h"
#include "report/budget_tables.h"
#include "report/chain_tables.h"
#include "report/real_parts_text.h"
#include "report/table.h"
#include "report/text_escape.h"
#include "report/unit_symbols.h"

namespace hushgain {
namespace {

std::string Gain(double value) { return FormatGain(value); }

std::string Density(double value, const std::string& unit) {
  return FormatDensity(value, unit);
}

std::string Header(const Budget& b) {
  std::string out = EscapeText(b.stage_name) + "\n";
  out += "  temperature " + Printf("%.2f", b.temperature_k - kZeroCelsiusK) +
         " \xC2\xB0"
         "C (" +
         Printf("%.2f", b.temperature_k) + " K), band " +
         FormatEng(b.band_low_hz, "Hz") + " to " +
         FormatEng(b.band_high_hz, "Hz") + ", reference " +
         FormatEng(b.reference_hz, "Hz") + "\n";
  out += "  op-amp " + b.opamp_class + ", GBW " +
         FormatEng(b.opamp_gbw_hz, "Hz") + ", A0 " +
         Printf("%.3g", b.opamp_open_loop_gain) + "\n";
  if (b.charge) {
    out += "  charge gain " + ChargeGainText(b) + "\n";
    out += "  sensor " + ChargeSensorText(b) + "\n";
  } else if (b.input_unit == "A") {
    out += "  transimpedance " + FormatEng(b.signal_gain_dc, "\xCE\xA9") +
           " at DC, |" + FormatEng(b.signal_gain_ref, "\xCE\xA9") +
           "| at the reference\n";
  } else {
    out += "  signal gain " + Gain(b.signal_gain_dc) + " V/V at DC, |" +
           Gain(b.signal_gain_ref) + "| at the reference\n";
  }
  out += "  noise gain (e_n to output) " + Gain(b.noise_gain_dc) + " at DC, " +
         Gain(b.noise_gain_ref) + " at the reference" +
         (b.noise_gain_flat ? std::string(", flat (no peak above DC)")
                            : ", peak " + Gain(b.noise_gain_peak) + " at " +
                                  FormatEng(b.noise_gain_peak_hz, "Hz")) +
         "\n";
  out += "  closed-loop -3 dB bandwidth " + BandwidthText(b) + "\n";
  if (b.loop.crossover_found)
    out += "  loop gain crosses unity at " +
           FormatEng(b.loop.crossover_hz, "Hz") + ", phase margin " +
           Printf("%.1f", b.loop.phase_margin_deg) + "\xC2\xB0\n";
  if (b.feedback_capacitor_f > 0 || b.capacitor_choice)
    out += "  feedback capacitor " + FormatEng(b.feedback_capacitor_f, "F") +
           (b.capacitor_choice
                ? " (chosen for " + b.capacitor_choice->target +
                      "; the estimate " + b.capacitor_choice->estimate_rule +
                      " gives " +
                      FormatEng(b.capacitor_choice->estimate_f, "F") + ")"
                : std::string()) +
           "\n";
  if (b.ac_coupling)
    for (const std::string& line : AcCouplingTexts(b))
      out += "  AC coupling " + line + "\n";
  return out;
}

std::string NoiseSection(const Budget& b) {
  const std::string ref = FormatEng(b.reference_hz, "Hz", 3);
  std::string out = "\nNoise at the output, " + FormatEng(b.band_low_hz, "Hz") +
                    " to " + FormatEng(b.band_high_hz, "Hz") + "\n";
  out += RenderText(ContributorTable(b));
  out += "  output peak-to-peak    " + FormatEng(b.output_peak_to_peak_v, "V") +
         "  (6.6 x rms: inside about 99.9 % of the time, Gaussian)\n";
  out += "  input-referred         " + FormatEng(b.input_rms, b.input_unit) +
         " rms, " + Density(b.input_density_ref_per_rthz, b.input_unit) +
         " at " + ref + "\n";
  if (b.charge) out += "  input-referred charge  " + ChargeNoiseText(b) + "\n";
  if (const std::string note = InputRmsNote(b); !note.empty())
    out += "  note: " + note + "\n";
  if (b.photodiode && b.photodiode->responsivity_a_per_w > 0) {
    out +=
        "  NEP                    " +
        FormatEng(b.photodiode->nep_w_per_rthz, std::string("W") + kPerRtHz) +
        " at " + ref + ", " + FormatEng(b.photodiode->nep_rms_w, "W") +
        " rms over the band (" +
        Printf("%.3g A/W", b.photodiode->responsivity_a_per_w) + ")\n";
  }
  if (b.measurand) {
    const MeasurandBlock& m = *b.measurand;
    out += "  in the measurand       " + Printf("%.4g ", m.input_referred_rms) +
           m.unit + " rms, " +
           Printf("%.4g ", m.input_referred_density_at_reference) + m.unit +
           kPerRtHz + " at " + ref + " (" +
           FormatEng(m.sensitivity, m.sensitivity_unit) + " per " + m.unit +
           ")\n";
  }
  if (b.photodiode && b.photodiode->noise_gain_plateau_estimate > 0) {
    out += "  e_n x C                " +
           (b.noise_gain_flat
                ? std::string("the e_n noise gain stays flat")
                : "the e_n noise gain rises to " + Gain(b.noise_gain_peak) +
                      " at " + FormatEng(b.noise_gain_peak_hz, "Hz")) +
           " (1 + C/C_f = " + Gain(b.photodiode->noise_gain_plateau_estimate) +
           " with C = C_d + C_in = " +
           FormatEng(b.photodiode->input_capacitance_f, "F") + ")\n";
  }
  if (b.charge && !ChargeNoiseGainText(b).empty())
    out += "  e_n x C                " + ChargeNoiseGainText(b) + "\n";
  if (b.photodiode && b.photodiode->tee_noise_equivalent_ohm > 0)
    out += "  T network noise        as noisy as one " +
           FormatEng(b.photodiode->tee_noise_equivalent_ohm, "\xCE\xA9") +
           " feedback resistor (its noise-equivalent resistance; the "
           "transimpedance is " +
           FormatEng(std::fabs(b.signal_gain_dc), "\xCE\xA9") + ")\n";
  if (b.snr_db) {
    out += "  full scale             \xC2\xB1" +
           FormatEng(*b.full_scale_output_v, "V") + ": SNR " +
           Printf("%.1f dB", *b.snr_db) + " (full-scale sine), dynamic range " +
           Printf("%.1f dB", *b.dynamic_range_db) + " (swing / noise p-p)\n";
    if (b.full_scale_output_current_a)
      out += "  output drive           " +
             FormatEng(*b.full_scale_output_current_a, "A") +
             " at full scale (limit " +
             FormatEng(b.output_current_limit_a, "A") + ")\n";
  }
  return out;
}

std::string OffsetSection(const Budget& b) {
  const OffsetBlock& o = b.offset;
  std::string out = "\nOutput offset at DC\n" + RenderText(OffsetTable(b));
  out += "  R_plus " +
         (o.plus_resistor_ohm > 0 ? FormatEng(o.plus_resistor_ohm, "\xCE\xA9")
                                  : std::string("none (+ input grounded)")) +
         "; the value that cancels the Ib term is " +
         FormatEng(o.balance_resistor_ohm, "\xCE\xA9") + "\n";
  // The signal's own DC level is no offset, but it takes output swing.
  for (const DcOutputTerm& term : b.dc_outputs)
    if (term.name != "I_dark")
      out += "  DC output of " + term.name + " " + FormatEng(term.volts, "V") +
             " (the input's DC level, not an offset)\n";
  return out;
}

std::string TeeSection(const Budget& b) {
  const TeeComparison& c = *b.tee;
  std::string out = "\nT network against one resistor of the same " +
                    FormatEng(c.equivalent_resistance_ohm, "\xCE\xA9") + "\n";
  out += RenderText(TeeSummaryTable(b));
  out += Printf("  noise cost of the T network: x%.3f in output noise",
                c.noise_cost_ratio) +
         Printf(" (%+.2f dB)\n", 20.0 * std::log10(c.noise_cost_ratio));

  out += "\n" + RenderText(TeeChangesTable(b));
  return out;
}

std::string TeePiSection(const Budget& b) {
  std::string out =
      "\nT network as its pi equivalent (star-mesh, S = R1 R2 + R2 R3 + "
      "R3 R1)\n";
  out += RenderText(TeePiTable(b));
  for (const auto& [label, text] : TeePiSentences(b))
    out += "  " + label + ": " + text + "\n";
  return out;
}

std::string ChainSection(const Budget& b) {
  std::string out = "\nSignal chain to the converter: " + ChainTitle(b) + "\n";
  out += RenderText(ChainTable(b, ChainCells::kDisplay));
  for (const auto& [label, text] : ChainNotes(b)) {
    std::string padded = "  " + label;
    padded.resize(std::max<std::size_t>(padded.size() + 1, 25), ' ');
    out += padded + text + "\n";
  }
  return out;
}

std::string SensitivitySection(const Budget& b) {
  std::string out = "\nWhich part to change: d ln F / d ln x, largest first\n";
  out += RenderText(SensitivityTable(b));
  for (const auto& [label, text] : SensitivityNotes(b))
    out += "  " + label + ": " + text + "\n";
  return out;
}

}  // namespace

std::string BudgetToText(const Budget& b) {
  std::string out = Header(b) + NoiseSection(b) + OffsetSection(b);
  out += RealPartsText(b);
  if (b.tee) out += TeeSection(b);
  if (b.tee_pi) out += TeePiSection(b);
  if (b.sensitivity) out += SensitivitySection(b);
  if (b.chain) out += ChainSection(b);
  for (const std::string& w : b.warnings) out += "\nwarning: " + w + "\n";
  return out;
}

}  // namespace hushgain

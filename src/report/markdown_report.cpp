#include "report/markdown_report.h"

#include <cmath>
#include <cstdio>

#include "base/physical_constants.h"
#include "base/printf.h"
#include "io/units.h"
#include "report/budget_tables.h"
#include "report/chain_tables.h"
#include "report/table.h"
#include "report/text_escape.h"

namespace hushgain {
namespace {

std::string MarkdownHeader(const Budget& b) {
  const std::string ref = FormatEng(b.reference_hz, "Hz");
  std::string out = "## Noise budget: " + EscapeMarkdown(b.stage_name) + "\n\n";
  out += MarkdownItem("temperature",
                      Printf("%.2f", b.temperature_k - kZeroCelsiusK) +
                          " \xC2\xB0"
                          "C (" +
                          Printf("%.2f", b.temperature_k) + " K)");
  out += MarkdownItem("band", FormatEng(b.band_low_hz, "Hz") + " to " +
                                  FormatEng(b.band_high_hz, "Hz") +
                                  ", reference " + ref);
  out += MarkdownItem("op-amp", b.opamp_class + ", GBW " +
                                    FormatEng(b.opamp_gbw_hz, "Hz") + ", A0 " +
                                    Printf("%.3g", b.opamp_open_loop_gain));
  if (b.charge) {
    out += MarkdownItem("charge gain", ChargeGainText(b));
    out += MarkdownItem("sensor", ChargeSensorText(b));
  } else if (b.input_unit == "A")
    out += MarkdownItem(
        "transimpedance",
        FormatEng(b.signal_gain_dc, "\xCE\xA9") + " at DC, magnitude " +
            FormatEng(b.signal_gain_ref, "\xCE\xA9") + " at " + ref);
  else
    out += MarkdownItem(
        "signal gain", FormatGain(b.signal_gain_dc) + " V/V at DC, magnitude " +
                           FormatGain(b.signal_gain_ref) + " at " + ref);
  out += MarkdownItem(
      "noise gain (e_n to output)",
      FormatGain(b.noise_gain_dc) + " at DC, " + FormatGain(b.noise_gain_ref) +
          " at " + ref +
          (b.noise_gain_flat
               ? std::string(", flat (no peak above DC)")
               : ", peak " + FormatGain(b.noise_gain_peak) + " at " +
                     FormatEng(b.noise_gain_peak_hz, "Hz")));
  out += MarkdownItem("closed-loop -3 dB bandwidth", BandwidthText(b));
  if (b.loop.crossover_found)
    out += MarkdownItem(
        "loop gain", "crosses unity at " +
                         FormatEng(b.loop.crossover_hz, "Hz") +
                         ", phase margin " +
                         Printf("%.1f", b.loop.phase_margin_deg) + "\xC2\xB0");
  if (b.feedback_capacitor_f > 0 || b.capacitor_choice)
    out += MarkdownItem(
        "feedback capacitor",
        FormatEng(b.feedback_capacitor_f, "F") +
            (b.capacitor_choice
                 ? " (chosen for " + b.capacitor_choice->target +
                       "; the estimate " + b.capacitor_choice->estimate_rule +
                       " gives " +
                       FormatEng(b.capacitor_choice->estimate_f, "F") + ")"
                 : std::string()));
  if (b.ac_coupling)
    for (const std::string& line : AcCouplingTexts(b))
      out += MarkdownItem("AC coupling", line);
  return out;
}

std::string MarkdownNoiseSection(const Budget& b) {
  const std::string ref = FormatEng(b.reference_hz, "Hz", 3);
  std::string out = "\n### Output noise, " + FormatEng(b.band_low_hz, "Hz") +
                    " to " + FormatEng(b.band_high_hz, "Hz") + "\n\n";
  out += RenderMarkdown(ContributorTable(b)) + "\n";
  out += MarkdownItem(
      "output peak-to-peak",
      FormatEng(b.output_peak_to_peak_v, "V") +
          " (6.6 x rms: inside about 99.9 % of the time, Gaussian)");
  out += MarkdownItem(
      "input-referred",
      FormatEng(b.input_rms, b.input_unit) + " rms, " +
          FormatDensity(b.input_density_ref_per_rthz, b.input_unit) + " at " +
          ref);
  if (b.charge)
    out += MarkdownItem("input-referred charge", ChargeNoiseText(b));
  if (const std::string note = InputRmsNote(b); !note.empty())
    out += MarkdownItem("note", note);
  if (b.photodiode && b.photodiode->responsivity_a_per_w > 0)
    out += MarkdownItem(
        "NEP",
        FormatDensity(b.photodiode->nep_w_per_rthz, "W") + " at " + ref + ", " +
            FormatEng(b.photodiode->nep_rms_w, "W") + " rms over the band (" +
            Printf("%.3g A/W", b.photodiode->responsivity_a_per_w) + ")");
  if (b.measurand) {
    const MeasurandBlock& m = *b.measurand;
    out += MarkdownItem(
        "in the measurand",
        Printf("%.4g ", m.input_referred_rms) + m.unit + " rms, " +
            Printf("%.4g ", m.input_referred_density_at_reference) + m.unit +
            "/\xE2\x88\x9AHz at " + ref + " (" +
            FormatEng(m.sensitivity, m.sensitivity_unit) + " per " + m.unit +
            ")");
  }
  if (b.photodiode && b.photodiode->noise_gain_plateau_estimate > 0)
    out += MarkdownItem(
        "e_n x C",
        (b.noise_gain_flat
             ? std::string("the e_n noise gain stays flat")
             : "the e_n noise gain rises to " + FormatGain(b.noise_gain_peak) +
                   " at " + FormatEng(b.noise_gain_peak_hz, "Hz")) +
            " (1 + C/C_f = " +
            FormatGain(b.photodiode->noise_gain_plateau_estimate) +
            " with C = C_d + C_in = " +
            FormatEng(b.photodiode->input_capacitance_f, "F") + ")");
  if (b.charge && !ChargeNoiseGainText(b).empty())
    out += MarkdownItem("e_n x C", ChargeNoiseGainText(b));
  if (b.photodiode && b.photodiode->tee_noise_equivalent_ohm > 0)
    out += MarkdownItem(
        "T network noise",
        "as noisy as one " +
            FormatEng(b.photodiode->tee_noise_equivalent_ohm, "\xCE\xA9") +
            " feedback resistor (its noise-equivalent resistance; "
            "the transimpedance is " +
            FormatEng(std::fabs(b.signal_gain_dc), "\xCE\xA9") + ")");
  if (b.snr_db) {
    out += MarkdownItem(
        "full scale \xC2\xB1" + FormatEng(*b.full_scale_output_v, "V"),
        "SNR " + Printf("%.1f dB", *b.snr_db) +
            " (full-scale sine), dynamic range " +
            Printf("%.1f dB", *b.dynamic_range_db) + " (swing / noise p-p)");
    if (b.full_scale_output_current_a)
      out += MarkdownItem("output drive",
                          FormatEng(*b.full_scale_output_current_a, "A") +
                              " at full scale (limit " +
                              FormatEng(b.output_current_limit_a, "A") + ")");
  }
  return out;
}

std::string MarkdownOffsetSection(const Budget& b) {
  const OffsetBlock& o = b.offset;
  std::string out = "\n### Output offset at DC\n\n";
  out += RenderMarkdown(OffsetTable(b)) + "\n";
  out += MarkdownItem("R_plus", o.plus_resistor_ohm > 0
                                    ? FormatEng(o.plus_resistor_ohm, "\xCE\xA9")
                                    : std::string("none (+ input grounded)"));
  out += MarkdownItem("R_plus that cancels the Ib term",
                      FormatEng(o.balance_resistor_ohm, "\xCE\xA9"));
  for (const DcOutputTerm& term : b.dc_outputs)
    if (term.name != "I_dark")
      out += MarkdownItem("DC output of " + term.name,
                          FormatEng(term.volts, "V") +
                              " (the input's DC level, not an offset)");
  return out;
}

std::string MarkdownTeeSection(const Budget& b) {
  const TeeComparison& c = *b.tee;
  std::string out = "\n### T network against one resistor of the same " +
                    FormatEng(c.equivalent_resistance_ohm, "\xCE\xA9") + "\n\n";
  out += RenderMarkdown(TeeSummaryTable(b)) + "\n";
  out += MarkdownItem(
      "noise cost of the T network",
      Printf("x%.3f in output noise", c.noise_cost_ratio) +
          Printf(" (%+.2f dB)", 20.0 * std::log10(c.noise_cost_ratio)));
  out += "\n" + RenderMarkdown(TeeChangesTable(b));
  return out;
}

std::string MarkdownTeePiSection(const Budget& b) {
  std::string out =
      "\n### T network as its pi equivalent (star-mesh, S = R1 R2 + R2 R3 "
      "+ R3 R1)\n\n";
  out += RenderMarkdown(TeePiTable(b)) + "\n";
  for (const auto& [label, text] : TeePiSentences(b))
    out += MarkdownItem(label, text);
  return out;
}

std::string MarkdownChainSection(const Budget& b) {
  std::string out =
      "\n### Signal chain to the converter: " + EscapeMarkdown(ChainTitle(b)) +
      "\n\n";
  out += RenderMarkdown(ChainTable(b, ChainCells::kDisplay)) + "\n";
  for (const auto& [label, text] : ChainNotes(b))
    out += MarkdownItem(label, text);
  return out;
}

std::string MarkdownSensitivitySection(const Budget& b) {
  std::string out =
      "\n### Which part to change: d ln F / d ln x, largest first\n\n";
  out += RenderMarkdown(SensitivityTable(b)) + "\n";
  for (const auto& [label, text] : SensitivityNotes(b))
    out += MarkdownItem(label, text);
  return out;
}

}  // namespace

std::string BudgetToMarkdown(const Budget& b) {
  std::string out =
      MarkdownHeader(b) + MarkdownNoiseSection(b) + MarkdownOffsetSection(b);
  if (b.tee) out += MarkdownTeeSection(b);
  if (b.tee_pi) out += MarkdownTeePiSection(b);
  if (b.sensitivity) out += MarkdownSensitivitySection(b);
  if (b.chain) out += MarkdownChainSection(b);
  for (const std::string& w : b.warnings)
    out += "\n> warning: " + EscapeMarkdown(w) + "\n";
  return out;
}

}  // namespace hushgain

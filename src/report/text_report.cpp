#include "report/text_report.h"

#include <cmath>
#include <cstdio>

#include "io/units.h"
#include "noise/physical_constants.h"
#include "report/real_parts_text.h"
#include "report/table.h"

namespace hushgain {
namespace {

constexpr const char* kPerRtHz = "/\xE2\x88\x9AHz";  // "/√Hz"

std::string Printf(const char* format, double value) {
  char buf[64];
  std::snprintf(buf, sizeof buf, format, value);
  return buf;
}

std::string Percent(double fraction) {
  if (fraction > 0 && fraction < 0.0005) return "<0.1 %";
  return Printf("%.1f %%", 100.0 * fraction);
}

std::string Gain(double value) { return Printf("%.4g", value); }

std::string KindLabel(const std::string& kind) {
  if (kind == "voltage_noise") return "op-amp e_n";
  if (kind == "current_noise") return "op-amp i_n";
  if (kind == "excess") return "excess 1/f";
  return kind;
}

std::string Density(double value, const std::string& unit) {
  return FormatEng(value, unit + kPerRtHz);
}

std::string ChangeLabel(const TeeChange& c) {
  switch (c.kind) {
    case TeeChange::Kind::kAdded:
      return "added by the tee";
    case TeeChange::Kind::kRemoved:
      return "replaced by the tee";
    case TeeChange::Kind::kRaised:
      return Printf("raised x%.3f", c.tee_output_rms_v / c.plain_output_rms_v);
    case TeeChange::Kind::kLowered:
      return Printf("lowered x%.3f", c.tee_output_rms_v / c.plain_output_rms_v);
    case TeeChange::Kind::kSame:
      return "unchanged";
  }
  return "";
}

std::string Header(const Budget& b) {
  std::string out = b.stage_name + "\n";
  out += "  temperature " + Printf("%.2f", b.temperature_k - kZeroCelsiusK) +
         " \xC2\xB0"
         "C (" +
         Printf("%.2f", b.temperature_k) + " K), band " +
         FormatEng(b.band_low_hz, "Hz") + " to " +
         FormatEng(b.band_high_hz, "Hz") + ", reference " +
         FormatEng(b.reference_hz, "Hz") + "\n";
  out += "  op-amp " + b.opamp_class + ", GBW " + FormatEng(b.opamp_gbw_hz, "Hz") + ", A0 " +
         Printf("%.3g", b.opamp_open_loop_gain) + "\n";
  if (b.input_unit == "A") {
    out += "  transimpedance " + FormatEng(b.signal_gain_dc, "\xCE\xA9") + " at DC, |" +
           FormatEng(b.signal_gain_ref, "\xCE\xA9") + "| at the reference\n";
  } else {
    out += "  signal gain " + Gain(b.signal_gain_dc) + " V/V at DC, |" + Gain(b.signal_gain_ref) +
           "| at the reference\n";
  }
  out += "  noise gain (e_n to output) " + Gain(b.noise_gain_dc) + " at DC, " +
         Gain(b.noise_gain_ref) + " at the reference, peak " + Gain(b.noise_gain_peak) + " at " +
         FormatEng(b.noise_gain_peak_hz, "Hz") + "\n";
  out += "  closed-loop -3 dB bandwidth " +
         (b.bandwidth_3db_hz > 0 ? FormatEng(b.bandwidth_3db_hz, "Hz") : std::string("not found")) +
         (b.peaking_db > 0.01
              ? ", peaking " + Printf("%.2f dB", b.peaking_db) + " at " + FormatEng(b.peak_hz, "Hz")
              : "") +
         "\n";
  if (b.loop.crossover_found)
    out += "  loop gain crosses unity at " + FormatEng(b.loop.crossover_hz, "Hz") +
           ", phase margin " + Printf("%.1f", b.loop.phase_margin_deg) + "\xC2\xB0\n";
  if (b.feedback_capacitor_f > 0 || b.capacitor_choice)
    out += "  feedback capacitor " + FormatEng(b.feedback_capacitor_f, "F") +
           (b.capacitor_choice ? " (chosen for " + b.capacitor_choice->target + "; the estimate " +
                                     b.capacitor_choice->estimate_rule + " gives " +
                                     FormatEng(b.capacitor_choice->estimate_f, "F") + ")"
                               : std::string()) +
           "\n";
  return out;
}

std::string NoiseSection(const Budget& b) {
  const std::string ref = FormatEng(b.reference_hz, "Hz", 3);
  Table t;
  t.header = {"contributor",
              "kind",
              "source @ " + ref,
              "gain @ " + ref,
              "output @ " + ref,
              "output rms",
              "share"};
  t.align = {Table::Align::kLeft,  Table::Align::kLeft,  Table::Align::kRight,
             Table::Align::kRight, Table::Align::kRight, Table::Align::kRight,
             Table::Align::kRight};
  for (const Contributor& c : b.contributors) {
    const bool current = c.kind == "current_noise" || c.kind == "shot";
    t.AddRow({c.name, KindLabel(c.kind),
              Density(c.source_density_ref, current ? "A" : "V"),
              current ? FormatEng(c.gain_to_output_ref, "\xCE\xA9")
                      : Gain(c.gain_to_output_ref),
              Density(c.output_density_ref_v_per_rthz, "V"),
              FormatEng(c.output_rms_v, "V"), Percent(c.share)});
  }
  t.AddRule();
  t.AddRow({"total", "", "", "", Density(b.output_density_ref_v_per_rthz, "V"),
            FormatEng(b.output_rms_v, "V"), "100 %"});

  std::string out = "\nNoise at the output, " + FormatEng(b.band_low_hz, "Hz") +
                    " to " + FormatEng(b.band_high_hz, "Hz") + "\n";
  out += RenderText(t);
  out += "  output peak-to-peak    " + FormatEng(b.output_peak_to_peak_v, "V") +
         "  (6.6 x rms: inside about 99.9 % of the time, Gaussian)\n";
  out += "  input-referred         " + FormatEng(b.input_rms, b.input_unit) +
         " rms, " + Density(b.input_density_ref_per_rthz, b.input_unit) +
         " at " + ref + "\n";
  if (b.photodiode && b.photodiode->responsivity_a_per_w > 0) {
    out += "  NEP                    " + FormatEng(b.photodiode->nep_w_per_rthz, std::string("W") + kPerRtHz) +
           " at " + ref + ", " + FormatEng(b.photodiode->nep_rms_w, "W") + " rms over the band (" +
           Printf("%.3g A/W", b.photodiode->responsivity_a_per_w) + ")\n";
  }
  if (b.photodiode && b.photodiode->noise_gain_plateau_estimate > 0) {
    out += "  e_n x C                the e_n noise gain rises to " + Gain(b.noise_gain_peak) + " at " +
           FormatEng(b.noise_gain_peak_hz, "Hz") + " (1 + C/C_f = " +
           Gain(b.photodiode->noise_gain_plateau_estimate) + " with C = C_d + C_in = " +
           FormatEng(b.photodiode->input_capacitance_f, "F") + ")\n";
  }
  if (b.snr_db) {
    out += "  full scale             \xC2\xB1" +
           FormatEng(*b.full_scale_output_v, "V") + ": SNR " +
           Printf("%.1f dB", *b.snr_db) + " (full-scale sine), dynamic range " +
           Printf("%.1f dB", *b.dynamic_range_db) + " (swing / noise p-p)\n";
  }
  return out;
}

std::string OffsetSection(const Budget& b) {
  const OffsetBlock& o = b.offset;
  Table t;
  t.header = {"term", "output"};
  t.align = {Table::Align::kLeft, Table::Align::kRight};
  t.AddRow({"Vos x noise gain (" + Gain(o.noise_gain_dc) + ")",
            FormatEng(o.vos_v, "V")});
  t.AddRow({"Ib into both inputs", FormatEng(o.ib_v, "V")});
  t.AddRow({"Ios (sign unknown)", FormatEng(o.ios_v, "V")});
  if (b.photodiode) t.AddRow({"dark current x transimpedance", FormatEng(o.dark_v, "V")});
  t.AddRule();
  t.AddRow({"worst case", FormatEng(o.worst_case_v, "V")});
  t.AddRow({"root-sum-square", FormatEng(o.rss_v, "V")});
  std::string out = "\nOutput offset at DC\n" + RenderText(t);
  out += "  R_plus " +
         (o.plus_resistor_ohm > 0 ? FormatEng(o.plus_resistor_ohm, "\xCE\xA9")
                                  : std::string("none (+ input grounded)")) +
         "; the value that cancels the Ib term is " +
         FormatEng(o.balance_resistor_ohm, "\xCE\xA9") + "\n";
  return out;
}

std::string TeeSection(const Budget& b) {
  const TeeComparison& c = *b.tee;
  std::string out = "\nT network against one resistor of the same " +
                    FormatEng(c.equivalent_resistance_ohm, "\xCE\xA9") + "\n";
  Table t;
  t.header = {"", "T network", "plain R_f", "ratio"};
  t.align = {Table::Align::kLeft, Table::Align::kRight, Table::Align::kRight,
             Table::Align::kRight};
  auto ratio = [](double a, double p) {
    return p != 0 ? Printf("x%.3f", a / p) : std::string("");
  };
  t.AddRow({"output noise rms", FormatEng(b.output_rms_v, "V"),
            FormatEng(c.plain_output_rms_v, "V"),
            ratio(b.output_rms_v, c.plain_output_rms_v)});
  t.AddRow({"input-referred rms", FormatEng(b.input_rms, b.input_unit),
            FormatEng(c.plain_input_rms, b.input_unit),
            ratio(b.input_rms, c.plain_input_rms)});
  t.AddRow({"e_n noise gain, DC", Gain(c.tee_noise_gain_dc),
            Gain(c.plain_noise_gain_dc),
            ratio(c.tee_noise_gain_dc, c.plain_noise_gain_dc)});
  t.AddRow({"e_n noise gain, reference", Gain(c.tee_noise_gain_ref),
            Gain(c.plain_noise_gain_ref),
            ratio(c.tee_noise_gain_ref, c.plain_noise_gain_ref)});
  t.AddRow({"-3 dB bandwidth", FormatEng(b.bandwidth_3db_hz, "Hz"),
            FormatEng(c.plain_bandwidth_3db_hz, "Hz"),
            ratio(b.bandwidth_3db_hz, c.plain_bandwidth_3db_hz)});
  t.AddRow({"offset, worst case", FormatEng(b.offset.worst_case_v, "V"),
            FormatEng(c.plain_offset_worst_case_v, "V"),
            ratio(b.offset.worst_case_v, c.plain_offset_worst_case_v)});
  out += RenderText(t);
  out += Printf("  noise cost of the T network: x%.3f in output noise",
                c.noise_cost_ratio) +
         Printf(" (%+.2f dB)\n", 20.0 * std::log10(c.noise_cost_ratio));

  Table changes;
  changes.header = {"contributor", "T network", "plain R_f", "change"};
  changes.align = {Table::Align::kLeft, Table::Align::kRight,
                   Table::Align::kRight, Table::Align::kLeft};
  for (const TeeChange& ch : c.changes) {
    changes.AddRow({ch.name,
                    ch.kind == TeeChange::Kind::kRemoved
                        ? "-"
                        : FormatEng(ch.tee_output_rms_v, "V"),
                    ch.kind == TeeChange::Kind::kAdded
                        ? "-"
                        : FormatEng(ch.plain_output_rms_v, "V"),
                    ChangeLabel(ch)});
  }
  out += "\n" + RenderText(changes);
  return out;
}

}  // namespace

std::string BudgetToText(const Budget& b) {
  std::string out = Header(b) + NoiseSection(b) + OffsetSection(b);
  out += RealPartsText(b);
  if (b.tee) out += TeeSection(b);
  for (const std::string& w : b.warnings) out += "\nwarning: " + w + "\n";
  return out;
}

}  // namespace hushgain

#include "report/budget_tables.h"

#include <cmath>
#include <cstdio>

#include "base/physical_constants.h"
#include "base/printf.h"
#include "io/units.h"
#include "report/enum_words.h"
#include "report/unit_symbols.h"

namespace hushgain {
namespace {

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

}  // namespace

std::string FormatGain(double value) { return Printf("%.4g", value); }

std::string FormatOhms(double ohms) { return FormatEng(ohms, kOhm); }

std::string FormatDensity(double value, const std::string& unit) {
  return FormatEng(value, unit + kPerRtHz);
}

std::string FormatShare(double fraction) {
  if (fraction > 0 && fraction < 0.0005) return "<0.1 %";
  return Printf("%.1f %%", 100.0 * fraction);
}

Table ContributorTable(const Budget& b) {
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
  // Negligible excess contributors share one row: a table of a dozen
  // "<0.1 %" excess lines hides the ones that matter.
  int folded = 0;
  double folded_power = 0, folded_share = 0;
  for (const Contributor& c : b.contributors) {
    if (c.kind == NoiseKind::kExcess && c.share < kNegligibleExcessShare) {
      ++folded;
      folded_power += c.output_rms_v * c.output_rms_v;
      folded_share += c.share;
      continue;
    }
    const bool current = IsCurrentNoise(c.kind);
    t.AddRow({c.name, NoiseKindLabel(c.kind),
              FormatDensity(c.source_density_ref, current ? "A" : "V"),
              current ? FormatEng(c.gain_to_output_ref, kOhm)
                      : FormatGain(c.gain_to_output_ref),
              FormatDensity(c.output_density_ref_v_per_rthz, "V"),
              FormatEng(c.output_rms_v, "V"), FormatShare(c.share)});
  }
  if (folded > 0)
    t.AddRow({"other excess (" + std::to_string(folded) + ")",
              NoiseKindLabel(NoiseKind::kExcess), "", "", "",
              FormatEng(std::sqrt(folded_power), "V"),
              FormatShare(folded_share)});
  t.AddRule();
  t.AddRow({"total", "", "", "",
            FormatDensity(b.output_density_ref_v_per_rthz, "V"),
            FormatEng(b.output_rms_v, "V"), "100 %"});
  return t;
}

Table OffsetTable(const Budget& b) {
  const OffsetBlock& o = b.offset;
  Table t;
  t.header = {"term", "output"};
  t.align = {Table::Align::kLeft, Table::Align::kRight};
  t.AddRow({"Vos x noise gain (" + FormatGain(o.noise_gain_dc) + ")",
            FormatEng(o.vos_v, "V")});
  t.AddRow({"Ib into both inputs", FormatEng(o.ib_v, "V")});
  t.AddRow({"Ios (sign unknown)", FormatEng(o.ios_v, "V")});
  if (b.photodiode)
    t.AddRow({"dark current x transimpedance", FormatEng(o.dark_v, "V")});
  t.AddRule();
  t.AddRow({"worst case", FormatEng(o.worst_case_v, "V")});
  t.AddRow({"root-sum-square", FormatEng(o.rss_v, "V")});
  return t;
}

Table TeeSummaryTable(const Budget& b) {
  const TeeComparison& c = *b.tee;
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
  t.AddRow({"e_n noise gain, DC", FormatGain(c.tee_noise_gain_dc),
            FormatGain(c.plain_noise_gain_dc),
            ratio(c.tee_noise_gain_dc, c.plain_noise_gain_dc)});
  t.AddRow({"e_n noise gain, reference", FormatGain(c.tee_noise_gain_ref),
            FormatGain(c.plain_noise_gain_ref),
            ratio(c.tee_noise_gain_ref, c.plain_noise_gain_ref)});
  t.AddRow({"-3 dB bandwidth", FormatEng(b.bandwidth_3db_hz, "Hz"),
            FormatEng(c.plain_bandwidth_3db_hz, "Hz"),
            ratio(b.bandwidth_3db_hz, c.plain_bandwidth_3db_hz)});
  t.AddRow({"offset, worst case", FormatEng(b.offset.worst_case_v, "V"),
            FormatEng(c.plain_offset_worst_case_v, "V"),
            ratio(b.offset.worst_case_v, c.plain_offset_worst_case_v)});
  return t;
}

Table TeePiTable(const Budget& b) {
  const TeePiBlock& pi = *b.tee_pi;
  const std::string ohm = "\xCE\xA9";
  Table t;
  t.header = {"pi arm", "value", "between", "current"};
  t.align = {Table::Align::kLeft, Table::Align::kRight, Table::Align::kLeft,
             Table::Align::kLeft};
  t.AddRow({"bridge S/R3", FormatEng(pi.arms.bridge_ohm, ohm),
            "summing node and output", "the feedback current"});
  auto fraction = [](const TeePiBlock::ArmFraction& a) {
    return Printf("%.3g", a.fraction) + " at " +
           (a.f_hz > 0 ? FormatEng(a.f_hz, "Hz", 3) : std::string("DC"));
  };
  t.AddRow({"input arm S/R2", FormatEng(pi.arms.input_arm_ohm, ohm),
            "summing node and ground",
            fraction(pi.fraction_at_dc) + ", " +
                fraction(pi.fraction_at_reference) + ", " +
                fraction(pi.fraction_at_band_high) + " of the bridge's"});
  std::string load = "-";
  if (pi.output_arm_current_a) {
    load = FormatEng(*pi.output_arm_current_a, "A") + " at full scale";
    if (pi.output_arm_share)
      load += " (" + FormatShare(*pi.output_arm_share) +
              " of the op-amp's output current)";
  }
  t.AddRow({"output arm S/R1", FormatEng(pi.arms.output_arm_ohm, ohm),
            "output and ground", load});
  return t;
}

std::vector<std::pair<std::string, std::string>> TeePiSentences(
    const Budget& b) {
  const TeePiBlock& pi = *b.tee_pi;
  std::vector<std::pair<std::string, std::string>> out;
  if (b.ac_coupling && b.ac_coupling->c3_f > 0)
    out.push_back(
        {"why the T costs noise gain",
         "the input arm sits at the virtual ground, so it carries almost no "
         "signal current, but to e_n it is a second resistor from the summing "
         "node to ground: in the band (above 1/(2 pi R3 C3)) the noise gain "
         "1 + Req/R_a + R2/R3 carries R2/R3 = " +
             FormatGain(pi.input_arm_noise_gain) +
             " beyond the plain resistor's 1 + Req/R_a; at DC C3 opens the "
             "arm, so Vos sees 1 + (R1 + R2)/R_a (this stage: " +
             FormatGain(b.noise_gain_dc) +
             "); the output arm is only a load and adds no noise gain"});
  else
    out.push_back(
        {"why the T costs noise gain",
         "the input arm sits at the virtual ground, so it carries almost no "
         "signal current (the fraction above is about (R2/R3) / |1 + A(f)|), "
         "but to e_n and Vos it is a second resistor from the summing node to "
         "ground: the DC noise gain 1 + Req/R_a + R2/R3 carries R2/R3 = " +
             FormatGain(pi.input_arm_noise_gain) +
             " beyond the plain resistor's 1 + Req/R_a (this stage: " +
             FormatGain(b.noise_gain_dc) +
             "); the output arm is only a load and adds no noise gain"});
  if (!b.photodiode)
    out.push_back({"noise-equivalent resistance",
                   "the T network is as noisy as one " +
                       FormatEng(pi.noise_equivalent_ohm, "\xCE\xA9") +
                       " resistor at the summing node"});
  return out;
}

Table SensitivityTable(const Budget& b) {
  Table t;
  t.header = {"parameter", "value", "noise", "offset", "bandwidth", "gain"};
  t.align = {Table::Align::kLeft,  Table::Align::kRight, Table::Align::kRight,
             Table::Align::kRight, Table::Align::kRight, Table::Align::kRight};
  auto s = [](const std::optional<double>& v) {
    return v ? Printf("%+.4f", *v) : std::string("-");
  };
  for (const SensitivityRow& r : b.sensitivity->rows) {
    const std::string unit = r.unit == "ohm"      ? std::string(kOhm)
                             : r.unit == "V/rtHz" ? "V" + std::string(kPerRtHz)
                             : r.unit == "A/rtHz" ? "A" + std::string(kPerRtHz)
                             : r.unit == "V/V"    ? std::string("")
                                                  : r.unit;
    t.AddRow(
        {r.parameter,
         r.unit == "V/V" ? Printf("%.4g", r.value) : FormatEng(r.value, unit),
         Printf("%+.4f", r.noise), s(r.offset), s(r.bandwidth), s(r.gain)});
  }
  return t;
}

std::vector<std::pair<std::string, std::string>> SensitivityNotes(
    const Budget& b) {
  const SensitivityBlock& s = *b.sensitivity;
  std::vector<std::pair<std::string, std::string>> out;
  if (!s.advice_parameter.empty()) {
    const double change = s.advice_noise_ratio - 1;
    out.push_back({"the change that pays most",
                   std::string(s.advice_factor < 1 ? "halving " : "doubling ") +
                       s.advice_parameter +
                       (change < 0 ? " lowers" : " raises") +
                       " the output noise by " +
                       Printf("%.1f %%", 100 * std::fabs(change)) +
                       " (a whole budget of the changed stage; among the "
                       "parts that do not set the gain)"});
  }
  out.push_back(
      {"how",
       "d ln F / d ln x by central differences in ln x (steps " +
           Printf("%g", s.step) + " and " + Printf("%g", 2 * s.step) +
           ", Richardson), the noise on the budget's own integration nodes; "
           "largest estimated error " +
           Printf("%.1g", s.largest_error) +
           "; a 1 % rise of x moves F by about s %"});
  return out;
}

Table TeeChangesTable(const Budget& b) {
  Table t;
  t.header = {"contributor", "T network", "plain R_f", "change"};
  t.align = {Table::Align::kLeft, Table::Align::kRight, Table::Align::kRight,
             Table::Align::kLeft};
  for (const TeeChange& ch : b.tee->changes) {
    t.AddRow({ch.name,
              ch.kind == TeeChange::Kind::kRemoved
                  ? "-"
                  : FormatEng(ch.tee_output_rms_v, "V"),
              ch.kind == TeeChange::Kind::kAdded
                  ? "-"
                  : FormatEng(ch.plain_output_rms_v, "V"),
              ChangeLabel(ch)});
  }
  return t;
}

std::string BandwidthText(const Budget& b) {
  const std::string high = b.bandwidth_3db_hz > 0
                               ? FormatEng(b.bandwidth_3db_hz, "Hz")
                               : std::string("not found");
  std::string out;
  if (b.blocks_dc) {
    out = (b.bandwidth_low_hz > 0 ? FormatEng(b.bandwidth_low_hz, "Hz")
                                  : std::string("not found")) +
          " to " + high + " (against the in-band gain " +
          FormatGain(b.passband_gain) + ")";
  } else {
    out = high + " (against the DC gain)";
  }
  if (b.peaking_db > 0.01)
    out += ", peaking " + Printf("%.2f dB", b.peaking_db) + " at " +
           FormatEng(b.peak_hz, "Hz");
  return out;
}

std::vector<std::string> AcCouplingTexts(const Budget& b) {
  const AcCouplingBlock& a = *b.ac_coupling;
  std::vector<std::string> out;
  if (a.c3_f > 0)
    out.push_back("C3 " + FormatEng(a.c3_f, "F") +
                  " in series with R3: the T network's whole gain above "
                  "1/(2 pi R3 C3) = " +
                  FormatEng(a.shunt_corner_hz, "Hz") +
                  "; at DC the feedback is R1 + R2 = " +
                  FormatEng(a.feedback_dc_ohm, kOhm) + " (DC noise gain " +
                  FormatGain(b.noise_gain_dc) + ")");
  if (a.input_capacitor_f > 0) {
    std::string line = "C_input " + FormatEng(a.input_capacitor_f, "F") +
                       " in series with R_in: no DC passes";
    if (a.input_corner_hz > 0)
      line += "; 1/(2 pi (R_source + R_in) C_input) = " +
              FormatEng(a.input_corner_hz, "Hz");
    out.push_back(line);
  }
  return out;
}

std::string FormatCharge(double coulombs) {
  if (coulombs != 0 && std::fabs(coulombs) < 1e-15)
    return Printf("%.4g aC", coulombs * 1e18);
  return FormatEng(coulombs, "C");
}

std::string FormatChargeGain(double v_per_c) {
  return Printf("%.4g mV/pC", v_per_c * 1e-9);
}

std::string ChargeGainText(const Budget& b) {
  const ChargeBlock& c = *b.charge;
  return FormatChargeGain(c.charge_gain_v_per_c) + " in the passband (|gain| " +
         FormatGain(b.passband_gain) +
         " V/V from the sensor's open-circuit voltage, C_s " +
         FormatEng(c.sensor_capacitance_f, "F") + "); " +
         FormatGain(b.signal_gain_ref) + " V/V at " +
         FormatEng(b.reference_hz, "Hz");
}

std::string ChargeSensorText(const Budget& b) {
  const ChargeBlock& c = *b.charge;
  std::string out =
      "C_s " + FormatEng(c.sensor_capacitance_f, "F") + ", " +
      (c.leakage_resistance_ohm > 0
           ? "leakage " + FormatEng(c.leakage_resistance_ohm, kOhm)
           : std::string("no leakage given")) +
      ", " +
      (c.input_resistor_ohm > 0
           ? "through R_in " + FormatEng(c.input_resistor_ohm, kOhm)
           : std::string("straight into the - input"));
  if (c.low_corner_estimate_hz > 0)
    out += std::string("; low corner 1/(2 pi ") +
           (c.feedback_is_tee ? "R_eq" : "R_f") +
           " C_f) = " + FormatEng(c.low_corner_estimate_hz, "Hz") +
           (c.feedback_is_tee ? " with the T network's R_eq " +
                                    FormatEng(c.feedback_dc_ohm, kOhm)
                              : std::string());
  return out;
}

std::string ChargeNoiseText(const Budget& b) {
  const ChargeBlock& c = *b.charge;
  return FormatCharge(c.input_rms_c) + " rms (" +
         Printf("%.4g", c.input_rms_c / kElementaryChargeC) + " electrons), " +
         FormatCharge(c.input_density_ref_c_per_rthz) + kPerRtHz + " at " +
         FormatEng(b.reference_hz, "Hz", 3) +
         " (the volts at the sensor x C_s)";
}

std::string ChargeNoiseGainText(const Budget& b) {
  const ChargeBlock& c = *b.charge;
  if (!(c.noise_gain_plateau_estimate > 0)) return "";
  return (b.noise_gain_flat
              ? std::string("the e_n noise gain stays flat")
              : "the e_n noise gain rises to " + FormatGain(b.noise_gain_peak) +
                    " at " + FormatEng(b.noise_gain_peak_hz, "Hz")) +
         " (1 + (C_s + C_in)/C_f = " +
         FormatGain(c.noise_gain_plateau_estimate) +
         " with C_s + C_in = " + FormatEng(c.input_capacitance_f, "F") + ")";
}

std::string InputRmsNote(const Budget& b) {
  const double a = b.input_rms, r = b.input_rms_at_reference_gain;
  if (!(a > 0) || std::fabs(a - r) <= kInputRmsDefinitionsDiffer * a) return "";
  return "the input-referred rms is the integral of the output density over "
         "|signal gain(f)|^2 (the noise an ideal source at the input would "
         "need); the gain is not flat over the band, so output rms / |gain| "
         "at the reference would say " +
         FormatEng(r, b.input_unit);
}

}  // namespace hushgain

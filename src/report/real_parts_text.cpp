#include "report/real_parts_text.h"

#include <algorithm>
#include <cmath>
#include <cstdio>

#include "base/physical_constants.h"
#include "base/printf.h"
#include "io/units.h"
#include "report/table.h"

namespace hushgain {
namespace {

std::string Percent(double fraction) {
  if (fraction > 0 && fraction < 0.0005) return "<0.1 %";
  return Printf("%.1f %%", 100.0 * fraction);
}

std::string Celsius(double kelvin) {
  return Printf("%.1f", kelvin - kZeroCelsiusK) +
         " \xC2\xB0"
         "C";
}

std::string TemperatureSection(const Budget& b) {
  const TemperatureBlock& t = *b.temperature;
  Table table;
  table.header = {"", Celsius(t.min.temperature_k),
                  Celsius(t.nominal.temperature_k),
                  Celsius(t.max.temperature_k)};
  table.align = {Table::Align::kLeft, Table::Align::kRight,
                 Table::Align::kRight, Table::Align::kRight};
  auto row = [&](const std::string& label, auto get) {
    table.AddRow({label, get(t.min), get(t.nominal), get(t.max)});
  };
  row("Vos x noise gain", [](const TemperatureCorner& c) {
    return FormatEng(c.offset.vos_v, "V");
  });
  row("Ib into both inputs",
      [](const TemperatureCorner& c) { return FormatEng(c.offset.ib_v, "V"); });
  row("Ios (sign unknown)", [](const TemperatureCorner& c) {
    return FormatEng(c.offset.ios_v, "V");
  });
  if (b.photodiode)
    row("dark current", [](const TemperatureCorner& c) {
      return FormatEng(c.offset.dark_v, "V");
    });
  row("offset, worst case", [](const TemperatureCorner& c) {
    return FormatEng(c.offset.worst_case_v, "V");
  });
  row("dominant offset term",
      [](const TemperatureCorner& c) { return c.offset_dominant; });
  table.AddRule();
  row("output noise rms", [](const TemperatureCorner& c) {
    return FormatEng(c.output_rms_v, "V");
  });
  row("dominant noise", [](const TemperatureCorner& c) {
    return c.noise_dominant + " (" + Percent(c.noise_dominant_share) + ")";
  });
  std::string out =
      "\nOver temperature (device values at 25 \xC2\xB0"
      "C; resistor tempco, Vos drift, "
      "the bias-current law and 4kT at each temperature)\n";
  out += RenderText(table);
  out += "  drift of the worst-case offset: " +
         FormatEng(t.drift_to_min_v_per_k,
                   "V/\xC2\xB0"
                   "C") +
         " toward the minimum, " +
         FormatEng(t.drift_to_max_v_per_k,
                   "V/\xC2\xB0"
                   "C") +
         " toward the maximum\n";
  return out;
}

std::string CompensationSection(const Budget& b) {
  const CompensationBlock& c = *b.compensation;
  const std::string ohm = "\xCE\xA9";
  std::string out =
      "\nBias-current compensation: R_plus = " + FormatEng(c.balance_ohm, ohm) +
      " (the DC resistance seen by the - input) cancels the Ib term\n";
  Table t;
  t.header = {"", "+ input grounded",
              "R_plus " + FormatEng(c.balance_ohm, ohm)};
  t.align = {Table::Align::kLeft, Table::Align::kRight, Table::Align::kRight};
  t.AddRow(
      {"Ib term", FormatEng(c.ib_without_v, "V"), FormatEng(c.ib_with_v, "V")});
  t.AddRow({"offset, worst case", FormatEng(c.offset_without_v, "V"),
            FormatEng(c.offset_with_v, "V")});
  t.AddRow({"output noise rms", FormatEng(c.noise_without_v, "V"),
            FormatEng(c.noise_with_v, "V")});
  out += RenderText(t);
  out += "  R_plus adds " + Percent(std::max(0.0, c.added_share)) +
         " of the output noise power (its 4kTR and i_n+ ride on the full noise "
         "gain)" +
         (c.bypass_f > 0 ? "; bypassed by " + FormatEng(c.bypass_f, "F")
                         : std::string()) +
         "\n";
  if (!c.worth_doing)
    out += "  not worth fitting: the Ib term is " +
           FormatEng(std::fabs(c.ib_without_v), "V") + " of the " +
           FormatEng(c.offset_without_v, "V") +
           " worst case, so R_plus lowers the offset by less than 10 %\n";
  if (c.noise_matters)
    out +=
        "  note: that is more than 10 %: a capacitor across R_plus (stage key "
        "\"plus_resistor_bypass\") shorts its noise above 1/(2 pi R_plus C) "
        "and keeps the DC "
        "balance\n";
  return out;
}

std::string ExcessSection(const Budget& b) {
  std::string out =
      "\nResistor DC drops (at the DC input level, with Vos, Ib and Ios) and "
      "excess noise\n";
  Table t;
  t.header = {"resistor", "technology", "noise index", "DC drop"};
  t.align = {Table::Align::kLeft, Table::Align::kLeft, Table::Align::kRight,
             Table::Align::kRight};
  for (const ResistorDrop& d : b.resistor_drops)
    t.AddRow({d.name, d.technology, Printf("%.0f dB", d.noise_index_db),
              FormatEng(d.v_dc, "V")});
  out += RenderText(t);
  if (b.excess_advice) {
    const ExcessAdvice& a = *b.excess_advice;
    out += "  largest excess noise: " + a.resistor + " (" + a.technology +
           ", " + Printf("%.0f dB", a.noise_index_db) + "), " +
           Percent(a.share) + " of the output noise power" +
           (a.share < 0.01 ? ": below 1 %, no upgrade is worth it\n" : "\n");
    for (const ExcessAdvice::Alternative& alt : a.alternatives)
      out += "    as " + alt.technology + " (" +
             Printf("%.0f dB", alt.noise_index_db) + "): total output noise " +
             FormatEng(alt.output_rms_v, "V") + " rms (now " +
             FormatEng(b.output_rms_v, "V") + ")\n";
  }
  return out;
}

}  // namespace

std::string RealPartsText(const Budget& b) {
  std::string out;
  if (b.temperature) out += TemperatureSection(b);
  if (b.compensation) out += CompensationSection(b);
  if (!b.resistor_drops.empty()) out += ExcessSection(b);
  return out;
}

}  // namespace hushgain

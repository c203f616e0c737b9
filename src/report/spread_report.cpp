#include "report/spread_report.h"

#include <cmath>
#include <cstdio>

#include "io/units.h"
#include "noise/physical_constants.h"
#include "report/printf.h"
#include "report/table.h"

namespace hushgain {
namespace {

std::string Ppm(double relative) { return Printf("%.1f ppm", relative * 1e6); }

std::string YieldText(const std::optional<double>& y) {
  return y ? Printf("%.3f %%", 100.0 * *y) : std::string("-");
}

}  // namespace

std::string SpreadToText(const SpreadRun& run, const SpreadSummary& s,
                         const SpreadLimits& limits, std::uint64_t seed) {
  const Budget& b = run.nominal;
  const std::string gain_unit = b.input_unit == "A" ? "V/A" : "V/V";
  std::string out = b.stage_name + "\n";
  out += "  Monte Carlo: " + std::to_string(run.samples.size()) +
         " samples, seed " + std::to_string(seed) + "\n";
  out += "  nominal: DC gain " + Printf("%.6g", run.nominal_gain) + " " +
         gain_unit + ", output noise " + FormatEng(b.output_rms_v, "V") +
         " rms, offset worst case " + FormatEng(b.offset.worst_case_v, "V") +
         " at " + Printf("%.2f", b.temperature_k - kZeroCelsiusK) +
         " \xC2\xB0"
         "C\n";
  out +=
      std::string(
          "  draws: resistors uniform within their tolerance; Vos and Ios ") +
      (run.gaussian_offsets ? "Gaussian (the device values as sigma)"
                            : "uniform within the device values") +
      "; Vos drift uniform within its value; temperature uniform over the "
      "range\n\n";
  Table t;
  t.header = {"figure", "mean", "sigma", "0.135 %", "99.865 %", "min", "max"};
  t.align = {Table::Align::kLeft,  Table::Align::kRight, Table::Align::kRight,
             Table::Align::kRight, Table::Align::kRight, Table::Align::kRight,
             Table::Align::kRight};
  t.AddRow({"gain error", Ppm(s.gain_error.mean), Ppm(s.gain_error.sigma),
            Ppm(s.gain_error.p_low), Ppm(s.gain_error.p_high),
            Ppm(s.gain_error.min), Ppm(s.gain_error.max)});
  t.AddRow({"output offset", FormatEng(s.offset.mean, "V"),
            FormatEng(s.offset.sigma, "V"), FormatEng(s.offset.p_low, "V"),
            FormatEng(s.offset.p_high, "V"), FormatEng(s.offset.min, "V"),
            FormatEng(s.offset.max, "V")});
  t.AddRow({"output noise rms", FormatEng(s.noise.mean, "V"),
            FormatEng(s.noise.sigma, "V"), FormatEng(s.noise.p_low, "V"),
            FormatEng(s.noise.p_high, "V"), FormatEng(s.noise.min, "V"),
            FormatEng(s.noise.max, "V")});
  out += RenderText(t);
  out +=
      "  (the percentiles are the +-3 sigma points of a Gaussian; linear "
      "interpolation "
      "between samples)\n";
  if (run.worst_case_offset_v > 0)
    out +=
        "  worst-case offset over the tolerance corners and the range: "
        "\xC2\xB1" +
        FormatEng(run.worst_case_offset_v, "V") +
        (run.gaussian_offsets
             ? " (Vos and Ios at their 1-sigma values: Gaussian "
               "samples may go beyond it)\n"
             : " (bounds every sample: Vos and Ios are uniform)\n");
  if (s.yield.all) {
    out += "\nYield\n";
    Table y;
    y.header = {"limit", "value", "inside"};
    y.align = {Table::Align::kLeft, Table::Align::kRight, Table::Align::kRight};
    if (limits.gain_error)
      y.AddRow({"|gain error|", Printf("%.4g %%", 100.0 * *limits.gain_error),
                YieldText(s.yield.gain_error)});
    if (limits.offset_v)
      y.AddRow({"|output offset|", FormatEng(*limits.offset_v, "V"),
                YieldText(s.yield.offset)});
    if (limits.noise_v)
      y.AddRow({"output noise rms", FormatEng(*limits.noise_v, "V"),
                YieldText(s.yield.noise)});
    y.AddRule();
    y.AddRow({"all limits", "", YieldText(s.yield.all)});
    out += RenderText(y);
  }
  return out;
}

std::string SpreadToCsv(const SpreadRun& run) {
  std::string out =
      "index,temperature_C,vos_V,ios_A,gain,gain_error,offset_V,noise_rms_V";
  for (const std::string& name : run.resistor_names) out += "," + name + "_ohm";
  out += "\n";
  const std::size_t m = run.resistor_names.size();
  char buf[64];
  for (std::size_t i = 0; i < run.samples.size(); ++i) {
    const SpreadSample& s = run.samples[i];
    out += std::to_string(i);
    for (double v : {s.temperature_k - kZeroCelsiusK, s.vos_v, s.ios_a, s.gain,
                     s.gain_error, s.offset_v, s.noise_rms_v}) {
      std::snprintf(buf, sizeof buf, ",%.17g", v);
      out += buf;
    }
    for (std::size_t k = 0; k < m; ++k) {
      std::snprintf(buf, sizeof buf, ",%.17g", run.resistor_ohms[i * m + k]);
      out += buf;
    }
    out += "\n";
  }
  return out;
}

}  // namespace hushgain

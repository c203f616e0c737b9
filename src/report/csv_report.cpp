#include "report/csv_report.h"

#include <algorithm>
#include <cstdio>

#include "report/enum_words.h"
#include "report/table.h"

namespace hushgain {
namespace {}  // namespace

std::string CsvNumber(double value) {
  char buf[40];
  std::snprintf(buf, sizeof buf, "%.9g", value);
  return buf;
}

std::string BudgetToCsv(const Budget& b) {
  Table t;
  t.header = {"contributor",
              "kind",
              "output_rms_V",
              "share",
              "output_density_V_per_rtHz",
              "gain_to_output",
              "gain_unit",
              "source_density_per_rtHz",
              "source_unit",
              "reference_frequency_Hz"};
  for (const Contributor& c : b.contributors) {
    const bool current = IsCurrentNoise(c.kind);
    t.AddRow({c.name, NoiseKindWord(c.kind), CsvNumber(c.output_rms_v),
              CsvNumber(c.share), CsvNumber(c.output_density_ref_v_per_rthz),
              CsvNumber(c.gain_to_output_ref), current ? "V/A" : "V/V",
              CsvNumber(c.source_density_ref), current ? "A" : "V",
              CsvNumber(b.reference_hz)});
  }
  t.AddRow({"total", "", CsvNumber(b.output_rms_v), CsvNumber(1.0),
            CsvNumber(b.output_density_ref_v_per_rthz), "", "", "", "",
            CsvNumber(b.reference_hz)});
  return RenderCsv(t);
}

std::string SpectrumToCsv(const Budget& b, const SpectrumSamples& s) {
  // The budget's order; any sampled contributor the budget lacks follows.
  std::vector<int> order;
  for (const Contributor& c : b.contributors)
    if (int k = s.Find(c.name); k >= 0) order.push_back(k);
  for (std::size_t k = 0; k < s.names.size(); ++k)
    if (std::find(order.begin(), order.end(), static_cast<int>(k)) ==
        order.end())
      order.push_back(static_cast<int>(k));

  Table t;
  t.header = {"f_Hz"};
  for (int k : order) t.header.push_back(s.names[k] + "_V_per_rtHz");
  t.header.push_back("total_V_per_rtHz");
  t.header.push_back(b.input_unit == "A" ? "signal_gain_V_per_A"
                                         : "signal_gain_V_per_V");
  t.header.push_back("noise_gain_V_per_V");
  t.header.push_back("loop_gain_V_per_V");
  for (std::size_t i = 0; i < s.f_hz.size(); ++i) {
    std::vector<std::string> row = {CsvNumber(s.f_hz[i])};
    for (int k : order) row.push_back(CsvNumber(s.density_v_per_rthz[k][i]));
    row.push_back(CsvNumber(s.total_v_per_rthz[i]));
    row.push_back(CsvNumber(s.signal_gain_abs[i]));
    row.push_back(CsvNumber(s.noise_gain_abs[i]));
    row.push_back(CsvNumber(s.loop_gain_abs[i]));
    t.AddRow(std::move(row));
  }
  return RenderCsv(t);
}

}  // namespace hushgain

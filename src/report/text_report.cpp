#include "report/text_report.h"

#include <cmath>
#include <cstdio>

#include "io/units.h"
#include "noise/physical_constants.h"
#include "report/budget_tables.h"
#include "report/table.h"

namespace hushgain {
namespace {

std::string Printf(const char* format, double value) {
  char buf[64];
  std::snprintf(buf, sizeof buf, format, value);
  return buf;
}

std::string Header(const Budget& b) {
  const std::string unit = b.input_unit == "A" ? "V/A" : "V/V";
  std::string out = b.stage_name + "\n";
  out += "  temperature " + Printf("%.2f", b.temperature_k - kZeroCelsiusK) +
         " \xC2\xB0"
         "C (" +
         Printf("%.2f", b.temperature_k) + " K), band " +
         FormatEng(b.band_low_hz, "Hz") + " to " +
         FormatEng(b.band_high_hz, "Hz") + ", reference " +
         FormatEng(b.reference_hz, "Hz") + "\n";
  out += "  signal gain " + FormatGain(b.signal_gain_dc) + " " + unit +
         " at DC, |" + FormatGain(b.signal_gain_ref) + "| at the reference\n";
  out += "  noise gain (e_n to output) " + FormatGain(b.noise_gain_dc) +
         " at DC, " + FormatGain(b.noise_gain_ref) + " at the reference\n";
  out += "  closed-loop -3 dB bandwidth " +
         (b.bandwidth_3db_hz > 0 ? FormatEng(b.bandwidth_3db_hz, "Hz")
                                 : std::string("not found")) +
         (b.peaking_db > 0.01 ? ", peaking " + Printf("%.2f dB", b.peaking_db)
                              : "") +
         "\n";
  return out;
}

std::string NoiseSection(const Budget& b) {
  const std::string ref = FormatEng(b.reference_hz, "Hz", 3);
  std::string out = "\nNoise at the output, " + FormatEng(b.band_low_hz, "Hz") +
                    " to " + FormatEng(b.band_high_hz, "Hz") + "\n";
  out += RenderText(NoiseTable(b));
  out += "  output peak-to-peak    " + FormatEng(b.output_peak_to_peak_v, "V") +
         "  (6.6 x rms: inside about 99.9 % of the time, Gaussian)\n";
  out += "  input-referred         " + FormatEng(b.input_rms, b.input_unit) +
         " rms, " + FormatDensity(b.input_density_ref_per_rthz, b.input_unit) +
         " at " + ref + "\n";
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
  std::string out = "\nOutput offset at DC\n" + RenderText(OffsetTable(b));
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
  out += RenderText(TeeSummaryTable(b));
  out += Printf("  noise cost of the T network: x%.3f in output noise",
                c.noise_cost_ratio) +
         Printf(" (%+.2f dB)\n", 20.0 * std::log10(c.noise_cost_ratio));
  out += "\n" + RenderText(TeeChangesTable(b));
  return out;
}

}  // namespace

std::string BudgetToText(const Budget& b) {
  std::string out = Header(b) + NoiseSection(b) + OffsetSection(b);
  if (b.tee) out += TeeSection(b);
  for (const std::string& w : b.warnings) out += "\nwarning: " + w + "\n";
  return out;
}

}  // namespace hushgain

#include "report/tia_snr_plot_script.h"

#include <algorithm>
#include <cassert>
#include <cmath>

#include "base/printf.h"
#include "io/units.h"
#include "report/text_escape.h"

namespace hushgain {
namespace {

constexpr SheetLayout kSnrSheet{.left_px = 140,
                                .legend_px = 430,
                                .key_gap_px = 60,
                                .heading_px = 90,
                                .panel_top_px = 50,
                                .panel_px = 520,
                                .panel_bottom_px = 75};

// Our own colours (as the other sheets').
constexpr const char* kCurveColour = "#1f5fa8";
constexpr const char* kSaturatedColour = "#d1495b";
constexpr const char* kMarkColour = "#2e933c";

}  // namespace

std::string BuildTiaSnrPlotScript(const Stage& stage, const TiaSnrResult& r,
                                  const TiaSnrPlotOptions& o) {
  assert(r.points.size() >= 2);
  const int height = kSnrSheet.HeightPx(1);
  std::string out =
      TerminalCommands(o.format, kSnrSheet.width_px, height, o.output_path);
  // $snr: power, SNR (within the headroom); $saturated: the points beyond.
  out += "$snr << EOD\n";
  for (const TiaSnrPoint& p : r.points)
    if (!p.saturated)
      out += PlotNumber(p.power_w) + " " + PlotLogNumber(p.snr) + "\n";
  out += "EOD\n$saturated << EOD\n";
  for (const TiaSnrPoint& p : r.points)
    if (p.saturated)
      out += PlotNumber(p.power_w) + " " + PlotLogNumber(p.snr) + "\n";
  out += "EOD\n";

  out += "set multiplot\n";
  out += "set label 1 " + GnuplotString(stage.name) +
         " at screen 0.5, screen " + PlotNumber(1.0 - 32.0 / height) +
         " center font ',16'\n";
  out += "set label 2 " +
         GnuplotString("SNR over " + FormatEng(r.band_low_hz, "Hz") + " to " +
                       FormatEng(r.band_high_hz, "Hz") +
                       " against optical power; responsivity " +
                       FormatEng(r.responsivity_a_per_w, "A/W", 3) +
                       ", background photocurrent " +
                       FormatEng(r.background_current_a, "A") + "; headroom: " +
                       r.limit_name + " " + FormatEng(r.limit_v, "V")) +
         " at screen 0.5, screen " + PlotNumber(1.0 - 64.0 / height) +
         " center\n";
  out += PanelFrame(kSnrSheet, 0, height,
                    "Signal current R x P against the input noise rms", 3);

  double snr_lo = r.points.front().snr, snr_hi = snr_lo;
  for (const TiaSnrPoint& p : r.points) {
    snr_lo = std::min(snr_lo, p.snr);
    snr_hi = std::max(snr_hi, p.snr);
  }
  snr_lo = std::min(snr_lo, 1.0) / 2;
  snr_hi = std::max(snr_hi, 1.0) * 2;
  const double p_lo = r.points.front().power_w / 1.3;
  const double p_hi = r.points.back().power_w * 1.3;
  out += "set logscale x\nset logscale y\n";
  out += "set xrange [" + PlotNumber(p_lo) + ":" + PlotNumber(p_hi) + "]\n";
  out += "set yrange [" + PlotNumber(snr_lo) + ":" + PlotNumber(snr_hi) + "]\n";
  out += LogTicsCommand("x", p_lo, p_hi,
                        [](double v) { return ShortEng(v, "W"); });
  out += LogTicsCommand("y", snr_lo, snr_hi,
                        [](double v) { return Printf("%g", v); });
  out += "set xlabel " + GnuplotString("incident optical power (W)") + "\n";
  out += "set ylabel " +
         GnuplotString("SNR over the band (signal current / noise rms)") + "\n";
  // SNR = 1, and the NEP on it.
  out +=
      "set arrow 1 from graph 0, first 1 to graph 1, first 1 nohead dt 3 "
      "lw 1.5 lc rgb '#000000'\n";
  std::string plot =
      "plot $snr using 1:2 with linespoints lw 2.5 pt 7 ps 0.8 "
      "lc rgb '" +
      std::string(kCurveColour) + "' title " + GnuplotString("SNR");
  if (r.nep_w > p_lo && r.nep_w < p_hi) {
    out += "$nep << EOD\n" + PlotNumber(r.nep_w) + " 1\nEOD\n";
    plot += ", \\\n  $nep using 1:2 with points pt 6 ps 2.4 lw 2 lc rgb '" +
            std::string(kMarkColour) + "' title " +
            GnuplotString("NEP over the band " + FormatEng(r.nep_w, "W") +
                          " (SNR = 1)");
  } else {
    plot += ", \\\n  keyentry with points pt 6 ps 2.4 lw 2 lc rgb '" +
            std::string(kMarkColour) + "' title " +
            GnuplotString("NEP over the band " + FormatEng(r.nep_w, "W") +
                          " (off the axis)");
  }
  if (r.saturation_power_w > p_lo && r.saturation_power_w < p_hi)
    out += "set arrow 2 from first " + PlotNumber(r.saturation_power_w) +
           ", graph 0 to first " + PlotNumber(r.saturation_power_w) +
           ", graph 1 nohead dt 2 lw 2 lc rgb '" + kSaturatedColour +
           "' front\n";
  const std::string saturation =
      r.saturation_power_w > 0
          ? "saturates above " + FormatEng(r.saturation_power_w, "W")
          : std::string("saturated without signal light");
  plot += ", \\\n  keyentry with lines dt 2 lw 2 lc rgb '" +
          std::string(kSaturatedColour) + "' title " +
          GnuplotString(saturation);
  const bool any_saturated =
      std::any_of(r.points.begin(), r.points.end(),
                  [](const TiaSnrPoint& p) { return p.saturated; });
  if (any_saturated)
    plot +=
        ", \\\n  $saturated using 1:2 with points pt 2 ps 1.2 lw 2 lc "
        "rgb '" +
        std::string(kSaturatedColour) + "' title " +
        GnuplotString("saturated (figures beyond the headroom)");
  out += plot + "\n";
  out += "unset multiplot\nset output\n";
  return out;
}

}  // namespace hushgain

#include "report/compare_plot_script.h"

#include <algorithm>
#include <cassert>

#include "base/printf.h"
#include "io/units.h"
#include "report/enum_words.h"
#include "report/text_escape.h"

namespace hushgain {
namespace {

constexpr int kRowPx = 56;  // one bar and its gap
constexpr int kMinPanelPx = 280;

// Our own colours (as the other sheets'), one per kind of contributor.
constexpr const char* kKindColours[] = {"#1f5fa8", "#d1495b", "#2e933c",
                                        "#e09f1f"};
constexpr const char* kKindTitles[] = {"e_n x noise gain", "i_n (both inputs)",
                                       "resistors (thermal and excess)",
                                       "other (shot, supply, sensor)"};
constexpr const char* kRefusedColour = "#888888";
// The bar's height, of the distance between two bars.
constexpr double kBarHalfHeight = 0.32;

double ShareOf(const NoiseKindShares& s, int kind) {
  switch (kind) {
    case 0:
      return s.voltage_noise;
    case 1:
      return s.current_noise;
    case 2:
      return s.resistor;
    default:
      return s.other;
  }
}

}  // namespace

std::string BuildComparePlotScript(const Stage& stage, const OpAmpComparison& c,
                                   const ComparePlotOptions& o) {
  assert(!c.rows.empty());
  const int n = static_cast<int>(c.rows.size());
  SheetLayout layout{.left_px = 300,
                     .legend_px = 400,
                     .key_gap_px = 40,
                     .heading_px = 90,
                     .panel_top_px = 50,
                     .panel_px = 280,
                     .panel_bottom_px = 75};
  layout.panel_px = std::max(kMinPanelPx, kRowPx * n);
  const int height = layout.HeightPx(1);

  double top = 0;
  for (const OpAmpComparisonRow& r : c.rows)
    if (r.status.ok) top = std::max(top, r.budget.input_rms);
  const auto [scale, unit] = UnitScale(top, c.input_unit);

  std::string out =
      TerminalCommands(o.format, layout.width_px, height, o.output_path);
  // One datablock per kind: x, y, x_low, x_high, y_low, y_high of each
  // segment (boxxyerror), the first row at the top (y = n).
  for (int kind = 0; kind < 4; ++kind) {
    out += "$kind" + std::to_string(kind) + " << EOD\n";
    for (int i = 0; i < n; ++i) {
      const OpAmpComparisonRow& r = c.rows[i];
      if (!r.status.ok) continue;
      const double rms = r.budget.input_rms / scale;
      double from = 0;
      for (int k = 0; k < kind; ++k) from += ShareOf(r.shares, k);
      const double x0 = from * rms;
      const double x1 = (from + ShareOf(r.shares, kind)) * rms;
      const double y = n - i;
      out += PlotNumber(0.5 * (x0 + x1)) + " " + PlotNumber(y) + " " +
             PlotNumber(x0) + " " + PlotNumber(x1) + " " +
             PlotNumber(y - kBarHalfHeight) + " " +
             PlotNumber(y + kBarHalfHeight) + "\n";
    }
    out += "EOD\n";
  }

  out += "set multiplot\n";
  out += "set label 1 " + GnuplotString(stage.name) +
         " at screen 0.5, screen " + PlotNumber(1.0 - 32.0 / height) +
         " center font ',16'\n";
  out += "set label 2 " +
         GnuplotString(
             "input-referred noise rms over " + FormatEng(c.band_low_hz, "Hz") +
             " to " + FormatEng(c.band_high_hz, "Hz") +
             " with each op-amp, ranked by " +
             (c.ranking == OpAmpRanking::kOffset ? std::string("offset")
                                                 : std::string("noise")) +
             "; each bar split by kind in proportion to its share of the "
             "noise power") +
         " at screen 0.5, screen " + PlotNumber(1.0 - 64.0 / height) +
         " center\n";
  out += PanelFrame(layout, 0, height,
                    "Input-referred noise rms by op-amp, and the verdict", 3);
  // Bars grow from 0; room on the right for the verdict.
  const double x_max = top > 0 ? 1.45 * top / scale : 1;
  out += "set xrange [0:" + PlotNumber(x_max) + "]\n";
  out += "set yrange [0.3:" + PlotNumber(n + 0.7) + "]\n";
  out += "set xlabel " +
         GnuplotString("input-referred noise rms (" + unit + ")") + "\n";
  out += "unset ylabel\nset grid noytics nomytics\nset mxtics 2\n";
  std::string tics;
  for (int i = 0; i < n; ++i) {
    if (!tics.empty()) tics += ", ";
    tics += GnuplotString(c.rows[i].device) + " " + std::to_string(n - i);
  }
  out += "set ytics (" + tics + ") nomirror out scale 0\n";
  out += "set style fill solid 0.9 border lc rgb '#ffffff'\n";
  // The verdict beside each bar (in grey where the op-amp was refused).
  for (int i = 0; i < n; ++i) {
    const OpAmpComparisonRow& r = c.rows[i];
    const double x = r.status.ok ? r.budget.input_rms / scale : 0;
    std::string text = OpAmpVerdict(r);
    if (r.status.ok)
      text = FormatEng(r.budget.input_rms, c.input_unit) + "  " + text;
    out +=
        "set label " + std::to_string(20 + i) + " " + GnuplotString(text) +
        " at first " + PlotNumber(x) + ", first " + PlotNumber(n - i) +
        " left offset 0.8,0 tc rgb '" +
        (r.status.ok ? std::string("#000000") : std::string(kRefusedColour)) +
        "'\n";
  }
  // With every op-amp refused the datablocks are empty: the legend alone
  // (gnuplot warns of a data block without points), beside a line below the
  // axis (gnuplot needs one plot that is not a key entry).
  const bool any =
      std::any_of(c.rows.begin(), c.rows.end(),
                  [](const OpAmpComparisonRow& r) { return r.status.ok; });
  std::string plot = any ? "plot" : "plot -1 notitle,";
  for (int kind = 0; kind < 4; ++kind) {
    plot += std::string(kind == 0 ? " " : ", \\\n  ") +
            (any ? "$kind" + std::to_string(kind) +
                       " using 1:2:3:4:5:6 with boxxyerror"
                 : std::string("keyentry with boxes")) +
            " lc rgb '" + kKindColours[kind] + "' title " +
            GnuplotString(kKindTitles[kind]);
  }
  out += plot + "\n";
  out += "unset multiplot\nset output\n";
  return out;
}

}  // namespace hushgain

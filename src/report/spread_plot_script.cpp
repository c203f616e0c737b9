#include "report/spread_plot_script.h"

#include <algorithm>
#include <cassert>
#include <cmath>
#include <cstdio>
#include <functional>
#include <optional>
#include <vector>

#include "base/physical_constants.h"
#include "base/printf.h"
#include "io/units.h"
#include "report/histogram.h"
#include "report/plot_axes.h"
#include "report/text_escape.h"

namespace hushgain {
namespace {

// Sheet geometry in pixels: tic labels on the left, the legend column on
// the right.
constexpr SheetLayout kSpreadSheet{.left_px = 120,
                                   .legend_px = 440,
                                   .key_gap_px = 40,
                                   .heading_px = 90,
                                   .panel_top_px = 50,
                                   .panel_px = 300,
                                   .panel_bottom_px = 75};
constexpr int kPanels = 3;

// Our own colours (as the other sheets').
constexpr const char* kBarColours[] = {"#1f5fa8", "#d1495b", "#2e933c"};
constexpr const char* kMeanColour = "#000000";
constexpr const char* kPercentileColour = "#555555";
constexpr const char* kLimitColour = "#e07b00";

std::string PercentLabel(double fraction) {
  return Printf("%.3f %%", 100 * fraction);
}

// One panel: the values in display units (value * factor) and how to
// print a value given in SI units.
struct Figure {
  std::string title;
  std::string axis_label;                   // with the display unit
  double factor = 1;                        // SI value * factor = display value
  std::vector<double> values;               // display units
  Distribution dist;                        // SI units
  std::function<std::string(double)> text;  // an SI value for the legend
  std::optional<double> limit;              // SI units
  bool two_sided = true;                    // limit lines at +-limit
  std::optional<double> yield;
  const char* colour = kBarColours[0];
};

void Panel(std::string& out, int index, int height_px, const Figure& f) {
  out += PanelFrame(kSpreadSheet, index, height_px, f.title, 3);

  const std::vector<double>& values = f.values;
  // No spread (every sample equal to 1e-9 relative, e.g. zero tolerances):
  // one narrow bar at the value on an axis of +-1 % of it (+-1 at zero),
  // instead of bins a rounding error wide.
  const auto [v_min, v_max] = std::minmax_element(values.begin(), values.end());
  const bool flat = !(*v_max - *v_min >
                      1e-9 * std::max(std::fabs(*v_min), std::fabs(*v_max)));
  Histogram h;
  if (flat) {
    const double centre = *v_min;
    const double half = centre != 0 ? 0.01 * std::fabs(centre) : 1.0;
    h.edges = {centre - half / 20, centre + half / 20};
    h.counts = {static_cast<long>(values.size())};
  } else {
    h = BinValues(
        values, RiceBinCount(static_cast<long>(values.size()), kSpreadMaxBins));
  }
  assert(h.Bins() >= 1);

  // The data's range, widened to hold the limit lines that lie near it.
  double lo = h.edges.front(), hi = h.edges.back();
  if (flat) {  // the axis: ten bar widths either side of the value
    lo = *v_min - 10 * h.Width();
    hi = *v_min + 10 * h.Width();
  }
  const double span = hi - lo;
  std::vector<double> limit_lines, drawn_limits;
  if (f.limit) {
    limit_lines.push_back(*f.limit * f.factor);
    if (f.two_sided) limit_lines.push_back(-*f.limit * f.factor);
  }
  for (double l : limit_lines)
    if (l >= lo - span && l <= hi + span) {
      drawn_limits.push_back(l);
      lo = std::min(lo, l);
      hi = std::max(hi, l);
    }
  const double pad = 0.04 * (hi - lo);
  out += "set xrange [" + PlotNumber(lo - pad) + ":" + PlotNumber(hi + pad) +
         "]\n";
  long peak = 1;
  for (long c : h.counts) peak = std::max(peak, c);
  out += "set yrange [0:" + PlotNumber(std::ceil(peak * 1.12)) + "]\n";
  out += "set xlabel " + GnuplotString(f.axis_label) + "\n";
  out += "set ylabel " + GnuplotString("samples per bin") + "\n";

  const std::string block = "$hist" + std::to_string(index);
  out += block + " << EOD\n";
  for (int k = 0; k < h.Bins(); ++k)
    out += PlotNumber(0.5 * (h.edges[k] + h.edges[k + 1])) + " " +
           std::to_string(h.counts[k]) + "\n";
  out += "EOD\n";
  out += "set boxwidth " + PlotNumber(h.Width()) + " absolute\n";

  const std::string mean_style =
      std::string("lw 2.5 lc rgb '") + kMeanColour + "'";
  const std::string percentile_style =
      std::string("dt 2 lw 2 lc rgb '") + kPercentileColour + "'";
  const std::string limit_style =
      std::string("dt 3 lw 3 lc rgb '") + kLimitColour + "'";
  auto vertical = [&](double x, const std::string& style) {
    out += "set arrow from first " + PlotNumber(x) + ", graph 0 to first " +
           PlotNumber(x) + ", graph 1 nohead " + style + " front\n";
  };
  vertical(f.dist.mean * f.factor, mean_style);
  if (!flat) {
    vertical(f.dist.p_low * f.factor, percentile_style);
    vertical(f.dist.p_high * f.factor, percentile_style);
  }
  for (double l : drawn_limits) vertical(l, limit_style);

  std::string plot =
      "plot " + block + " using 1:2 with boxes fs solid 0.45 border lc rgb '" +
      f.colour + "' lc rgb '" + f.colour + "' title " +
      GnuplotString(std::to_string(values.size()) + " samples, " +
                    (flat ? std::string("no spread")
                          : std::to_string(h.Bins()) + " bins"));
  auto entry = [&](const std::string& style, const std::string& text) {
    plot += ", \\\n  keyentry with lines " + style + " title " +
            GnuplotString(text);
  };
  if (flat) {
    entry(mean_style, "every sample " + f.text(f.dist.mean));
  } else {
    entry(mean_style,
          "mean " + f.text(f.dist.mean) + ", sigma " + f.text(f.dist.sigma));
    entry(percentile_style, "0.135 % point " + f.text(f.dist.p_low));
    entry(percentile_style, "99.865 % point " + f.text(f.dist.p_high));
  }
  if (f.limit) {
    std::string text = std::string("limit ") + (f.two_sided ? "\xC2\xB1" : "") +
                       f.text(*f.limit);
    if (f.yield) text += ", yield " + PercentLabel(*f.yield);
    if (drawn_limits.size() < limit_lines.size()) text += " (off the axis)";
    entry(limit_style, text);
  }
  out += plot + "\n";
}

}  // namespace

std::string BuildSpreadPlotScript(const SpreadRun& run,
                                  const SpreadSummary& summary,
                                  const SpreadLimits& limits,
                                  const SpreadPlotOptions& o) {
  assert(run.size() > 0);
  const int height_px = kSpreadSheet.HeightPx(kPanels);
  std::string out = TerminalCommands(o.format, kSpreadSheet.width_px, height_px,
                                     o.output_path);
  out += "set style fill solid 0.45 border\n";

  const Budget& nominal = run.nominal;
  std::string summary_line = "Monte Carlo: " + std::to_string(run.size()) +
                             " samples, seed " + std::to_string(o.seed) +
                             ";  band " + FormatEng(nominal.band_low_hz, "Hz") +
                             " to " + FormatEng(nominal.band_high_hz, "Hz");
  const double t_lo = run.temperature_low_k, t_hi = run.temperature_high_k;
  summary_line += ";  temperature " + Printf("%.1f", t_lo - kZeroCelsiusK) +
                  (t_hi > t_lo ? " to " + Printf("%.1f", t_hi - kZeroCelsiusK)
                               : std::string()) +
                  " \xC2\xB0"
                  "C";
  if (summary.yield.all)
    summary_line += ";  yield " + PercentLabel(*summary.yield.all);

  out += "set multiplot\n";
  out += "set label 1 " + GnuplotString(nominal.stage_name) +
         " at screen 0.5, screen " + PlotNumber(1.0 - 32.0 / height_px) +
         " center font ',16'\n";
  out += "set label 2 " + GnuplotString(summary_line) +
         " at screen 0.5, screen " + PlotNumber(1.0 - 64.0 / height_px) +
         " center\n";

  // One panel's values at a time, in display units.
  const auto scaled = [](const std::vector<double>& si, double factor) {
    std::vector<double> display(si.size());
    for (std::size_t i = 0; i < si.size(); ++i) display[i] = si[i] * factor;
    return display;
  };

  Figure g;
  g.title = "Closed-loop gain error";
  g.axis_label = "gain error (%)";
  g.factor = 100;
  g.values.resize(run.size());
  for (std::size_t i = 0; i < run.size(); ++i)
    g.values[i] = run.GainError(i) * g.factor;
  g.dist = summary.gain_error;
  // Gain errors in % with the decimals that show sigma to three digits, so
  // the mean near zero reads "0.000 %" beside a sigma of "0.581 %".
  const double gain_scale =
      100 * (summary.gain_error.sigma > 0
                 ? summary.gain_error.sigma
                 : std::max(std::fabs(summary.gain_error.min),
                            std::fabs(summary.gain_error.max)));
  const int decimals =
      gain_scale > 0
          ? std::clamp(2 - static_cast<int>(std::floor(std::log10(gain_scale))),
                       0, 6)
          : 3;
  g.text = [decimals](double v) {
    char buf[48];
    std::snprintf(buf, sizeof buf, "%.*f %%", decimals, 100 * v);
    return std::string(buf);
  };
  g.limit = limits.gain_error;
  g.yield = summary.yield.gain_error;
  g.colour = kBarColours[0];
  Panel(out, 0, height_px, g);
  g.values = {};

  const auto [offset_scale, offset_unit] = UnitScale(
      std::max(std::fabs(summary.offset.min), std::fabs(summary.offset.max)),
      "V");
  Figure v;
  v.title = "Output offset at DC";
  v.axis_label = "output offset (" + offset_unit + ")";
  v.factor = 1 / offset_scale;
  v.values = scaled(run.figures.offset_v, v.factor);
  v.dist = summary.offset;
  v.text = [](double x) { return FormatEng(x, "V"); };
  v.limit = limits.offset_v;
  v.yield = summary.yield.offset;
  v.colour = kBarColours[1];
  Panel(out, 1, height_px, v);
  v.values = {};

  const auto [noise_scale, noise_unit] = UnitScale(summary.noise.max, "V");
  Figure n;
  n.title = "Total output noise rms over the band";
  n.axis_label = "output noise rms (" + noise_unit + ")";
  n.factor = 1 / noise_scale;
  n.values = scaled(run.figures.noise_rms_v, n.factor);
  n.dist = summary.noise;
  n.text = [](double x) { return FormatEng(x, "V"); };
  n.limit = limits.noise_v;
  n.two_sided = false;
  n.yield = summary.yield.noise;
  n.colour = kBarColours[2];
  Panel(out, 2, height_px, n);

  out += "unset multiplot\nset output\n";
  return out;
}

}  // namespace hushgain

#include "report/tee_plot_script.h"

#include <algorithm>
#include <cassert>
#include <cmath>
#include <cstdio>
#include <vector>

#include "base/physical_constants.h"
#include "base/printf.h"
#include "io/units.h"
#include "report/enum_words.h"
#include "report/plot_axes.h"
#include "report/text_escape.h"
#include "report/unit_symbols.h"

namespace hushgain {
namespace {

// Sheet geometry in pixels: tic labels with units on the left, the right
// axis (room before the legend) and then the legend column on the right.
constexpr SheetLayout kTeeSheet{.left_px = 140,
                                .legend_px = 430,
                                .key_gap_px = 110,
                                .heading_px = 90,
                                .panel_top_px = 50,
                                .panel_px = 380,
                                .panel_bottom_px = 75};

// Our own colours (as the plot sheet's).
constexpr const char* kNoiseColour = "#1f5fa8";
constexpr const char* kOffsetColour = "#d1495b";
constexpr const char* kStageColour = "#2e933c";
constexpr const char* kPartColours[] = {"#1f5fa8", "#d1495b", "#2e933c",
                                        "#7b4b94"};

std::string TemperatureLabel(const Budget& b) {
  return Printf("%.2f", b.temperature_k - kZeroCelsiusK) +
         " \xC2\xB0"
         "C";
}

std::string BandLabel(const Budget& b) {
  return "band " + FormatEng(b.band_low_hz, "Hz") + " to " +
         FormatEng(b.band_high_hz, "Hz");
}

// "noise", "offset", or for the weighted ranking what it weighs.
std::string RankingWords(const TeeSearchQuery& q) {
  if (q.ranking != TeeRanking::kWeighted) return TeeRankingWord(q.ranking);
  return "noise and offset, offset weight " + Printf("%.3g", q.offset_weight);
}

class Sheet {
 public:
  Sheet(const TeePlotOptions& o, int panels)
      : height_px_(kTeeSheet.HeightPx(panels)) {
    out_ += TerminalCommands(o.format, kTeeSheet.width_px, height_px_,
                             o.output_path);
  }

  std::string& out() { return out_; }

  void Heading(const std::string& title, const std::string& summary) {
    out_ += "set multiplot\n";
    out_ += "set label 1 " + GnuplotString(title) + " at screen 0.5, screen " +
            PlotNumber(1.0 - 32.0 / height_px_) + " center font ',16'\n";
    out_ += "set label 2 " + GnuplotString(summary) +
            " at screen 0.5, screen " + PlotNumber(1.0 - 64.0 / height_px_) +
            " center\n";
  }

  // Margins, grid, legend place and title of panel `index` (from 0).
  void Panel(int index, const std::string& title) {
    out_ += PanelFrame(kTeeSheet, index, height_px_, title, 11);
  }

  std::string Finish() {
    out_ += "unset multiplot\nset output\n";
    return out_;
  }

 private:
  int height_px_;
  std::string out_;
};

// Tics for a ratio axis over [lo, hi]: a step of 1, 2 or 5 times a power
// of ten giving four to ten tics, labelled "x1.05".
std::string RatioTics(const char* axis, double lo, double hi) {
  const double raw = std::max(hi - lo, 1e-6) / 5;
  const double decade = std::pow(10.0, std::floor(std::log10(raw)));
  double step = decade;
  for (double m : {1.0, 2.0, 5.0, 10.0})
    if (m * decade >= raw) {
      step = m * decade;
      break;
    }
  const int decimals =
      std::max(0, -static_cast<int>(std::floor(std::log10(step) + 1e-9)));
  std::string list;
  auto add = [&](double v) {
    char label[32];
    std::snprintf(label, sizeof label, "x%.*f", decimals, v);
    list +=
        (list.empty() ? "" : ", ") + GnuplotString(label) + " " + PlotNumber(v);
  };
  bool one = false;
  for (long k = static_cast<long>(std::ceil(lo / step - 1e-9));
       k * step <= hi + 1e-9 * step; ++k) {
    add(k * step);
    one = one || std::fabs(k * step - 1) < 1e-9;
  }
  // The plain resistor's level, x1, is always labelled.
  if (!one && lo <= 1 && hi >= 1) add(1);
  return std::string("set ") + axis + "tics out (" + list + ")\n";
}

// The left axis for `values` (data scaled to the SI prefix of the largest),
// the right axis the ratio to `reference` (tics "x1.05"). Linear
// while the values stay within a factor of 3; log beyond, so the region
// near the plain resistor is not squashed by a steep end.
void RatioAxes(std::string& out, const std::vector<double>& values,
               double reference, const std::string& unit,
               const std::string& left_label, const std::string& right_label) {
  const double lo = *std::min_element(values.begin(), values.end());
  const double hi = *std::max_element(values.begin(), values.end());
  const auto [scale, prefixed] = UnitScale(hi, unit);
  const double ref = reference / scale;
  const bool log = lo > 0 && hi > 3 * lo;
  double y_lo, y_hi;
  if (log) {
    y_lo = lo / 1.15 / scale;
    y_hi = hi * 1.3 / scale;
    out += "set logscale y\nset logscale y2\n";
    out += LogTicsCommand("y", y_lo, y_hi, [&, s = scale](double v) {
      return ShortEng(v * s, unit);
    });
    out += "set ylabel " + GnuplotString(left_label + " (" + unit + ")") + "\n";
  } else {
    // Room above and below the curve; never below zero.
    const double span = std::max(hi - lo, 0.02 * hi);
    y_lo = std::max(0.0, lo - 0.08 * span) / scale;
    y_hi = (hi + 0.12 * span) / scale;
    out += "set ylabel " + GnuplotString(left_label + " (" + prefixed + ")") +
           "\n";
  }
  out += "set yrange [" + PlotNumber(y_lo) + ":" + PlotNumber(y_hi) + "]\n";
  if (!(ref > 0)) return;
  // The right axis spans the left one divided by the reference: on a
  // linear or a log pair of axes alike, each point reads as its ratio.
  out += "set y2range [" + PlotNumber(y_lo / ref) + ":" +
         PlotNumber(y_hi / ref) + "]\n";
  out += log ? LogTicsCommand("y2", y_lo / ref, y_hi / ref,
                              [](double v) { return Printf("x%g", v); })
             : RatioTics("y2", y_lo / ref, y_hi / ref);
  out += "set y2label " + GnuplotString(right_label) + "\n";
}

// The log axis of the largest resistor.
void LargestAxis(std::string& out, double lo_ohm, double hi_ohm) {
  const double lo = lo_ohm / 1.6, hi = hi_ohm * 1.6;
  out += "set logscale x\nset xrange [" + PlotNumber(lo) + ":" +
         PlotNumber(hi) + "]\n";
  out +=
      LogTicsCommand("x", lo, hi, [](double v) { return ShortEng(v, kOhm); });
  out += "set xlabel " +
         GnuplotString(std::string("largest resistor of the network (") + kOhm +
                       ")") +
         "\n";
}

}  // namespace

std::string BuildSweepPlotScript(const TeeSweepResult& s,
                                 const TeePlotOptions& o) {
  assert(s.rows.size() >= 2 && s.rows.front().plain);
  const Budget& plain = s.rows.front().budget;
  std::vector<double> rms, offset, largest;
  for (const TeeSweepRow& r : s.rows) {
    rms.push_back(r.budget.output_rms_v);
    offset.push_back(r.budget.offset.worst_case_v);
    largest.push_back(r.largest_ohm);
  }
  const double l_lo = *std::min_element(largest.begin(), largest.end());
  const double l_hi = *std::max_element(largest.begin(), largest.end());
  const double noise_scale =
      UnitScale(*std::max_element(rms.begin(), rms.end()), "V").first;
  const double offset_scale =
      UnitScale(*std::max_element(offset.begin(), offset.end()), "V").first;

  Sheet sheet(o, 2);
  std::string& out = sheet.out();
  // $sweep: L, output rms (scaled), worst-case offset (scaled); $plain: the
  // same for the first row alone.
  out += "$sweep << EOD\n";
  for (const TeeSweepRow& r : s.rows)
    out += PlotNumber(r.largest_ohm) + " " +
           PlotNumber(r.budget.output_rms_v / noise_scale) + " " +
           PlotNumber(r.budget.offset.worst_case_v / offset_scale) + "\n";
  out += "EOD\n$plain << EOD\n" + PlotNumber(s.rows.front().largest_ohm) + " " +
         PlotNumber(plain.output_rms_v / noise_scale) + " " +
         PlotNumber(plain.offset.worst_case_v / offset_scale) + "\nEOD\n";

  sheet.Heading(
      plain.stage_name,
      "T-network sweep at Req = " + FormatEng(s.equivalent_ohm, kOhm) +
          " (gain kept);  " + BandLabel(plain) + ", " +
          TemperatureLabel(plain) + ";  largest resistor " +
          FormatEng(l_hi, kOhm) + " (plain) down to " + FormatEng(l_lo, kOhm));

  const std::string plain_title =
      "plain R_f = " + FormatEng(s.equivalent_ohm, kOhm);
  const bool stage_marked = o.stage_largest_ohm &&
                            *o.stage_largest_ohm >= l_lo / 1.6 &&
                            *o.stage_largest_ohm <= l_hi * 1.6;
  auto markers = [&]() {
    std::string m;
    if (!stage_marked) return m;
    out += "set arrow from first " + PlotNumber(*o.stage_largest_ohm) +
           ", graph 0 to first " + PlotNumber(*o.stage_largest_ohm) +
           ", graph 1 nohead dt 2 lw 2 lc rgb '" + kStageColour + "' front\n";
    m += ", \\\n  keyentry with lines dt 2 lw 2 lc rgb '" +
         std::string(kStageColour) + "' title " +
         GnuplotString("stage file's tee: largest " +
                       FormatEng(*o.stage_largest_ohm, kOhm));
    return m;
  };
  auto plain_label = [&](int column) {
    out += "set label 13 " + GnuplotString("plain R_f") + " at first " +
           PlotNumber(s.rows.front().largest_ohm) + ", first " +
           PlotNumber(column == 2 ? plain.output_rms_v / noise_scale
                                  : plain.offset.worst_case_v / offset_scale) +
           " center offset 0,1.6 tc rgb '#000000'\n";
  };

  sheet.Panel(0,
              "Total output noise and noise cost against the largest "
              "resistor");
  LargestAxis(out, l_lo, l_hi);
  RatioAxes(out, rms, plain.output_rms_v, "V", "output noise rms over the band",
            "noise cost (output rms / plain R_f's)");
  plain_label(2);
  std::string plot =
      "plot $sweep using 1:2 with linespoints lw 2.5 pt 7 ps 1.1 lc rgb '" +
      std::string(kNoiseColour) + "' title " +
      GnuplotString("output noise rms, noise cost") +
      ", \\\n  $plain using 1:2 with points pt 6 ps 2.6 lw 2 lc rgb "
      "'#000000' title " +
      GnuplotString(plain_title + ": " + FormatEng(plain.output_rms_v, "V"));
  out += plot + markers() + "\n";

  sheet.Panel(1,
              "Worst-case output offset at DC against the largest "
              "resistor");
  out += "unset label 13\n";
  LargestAxis(out, l_lo, l_hi);
  RatioAxes(out, offset, plain.offset.worst_case_v, "V",
            "worst-case output offset", "offset / plain R_f's");
  plain_label(3);
  plot = "plot $sweep using 1:3 with linespoints lw 2.5 pt 5 ps 1.0 lc rgb '" +
         std::string(kOffsetColour) + "' title " +
         GnuplotString("worst-case offset, ratio") +
         ", \\\n  $plain using 1:3 with points pt 6 ps 2.6 lw 2 lc rgb "
         "'#000000' title " +
         GnuplotString(plain_title + ": " +
                       FormatEng(plain.offset.worst_case_v, "V"));
  out += plot + markers() + "\n";
  return sheet.Finish();
}

std::string BuildSearchPlotScript(const TeeSearchResult& s,
                                  const TeeSearchQuery& q,
                                  const TeePlotOptions& o) {
  assert(!s.best.empty());
  const Budget& first = s.best.front().budget;
  const int n = static_cast<int>(s.best.size());
  std::vector<double> rms, offset, cost, parts;
  for (const TeeCandidate& c : s.best) {
    rms.push_back(c.budget.output_rms_v);
    offset.push_back(c.budget.offset.worst_case_v);
    cost.push_back(TeeNoiseCost(c.budget));
    for (double r : {c.r1_ohm, c.r2_ohm, c.r3_ohm}) parts.push_back(r);
    if (q.input_min_ohm) parts.push_back(c.r_in_ohm);
  }
  const auto [noise_scale, noise_unit] =
      UnitScale(*std::max_element(rms.begin(), rms.end()), "V");
  const auto [offset_scale, offset_unit] =
      UnitScale(*std::max_element(offset.begin(), offset.end()), "V");

  Sheet sheet(o, 2);
  std::string& out = sheet.out();
  // $best: rank, output rms, offset (both scaled), R_in, R1, R2, R3.
  out += "$best << EOD\n";
  for (int i = 0; i < n; ++i) {
    const TeeCandidate& c = s.best[i];
    out += std::to_string(i + 1) + " " + PlotNumber(rms[i] / noise_scale) +
           " " + PlotNumber(offset[i] / offset_scale) + " " +
           PlotNumber(c.r_in_ohm) + " " + PlotNumber(c.r1_ohm) + " " +
           PlotNumber(c.r2_ohm) + " " + PlotNumber(c.r3_ohm) + "\n";
  }
  out += "EOD\n";

  std::string summary = q.series + " T networks for gain " +
                        Printf("%.6g", q.target_gain) + " within " +
                        Printf("%.3g %%", 100 * q.gain_tolerance) +
                        ", ranked by " + TeeRankingWord(q.ranking) + ";  " +
                        BandLabel(first) + ", " + TemperatureLabel(first);
  if (s.cancelled) summary += ";  interrupted: best so far";
  sheet.Heading(first.stage_name, summary);

  // Rank axis: every rank labelled "#k" while they fit.
  auto rank_axis = [&]() {
    out += "set xrange [0.5:" + PlotNumber(n + 0.5) + "]\n";
    const int step = n <= 25 ? 1 : (n + 24) / 25;
    std::string tics;
    for (int k = 1; k <= n; k += step)
      tics += (tics.empty() ? "" : ", ") +
              GnuplotString("#" + std::to_string(k)) + " " + std::to_string(k);
    out += "set xtics (" + tics + ")\n";
    out += "set xlabel " +
           GnuplotString("rank (best first, by " + RankingWords(q) + ")") +
           "\n";
  };

  sheet.Panel(0, "Output noise and worst-case offset of each network");
  rank_axis();
  {
    const double lo = *std::min_element(rms.begin(), rms.end());
    const double hi = *std::max_element(rms.begin(), rms.end());
    const double span = std::max(hi - lo, 0.02 * hi);
    out += "set yrange [" +
           PlotNumber(std::max(0.0, lo - 0.1 * span) / noise_scale) + ":" +
           PlotNumber((hi + 0.15 * span) / noise_scale) + "]\n";
    out +=
        "set ylabel " +
        GnuplotString("output noise rms over the band (" + noise_unit + ")") +
        "\n";
    const double olo = *std::min_element(offset.begin(), offset.end());
    const double ohi = *std::max_element(offset.begin(), offset.end());
    const double ospan = std::max(ohi - olo, 0.02 * ohi);
    out += "set y2range [" +
           PlotNumber(std::max(0.0, olo - 0.1 * ospan) / offset_scale) + ":" +
           PlotNumber((ohi + 0.15 * ospan) / offset_scale) + "]\n";
    out += "set y2tics out\nset y2label " +
           GnuplotString("worst-case output offset (" + offset_unit + ")") +
           "\n";
  }
  const double cost_lo = *std::min_element(cost.begin(), cost.end());
  const double cost_hi = *std::max_element(cost.begin(), cost.end());
  out +=
      "plot $best using 1:2 axes x1y1 with linespoints lw 2 pt 7 ps 1.4 "
      "lc rgb '" +
      std::string(kNoiseColour) + "' title " +
      GnuplotString("output noise rms (left)") +
      ", \\\n  keyentry with points pt 7 ps 0 lc rgb '#ffffff' title " +
      GnuplotString("noise cost " + Printf("x%.4f", cost_lo) +
                    (cost_hi > cost_lo ? " to " + Printf("x%.4f", cost_hi)
                                       : std::string())) +
      ", \\\n  $best using 1:3 axes x1y2 with linespoints lw 1.5 dt 2 pt 4 "
      "ps 1.4 lc rgb '" +
      kOffsetColour + "' title " + GnuplotString("worst-case offset (right)") +
      "\n";

  sheet.Panel(1, "The resistors of each network");
  rank_axis();
  {
    double lo = *std::min_element(parts.begin(), parts.end());
    double hi = *std::max_element(parts.begin(), parts.end());
    lo = std::min(lo, q.min_ohm) / 2;
    hi = std::max(hi, q.max_ohm) * 2;
    out += "set logscale y\nset yrange [" + PlotNumber(lo) + ":" +
           PlotNumber(hi) + "]\n";
    out +=
        LogTicsCommand("y", lo, hi, [](double v) { return ShortEng(v, kOhm); });
    out += "set ylabel " +
           GnuplotString(std::string("resistance (") + kOhm + ")") + "\n";
    out += "set border 3 lw 1\n";
    for (double edge : {q.min_ohm, q.max_ohm})
      out += "set arrow from graph 0, first " + PlotNumber(edge) +
             " to graph 1, first " + PlotNumber(edge) +
             " nohead dt 3 lw 1.5 lc rgb '#666666' back\n";
  }
  std::string plot =
      "plot keyentry with lines dt 3 lw 1.5 lc rgb '#666666' title " +
      GnuplotString("allowed: " + q.series + ", " + FormatEng(q.min_ohm, kOhm) +
                    " to " + FormatEng(q.max_ohm, kOhm));
  const char* names[] = {"R1 (summing node to tee)", "R2 (tee to output)",
                         "R3 (tee to ground)", "R_in"};
  const int points[] = {7, 5, 9, 13};
  // Each resistor a little beside the rank, so equal values (R1 = R2) do
  // not hide each other.
  const int count = q.input_min_ohm ? 4 : 3;
  for (int k = 0; k < count; ++k) {
    const int column = k < 3 ? 5 + k : 4;
    const double dodge = 0.15 * (k - (count - 1) / 2.0);
    plot += ", \\\n  $best using ($1" + (dodge < 0 ? std::string("") : "+") +
            PlotNumber(dodge) + "):" + std::to_string(column) +
            " with points pt " + std::to_string(points[k]) +
            " ps 1.6 lc rgb '" + kPartColours[k] + "' title " +
            GnuplotString(names[k]);
  }
  out += plot + "\n";
  return sheet.Finish();
}

}  // namespace hushgain

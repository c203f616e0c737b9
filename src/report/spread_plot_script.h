// The gnuplot script of the Monte Carlo histograms (`spread --plot`), as
// text (no gnuplot needed to build it, so tests read it): data inline as
// datablocks, terminal pngcairo or svg (no display), `noenhanced`. Three
// panels stacked, each a histogram of the samples (report/histogram.h,
// Rice's rule, at most 80 bins), samples per bin on the y axis:
//   gain error   closed-loop gain error in %
//   offset       signed output offset, V with the SI prefix of the largest
//                magnitude
//   noise        total output noise rms over the band, V with an SI prefix
// each with the mean (solid line), the 0.135 % and 99.865 % percentiles
// (dashed) and, when given, the yield limits (dotted: +-limit for gain
// error and offset, +limit for noise) with the yield in the legend. A limit
// that lies more than the data's span beyond it stays in the legend only,
// marked "off the axis", so a loose limit does not squash the histogram.
// A figure with no spread (max - min at most 1e-9 of the largest
// magnitude) is drawn as one bar on an axis of +-1 % of its value (+-1 at
// zero), its legend "no spread".
// Stage names and every other text go through GnuplotString
// (report/text_escape.h): drawn as text, never run.
#ifndef HUSHGAIN_REPORT_SPREAD_PLOT_SCRIPT_H_
#define HUSHGAIN_REPORT_SPREAD_PLOT_SCRIPT_H_

#include <cstdint>
#include <string>

#include "montecarlo/spread.h"
#include "montecarlo/spread_statistics.h"
#include "report/plot_script.h"

namespace hushgain {

inline constexpr int kSpreadMaxBins = 80;

struct SpreadPlotOptions {
  PlotFormat format = PlotFormat::kPng;
  std::string output_path;  // where gnuplot writes (a temporary name)
  std::uint64_t seed = 1;   // named in the heading
};

// `summary` from Summarize(run, limits); requires at least one
// sample (asserted).
std::string BuildSpreadPlotScript(const SpreadRun& run,
                                  const SpreadSummary& summary,
                                  const SpreadLimits& limits,
                                  const SpreadPlotOptions& options);

}  // namespace hushgain

#endif  // HUSHGAIN_REPORT_SPREAD_PLOT_SCRIPT_H_

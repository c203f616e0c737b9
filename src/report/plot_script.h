// The gnuplot script of the plot sheet, as text (no gnuplot needed to build
// it, so tests read it): the data inline as datablocks, terminal pngcairo
// or svg (no display), and up to three panels stacked on one frequency
// axis:
//   spectrum    every contributor's output density and the total, log-log,
//               V/rtHz; the band shaded, its edges drawn and labelled;
//   cumulative  the output rms from the low band edge up to f,
//               sqrt(integral of S_out from f_low to f), and the band total;
//   gain        |signal gain|, |e_n noise gain| and |loop gain| (V/V, dB on
//               the right; for a photodiode the transimpedance in ohm on
//               the left and the V/V gains on the right), the -3 dB
//               bandwidth and the loop's unity crossover with its phase
//               margin marked;
//   chain       with a signal chain (Budget::chain), on its own frequency
//               span from the band's low edge to where the chain's count
//               stopped: the cumulative analog noise at the converter's
//               input, sqrt(integral of S_adc from f_low to f), beside the
//               converter's own noise with quantization (a level), and the
//               filter's response in dB on the right; Nyquist and the
//               cutoff marked.
// Every string from the stage (stage and contributor names) and the output
// path go through GnuplotString (report/text_escape.h) on a `noenhanced`
// terminal, so they are drawn as text and never run; numbers are printed
// by the tool.
#ifndef HUSHGAIN_REPORT_PLOT_SCRIPT_H_
#define HUSHGAIN_REPORT_PLOT_SCRIPT_H_

#include <string>
#include <utility>
#include <vector>

#include "budget/budget.h"
#include "budget/sample_spectra.h"
#include "report/plot_axes.h"

namespace hushgain {

enum class PlotPanel { kSpectrum, kCumulative, kGain, kChain };

struct PlotData {
  // On the plot grid (PlotFrequencyRangeHz, band edges on the grid).
  SpectrumSamples samples;
  // The cumulative output rms on the band part of the grid, f_low .. f_high;
  // the first value is 0.
  std::vector<double> cumulative_f_hz;
  std::vector<double> cumulative_rms_v;
  // With a chain: a log grid from the band's low edge to the chain's
  // counted_to_hz, the cumulative analog rms at the converter's input
  // (first value 0) and 20 log10 |H(f)| of the filter.
  std::vector<double> chain_f_hz;
  std::vector<double> chain_cumulative_rms_v;
  std::vector<double> chain_filter_db;
};

struct PlotScriptOptions {
  PlotFormat format = PlotFormat::kPng;
  std::string output_path;  // where gnuplot writes (a temporary name)
  // Drawn top to bottom in this order; all three by default.
  std::vector<PlotPanel> panels = {PlotPanel::kSpectrum, PlotPanel::kCumulative,
                                   PlotPanel::kGain};
};

// The sheet's panels: spectrum, cumulative and gain, and chain when the
// budget has a chain.
std::vector<PlotPanel> DefaultPlotPanels(const Budget& budget);

// The frequency span of the plots: a decade below the band up to a decade
// above the band or the -3 dB bandwidth, whichever is higher.
std::pair<double, double> PlotFrequencyRangeHz(const Budget& budget);

// Requires data.samples with at least two points and positive frequencies,
// cumulative vectors of equal size, and at least one panel; the chain panel
// requires budget.chain and at least two chain points (asserted).
std::string BuildPlotScript(const Budget& budget, const PlotData& data,
                            const PlotScriptOptions& options);

}  // namespace hushgain

#endif  // HUSHGAIN_REPORT_PLOT_SCRIPT_H_

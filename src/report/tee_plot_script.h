// The gnuplot scripts of the T-network pictures, as text (no gnuplot
// needed to build them, so tests read them): data inline as datablocks,
// terminal pngcairo or svg (no display), `noenhanced`.
//
// Sweep sheet, two panels on one log axis of the largest resistor L (Ω),
// with the plain-resistor end (L = Req) ringed and named, and the stage
// file's own network (its largest resistor) drawn as a dashed line:
//   noise   total output noise rms over the band (left, V with an SI
//           prefix) and the noise cost ratio on the right axis, whose
//           range is the left one over the plain row's rms (cost = rms /
//           the plain row's rms), so one curve reads in both;
//   offset  worst-case output offset at DC (left) and its ratio to the
//           plain resistor's on the right, the same way.
// Both axes turn logarithmic when the values span more than a factor 3.
// Search sheet, by rank (best first) on the x axis:
//   noise   each network's total output noise rms (left) and worst-case
//           offset (right axis), the noise cost range in the legend;
//   parts   R1, R2, R3 (and R_in when it was searched) of each network on
//           a log Ω axis, the allowed range drawn, so the largest resistor
//           of every network shows.
// Stage names and every other text go through GnuplotString
// (report/text_escape.h): drawn as text, never run.
#ifndef HUSHGAIN_REPORT_TEE_PLOT_SCRIPT_H_
#define HUSHGAIN_REPORT_TEE_PLOT_SCRIPT_H_

#include <optional>
#include <string>

#include "design/tee_search.h"
#include "design/tee_sweep.h"
#include "report/plot_script.h"
#include "report/tee_tables.h"

namespace hushgain {

struct TeePlotOptions {
  PlotFormat format = PlotFormat::kPng;
  std::string output_path;  // where gnuplot writes (a temporary name)
  // Sweep: the largest resistor of the stage file's own network, marked
  // when it lies inside the swept range.
  std::optional<double> stage_largest_ohm;
};

// Requires at least two rows, the first the plain resistor (asserted).
std::string BuildSweepPlotScript(const TeeSweepResult& sweep,
                                 const TeePlotOptions& options);

// Requires at least one network (asserted).
std::string BuildSearchPlotScript(const TeeSearchResult& search,
                                  const TeeSearchQuery& query,
                                  const TeePlotOptions& options);

}  // namespace hushgain

#endif  // HUSHGAIN_REPORT_TEE_PLOT_SCRIPT_H_

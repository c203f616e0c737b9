// The gnuplot script of `compare --plot`, as text (no gnuplot needed to
// build it, so tests read it): one panel of horizontal bars, one per op-amp
// in the ranking's order (the first at the top), each as long as that
// op-amp's input-referred noise rms and split by kind of contributor in
// proportion to each kind's share of the output noise power (e_n x noise
// gain, i_n, resistors, other: design/opamp_comparison.h), with the verdict
// written beside it. A refused op-amp keeps its line, with the word
// "refused" and no bar. Device and stage names go through GnuplotString
// (report/text_escape.h): drawn as text, never run.
#ifndef HUSHGAIN_REPORT_COMPARE_PLOT_SCRIPT_H_
#define HUSHGAIN_REPORT_COMPARE_PLOT_SCRIPT_H_

#include <string>

#include "circuit/stage.h"
#include "design/opamp_comparison.h"
#include "report/plot_axes.h"

namespace hushgain {

struct ComparePlotOptions {
  PlotFormat format = PlotFormat::kPng;
  std::string output_path;  // where gnuplot writes (a temporary name)
};

// Requires at least one row (asserted).
std::string BuildComparePlotScript(const Stage& stage,
                                   const OpAmpComparison& comparison,
                                   const ComparePlotOptions& options);

}  // namespace hushgain

#endif  // HUSHGAIN_REPORT_COMPARE_PLOT_SCRIPT_H_

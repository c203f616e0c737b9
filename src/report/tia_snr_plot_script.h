// The gnuplot script of `tia snr --plot`, as text (no gnuplot needed to
// build it, so tests read it): one panel, log-log, the SNR over the band
// against the incident optical power (the points of design/tia_snr.h as
// an inline datablock), with SNR = 1 drawn as a line, the noise-equivalent
// power marked where the curve crosses it, and the power where the stage
// saturates as a dashed line with the saturated points drawn apart.
// Stage names go through GnuplotString (report/text_escape.h): drawn as
// text, never run.
#ifndef HUSHGAIN_REPORT_TIA_SNR_PLOT_SCRIPT_H_
#define HUSHGAIN_REPORT_TIA_SNR_PLOT_SCRIPT_H_

#include <string>

#include "circuit/stage.h"
#include "design/tia_snr.h"
#include "report/plot_axes.h"

namespace hushgain {

struct TiaSnrPlotOptions {
  PlotFormat format = PlotFormat::kPng;
  std::string output_path;  // where gnuplot writes (a temporary name)
};

// Requires at least two points with positive SNR (asserted).
std::string BuildTiaSnrPlotScript(const Stage& stage,
                                  const TiaSnrResult& result,
                                  const TiaSnrPlotOptions& options);

}  // namespace hushgain

#endif  // HUSHGAIN_REPORT_TIA_SNR_PLOT_SCRIPT_H_

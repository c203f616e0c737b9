// The `compare` report: the same stage with each op-amp
// (design/opamp_comparison.h), as two tables built once (display cells for
// text and Markdown, SI numbers for CSV) and as JSON.
//   text      the stage's name, the band and the ranking, the ranking
//             table (rank, device, class, input-referred rms and density,
//             dominant contributor, worst-case offset, phase margin, -3 dB
//             bandwidth, verdict), then the "why" table (noise power by
//             kind; e_n, i_n, R_opt = e_n / i_n and the source against it),
//             then the refused devices with their reasons
//   markdown  the same as a heading, a list and pipe tables
//   csv       one record per device with every column, SI units in the
//             column names (empty cells for a refused device's figures)
//   json      {"stage", "ranking", "band_Hz", "reference_frequency_Hz",
//              "input_referred_unit", "source_resistance_seen_ohm",
//              "devices": [{"rank", "device", "class", "status", "refusal",
//              "input_referred_rms", "input_referred_density_per_rtHz",
//              "output_rms_V", "dominant", "shares", "offset_worst_case_V",
//              "phase_margin_deg", "crossover_Hz", "bandwidth_3db_Hz",
//              "bandwidth_low_Hz", "e_n_at_reference_V_per_rtHz",
//              "i_n_at_reference_A_per_rtHz", "optimum_source_resistance_ohm",
//              "source_to_optimum_ratio", "verdict", "checks", "warnings"}]}
//             (null where a figure does not exist: a refused device's, a
//             phase margin without crossover, R_opt without a voltage
//             source or with i_n = 0)
#ifndef HUSHGAIN_REPORT_COMPARE_REPORT_H_
#define HUSHGAIN_REPORT_COMPARE_REPORT_H_

#include <string>

#include "circuit/stage.h"
#include "design/opamp_comparison.h"

namespace hushgain {

// `format` is text, markdown, csv or json.
std::string CompareReport(const std::string& format, const Stage& stage,
                          const OpAmpComparison& comparison);

}  // namespace hushgain

#endif  // HUSHGAIN_REPORT_COMPARE_REPORT_H_

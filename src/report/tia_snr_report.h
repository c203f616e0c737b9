// The `tia snr` report: SNR against optical power as one table built once
// (display cells for text and Markdown, SI numbers for CSV) and as JSON,
// with the noise-equivalent power over the band and where the stage
// saturates.
//   text      the stage's name, the responsivity and background light, the
//             NEP and saturation lines, the table
//   markdown  the same as a heading, a list and a pipe table
//   csv       one record per power, SI units in the column names
//   json      {"responsivity_A_per_W", "background_photocurrent_A",
//              "noise_floor_A", "nep_W", "saturation_power_W", "limit_V",
//              "limit", "points": [{"optical_power_W", ...}], "warnings"}
#ifndef HUSHGAIN_REPORT_TIA_SNR_REPORT_H_
#define HUSHGAIN_REPORT_TIA_SNR_REPORT_H_

#include <string>

#include "circuit/stage.h"
#include "design/tia_snr.h"

namespace hushgain {

// `format` is text, markdown, csv or json.
std::string TiaSnrReport(const std::string& format, const Stage& stage,
                         const TiaSnrResult& result);

}  // namespace hushgain

#endif  // HUSHGAIN_REPORT_TIA_SNR_REPORT_H_

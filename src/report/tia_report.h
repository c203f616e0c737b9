// The `tia suggest` report: the proposals as one table built once (display
// cells for text and Markdown, SI numbers for CSV) and as JSON.
//   text      the stage's name, the target, the textbook estimate, the table
//   markdown  the same lines as a heading, a list and a pipe table
//   csv       one record per proposal, SI units in the column names
//   json      {"bandwidth_target_Hz", "largest_rf_estimate_ohm", "best",
//              "rows": [{"rf_ohm", "cf_F", ...}]}
#ifndef HUSHGAIN_REPORT_TIA_REPORT_H_
#define HUSHGAIN_REPORT_TIA_REPORT_H_

#include <string>

#include "circuit/stage.h"
#include "design/tia_suggest.h"

namespace hushgain {

// `format` is text, markdown, csv or json. `stage` is the transimpedance
// stage the proposals were made for (its name, band and reference).
std::string TiaSuggestionReport(const std::string& format, const Stage& stage,
                                const TiaSuggestion& suggestion,
                                double target_hz);

}  // namespace hushgain

#endif  // HUSHGAIN_REPORT_TIA_REPORT_H_

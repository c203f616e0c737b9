// The budget as one JSON object, for scripts. Keys carry their unit
// (output_rms_V, band_Hz); values are SI numbers. The key set is documented
// in README.md and relied upon by tests.
#ifndef HUSHGAIN_REPORT_JSON_REPORT_H_
#define HUSHGAIN_REPORT_JSON_REPORT_H_

#include <string>

#include "budget/budget.h"

namespace hushgain {

// Pretty-printed with two-space indent, ending in a newline.
std::string BudgetToJson(const Budget& budget);

}  // namespace hushgain

#endif  // HUSHGAIN_REPORT_JSON_REPORT_H_

// The budget as a text report for the terminal: a header (stage, band,
// gains), the noise table (one row per contributor, units in the headers),
// the totals, the offset block and, for a T network, the comparison with the
// plain resistor.
#ifndef HUSHGAIN_REPORT_TEXT_REPORT_H_
#define HUSHGAIN_REPORT_TEXT_REPORT_H_

#include <string>

#include "budget/budget.h"

namespace hushgain {

std::string BudgetToText(const Budget& budget);

}  // namespace hushgain

#endif  // HUSHGAIN_REPORT_TEXT_REPORT_H_

// The budget's text sections on real parts: the offset and noise at the ends
// of the temperature range, the bias-current compensation resistor, and the
// resistors' DC drops with their excess noise and the upgrade advice.
#ifndef HUSHGAIN_REPORT_REAL_PARTS_TEXT_H_
#define HUSHGAIN_REPORT_REAL_PARTS_TEXT_H_

#include <string>

#include "budget/budget.h"

namespace hushgain {

// Empty when the budget has none of these blocks.
std::string RealPartsText(const Budget& budget);

}  // namespace hushgain

#endif  // HUSHGAIN_REPORT_REAL_PARTS_TEXT_H_

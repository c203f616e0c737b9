// The budget as Markdown for a design note, to paste as it is: a heading
// with the stage name, a list with temperature, band and gains, the noise
// table (one row per contributor, then the total), the notes under it
// (peak-to-peak, input-referred, full scale), the offset table and, for a
// T network, the comparison with the plain resistor. The cells are those of
// the text report (report/budget_tables.h); text from the stage file is
// escaped, so a name cannot turn into markup.
#ifndef HUSHGAIN_REPORT_MARKDOWN_REPORT_H_
#define HUSHGAIN_REPORT_MARKDOWN_REPORT_H_

#include <string>

#include "budget/budget.h"

namespace hushgain {

std::string BudgetToMarkdown(const Budget& budget);

}  // namespace hushgain

#endif  // HUSHGAIN_REPORT_MARKDOWN_REPORT_H_

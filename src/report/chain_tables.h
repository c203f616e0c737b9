// The signal chain's report pieces (Budget::chain, budget/chain_block.h),
// built once and shared by the text and Markdown reports; the table also
// renders as CSV:
//   ChainTable  one row per block in chain order (front end, second stage,
//               filter, converter, quantization), a rule, then "total". Columns
//               (display / CSV): block / block, rms at the ADC input /
//               rms_V, LSB rms / lsb_rms, share / share.
//   ChainNotes  the lines under the table as (label, text): the second
//               stage, the filter,
//               where the noise was counted and how much folded, where the
//               chain's density falls below the converter's own, the
//               converter's figures and the dominant block.
#ifndef HUSHGAIN_REPORT_CHAIN_TABLES_H_
#define HUSHGAIN_REPORT_CHAIN_TABLES_H_

#include <string>
#include <utility>
#include <vector>

#include "budget/budget.h"
#include "report/table.h"

namespace hushgain {

enum class ChainCells { kDisplay, kCsv };

// Requires budget.chain.
Table ChainTable(const Budget& budget, ChainCells cells);

// Requires budget.chain. "16 bits, 4.096 V full scale (peak to peak), 200 kHz
// sampling (Nyquist 100 kHz)".
std::string ChainTitle(const Budget& budget);

// Requires budget.chain.
std::vector<std::pair<std::string, std::string>> ChainNotes(
    const Budget& budget);

}  // namespace hushgain

#endif  // HUSHGAIN_REPORT_CHAIN_TABLES_H_

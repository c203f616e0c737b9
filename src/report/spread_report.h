// The spread (Monte Carlo) report: a text summary of the distributions and
// yields, and the samples as CSV (one row per sample, SI units, the columns
// named in the header).
#ifndef HUSHGAIN_REPORT_SPREAD_REPORT_H_
#define HUSHGAIN_REPORT_SPREAD_REPORT_H_

#include <cstdint>
#include <string>

#include "budget/spread.h"
#include "budget/spread_statistics.h"

namespace hushgain {

std::string SpreadToText(const SpreadRun& run, const SpreadSummary& summary,
                         const SpreadLimits& limits, std::uint64_t seed);

// Columns: index, temperature_C, vos_V, ios_A, gain, gain_error, offset_V,
// noise_rms_V, then one <resistor>_ohm column per resistor.
std::string SpreadToCsv(const SpreadRun& run);

}  // namespace hushgain

#endif  // HUSHGAIN_REPORT_SPREAD_REPORT_H_

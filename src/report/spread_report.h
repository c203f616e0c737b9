// The spread (Monte Carlo) report: a summary of the distributions and
// yields (text, Markdown, CSV or JSON), and the samples as CSV (one row per
// sample, SI units, the columns named in the header).
#ifndef HUSHGAIN_REPORT_SPREAD_REPORT_H_
#define HUSHGAIN_REPORT_SPREAD_REPORT_H_

#include <cstddef>
#include <cstdint>
#include <string>

#include "montecarlo/spread.h"
#include "montecarlo/spread_statistics.h"

namespace hushgain {

// The summary in `format`: text (today's report), markdown (the same lines
// and tables), csv (one record per figure: figure, mean, sigma, the 0.135 %
// and 99.865 % percentiles, min, max, limit, yield; SI numbers, the gain
// error as a ratio) or json (the same figures, the nominal, the limits and
// the yields, null where no limit was given).
std::string SpreadReport(const std::string& format, const SpreadRun& run,
                         const SpreadSummary& summary,
                         const SpreadLimits& limits, std::uint64_t seed);

// Columns: index, temperature_C, vos_V, ios_A, gain, gain_error, offset_V,
// noise_rms_V, flags, then one <resistor>_ohm column per resistor and one
// <capacitor>_F column per capacitor when capacitors are drawn. The header
// line, the rows of samples [begin, end) (the draws replayed by
// SpreadRun::Sample, so a long run is written piece by piece), and all of
// it in one string.
std::string SpreadCsvHeader(const SpreadRun& run);
std::string SpreadCsvRows(const SpreadRun& run, std::size_t begin,
                          std::size_t end);
std::string SpreadToCsv(const SpreadRun& run);

}  // namespace hushgain

#endif  // HUSHGAIN_REPORT_SPREAD_REPORT_H_

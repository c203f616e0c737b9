// The T-network sweep and search as a text table, CSV (one header line,
// SI numbers, units in the column names) and JSON (keys carry their unit).
// Every figure comes from the full-engine budgets in the results.
#ifndef HUSHGAIN_REPORT_TEE_REPORT_H_
#define HUSHGAIN_REPORT_TEE_REPORT_H_

#include <optional>
#include <string>

#include "budget/tee_search.h"
#include "budget/tee_sweep.h"

namespace hushgain {

// What a search was asked, for its report header.
struct TeeSearchQuery {
  std::string series;  // "E96"
  double min_ohm = 0;
  double max_ohm = 0;
  std::optional<double> input_min_ohm;  // set with a free input resistor
  std::optional<double> input_max_ohm;
  double target_gain = 0;
  double gain_tolerance = 0;
  std::string ranking;  // "noise", "offset" or "weighted"
  double offset_weight = 0;
};

std::string SweepToText(const TeeSweepResult& sweep);
std::string SweepToCsv(const TeeSweepResult& sweep);
std::string SweepToJson(const TeeSweepResult& sweep);

std::string SearchToText(const TeeSearchResult& search,
                         const TeeSearchQuery& query);
std::string SearchToCsv(const TeeSearchResult& search,
                        const TeeSearchQuery& query);
std::string SearchToJson(const TeeSearchResult& search,
                         const TeeSearchQuery& query);

}  // namespace hushgain

#endif  // HUSHGAIN_REPORT_TEE_REPORT_H_

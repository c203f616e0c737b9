// Shared helpers for the test suite: named tolerances, one relative-error
// helper; the stages built in code are in fixture_stages.h (shared with
// bench/).
#ifndef HUSHGAIN_TESTS_TEST_SUPPORT_H_
#define HUSHGAIN_TESTS_TEST_SUPPORT_H_

#include <doctest/doctest.h>

#include <cmath>
#include <stdexcept>
#include <string>
#include <vector>

#include "base/physical_constants.h"
#include "budget/budget.h"
#include "budget/compute_budget.h"
#include "circuit/stage.h"
#include "fixture_stages.h"
#include "review/review.h"

namespace hushgain::test {

inline constexpr double kRelTight = 1e-9;     // algebra, rounding only
inline constexpr double kRelIdeal = 1e-6;     // "ideal" op-amp (A0 = 1e12)
inline constexpr double kRelIntegral = 1e-4;  // integration target
inline constexpr double kRelTable = 5e-7;     // 7-digit published tables

inline double RelErr(double actual, double expected) {
  if (expected == 0) return std::fabs(actual);
  return std::fabs(actual - expected) / std::fabs(expected);
}

inline double FourKT(double temperature_k) {
  return 4.0 * kBoltzmannJPerK * temperature_k;
}

// The reviewed budget of `stage` (every review block on, as `budget`
// prints it) at a relative integration tolerance; a failed status fails the
// test with its message.
inline Budget ComputeOrFail(const Stage& stage, double tolerance) {
  ReviewOptions options;
  options.budget.integration.relative_tolerance = tolerance;
  BudgetOutcome outcome = ReviewStage(stage, options);
  REQUIRE_MESSAGE(outcome.status.ok, outcome.status.message);
  return outcome.budget;
}

inline const Contributor& FindContributor(const Budget& b,
                                          const std::string& name) {
  for (const Contributor& c : b.contributors)
    if (c.name == name) return c;
  throw std::runtime_error("no contributor " + name);
}

// An RFC 4180 reader: records end in CRLF (rule 1), fields may be quoted
// (rule 5), a quoted field may hold commas, CR and LF (rule 6) and a
// doubled quote stands for one (rule 7). Fails the test on a bad record.
inline std::vector<std::vector<std::string>> ReadCsv(const std::string& text) {
  std::vector<std::vector<std::string>> records;
  std::vector<std::string> record;
  std::string field;
  std::size_t i = 0;
  while (i < text.size()) {
    if (text[i] == '"' && field.empty()) {
      ++i;
      for (;;) {
        REQUIRE(i < text.size());
        if (text[i] == '"') {
          if (i + 1 < text.size() && text[i + 1] == '"') {
            field += '"';
            i += 2;
            continue;
          }
          ++i;
          break;
        }
        field += text[i++];
      }
      REQUIRE((i == text.size() || text[i] == ',' || text[i] == '\r'));
      continue;
    }
    if (text[i] == ',') {
      record.push_back(field);
      field.clear();
      ++i;
      continue;
    }
    if (text[i] == '\r') {
      REQUIRE(i + 1 < text.size());
      REQUIRE(text[i + 1] == '\n');
      record.push_back(field);
      field.clear();
      records.push_back(record);
      record.clear();
      i += 2;
      continue;
    }
    REQUIRE(text[i] != '\n');  // a bare LF outside quotes is not a record end
    field += text[i++];
  }
  REQUIRE(field.empty());
  REQUIRE(record.empty());  // the last record ends in CRLF too
  return records;
}

}  // namespace hushgain::test

#endif  // HUSHGAIN_TESTS_TEST_SUPPORT_H_

// Shared helpers for the test suite: named tolerances, one relative-error
// helper, an ideal op-amp, stages built in code.
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

// An op-amp close enough to ideal that its finite gain is below kRelIdeal
// at low frequency for noise gains up to ~1e4: A0 = 1e12, GBW = 1e15 Hz.
inline OpAmpModel IdealOpAmp(double e_w = 0, double i_w = 0) {
  OpAmpModel m;
  m.class_name = "ideal";
  m.e_w_v_per_rthz = e_w;
  m.i_w_a_per_rthz = i_w;
  m.open_loop_gain = 1e12;
  m.gbw_hz = 1e15;
  return m;
}

inline double FourKT(double temperature_k) {
  return 4.0 * kBoltzmannJPerK * temperature_k;
}

inline Stage InvertingStage(double rin, double rf, const OpAmpModel& opamp,
                            double temperature_k = 300.0) {
  Stage s;
  s.name = "test stage";
  s.temperature_k = temperature_k;
  s.band_low_hz = 0.1;
  s.band_high_hz = 10.0;
  s.reference_hz = 1.0;
  s.opamp = opamp;
  s.input_resistor_ohm = rin;
  s.feedback.kind = Feedback::Kind::kResistor;
  s.feedback.resistor_ohm = rf;
  return s;
}

inline Stage TeeStage(double rin, double r1, double r2, double r3,
                      const OpAmpModel& opamp, double temperature_k = 300.0) {
  Stage s = InvertingStage(rin, 1.0, opamp, temperature_k);
  s.feedback.kind = Feedback::Kind::kTee;
  s.feedback.tee = {r1, r2, r3};
  return s;
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

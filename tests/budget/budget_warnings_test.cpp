// Warnings of the budget that have no closed form of their own (README,
// "Warnings"): the band integral that stops short of its tolerance, and a
// benign stage that draws none. The drive warnings are in
// output_drive_test.cpp, the phase-margin ones in
// transimpedance_budget_test.cpp, the open-loop one in
// extreme_values_test.cpp.
#include <doctest/doctest.h>

#include <cmath>
#include <string>

#include "budget/compute_budget.h"
#include "test_support.h"

namespace hushgain {
namespace {

Stage Benign() {
  OpAmpModel m = test::IdealOpAmp(5e-9, 1e-13);
  m.open_loop_gain = 1e6;
  m.gbw_hz = 10e6;
  m.f_cv_hz = 100;  // a 1/f corner, so the integrand is not flat
  Stage s = test::InvertingStage(1e3, 100e3, m, 300.0);
  s.band_low_hz = 0.1;
  s.band_high_hz = 10e3;
  s.reference_hz = 1e3;
  return s;
}

}  // namespace

TEST_CASE("a benign stage draws no warning") {
  BudgetOutcome r = ComputeBudget(Benign(), BudgetOptions{});
  REQUIRE(r.status.ok);
  CHECK(r.budget.warnings.empty());
}

TEST_CASE(
    "an integral stopped by its interval budget warns and still reports its "
    "estimate") {
  // One interval cannot reach 1e-12 over five decades: the integrator stops
  // at max_intervals and says how far it got.
  BudgetOptions options;
  options.integration.relative_tolerance = 1e-12;
  options.integration.max_intervals = 1;
  BudgetOutcome r = ComputeBudget(Benign(), options);
  REQUIRE(r.status.ok);
  REQUIRE(r.budget.warnings.size() == 1);
  const std::string& w = r.budget.warnings[0];
  CHECK(w.rfind("noise integration stopped at an estimated relative error of ",
                0) == 0);
  CHECK(w.find("(asked 1e-12)") != std::string::npos);
  CHECK(r.budget.integration_relative_error > 1e-12);
  CHECK(std::isfinite(r.budget.output_rms_v));
  CHECK(r.budget.output_rms_v > 0);
  // The estimate is still close: the same stage integrated properly.
  BudgetOutcome good = ComputeBudget(Benign(), BudgetOptions{});
  REQUIRE(good.status.ok);
  CHECK(test::RelErr(r.budget.output_rms_v, good.budget.output_rms_v) < 0.1);
}

}  // namespace hushgain

// The output-drive check of the budget (budget/compute_budget.cpp,
// OutputDrive): the op-amp's output current with the output at the stated
// full scale, against the device's output current limit, and the swing
// against the supply span.
//
// Closed forms, by Kirchhoff's current law at the output node with the
// - input at virtual ground (V- = 0, error of order 1/A0): the op-amp
// supplies the load and the feedback path,
//   plain Rf:  I = V_fs / R_load + V_fs / R_f
//   T network: I = V_fs / R_load + V_fs / (R2 + R1 || R3)
// (the output sees R2 in series with R1 and R3 in parallel, both ending at
// ground or virtual ground). Most op-amps can supply roughly 10 to 20 mA
// (common practice, no source); the devices' default limit is 20 mA.
#include <doctest/doctest.h>

#include <string>

#include "budget/compute_budget.h"
#include "test_support.h"

namespace hushgain {
namespace {

using test::RelErr;

// The closed forms above hold to about NG / A0 = 1e-10 here.
constexpr double kRelDrive = 1e-6;

Stage DriveStage(double rin, double rf, double load, double full_scale) {
  OpAmpModel m = test::IdealOpAmp(5e-9, 1e-13);
  m.open_loop_gain = 1e12;
  m.gbw_hz = 1e9;
  m.output_resistance_ohm = 50;  // the current is the same with or without
  m.output_current_limit_a = 0.02;
  m.supply_v = 30;
  Stage s = test::InvertingStage(rin, rf, m, 300.0);
  s.load_ohm = load;
  s.full_scale_output_v = full_scale;
  return s;
}

Budget Compute(const Stage& stage) {
  BudgetOutcome outcome = ComputeBudget(stage, BudgetOptions{});
  REQUIRE_MESSAGE(outcome.status.ok, outcome.status.message);
  return outcome.budget;
}

int CountContaining(const std::vector<std::string>& warnings,
                    const std::string& part) {
  int n = 0;
  for (const std::string& w : warnings) n += w.find(part) != std::string::npos;
  return n;
}

}  // namespace

TEST_CASE(
    "the full-scale output current of a plain stage is V_fs (1/R_load + "
    "1/R_f)") {
  const Budget b = Compute(DriveStage(1e3, 100e3, 2e3, 10.0));
  REQUIRE(b.full_scale_output_current_a.has_value());
  const double expected = 10.0 / 2e3 + 10.0 / 100e3;  // 5.1 mA
  CHECK(RelErr(*b.full_scale_output_current_a, expected) < kRelDrive);
  CHECK(b.output_current_limit_a == 0.02);
  CHECK(CountContaining(b.warnings, "output limit") == 0);
}

TEST_CASE("the full-scale output current of a T network counts R2 + R1 || R3") {
  Stage s = DriveStage(1e3, 1.0, 10e3, 5.0);
  s.feedback.kind = Feedback::Kind::kTee;
  s.feedback.tee = {10e3, 1e3, 100.0};
  const Budget b = Compute(s);
  REQUIRE(b.full_scale_output_current_a.has_value());
  const double r1_par_r3 = 10e3 * 100.0 / (10e3 + 100.0);
  const double expected =
      5.0 / 10e3 + 5.0 / (1e3 + r1_par_r3);  // about 5.05 mA
  CHECK(RelErr(*b.full_scale_output_current_a, expected) < kRelDrive);
  CHECK(CountContaining(b.warnings, "output limit") == 0);
}

TEST_CASE(
    "an output current beyond the limit at full scale draws one warning naming "
    "both") {
  // 4 V into 100 ohm is 40 mA, twice the 20 mA limit.
  const Budget b = Compute(DriveStage(1e3, 100e3, 100.0, 4.0));
  const double expected = 4.0 / 100.0 + 4.0 / 100e3;
  CHECK(RelErr(*b.full_scale_output_current_a, expected) < kRelDrive);
  REQUIRE(CountContaining(b.warnings, "output limit") == 1);
  CHECK(CountContaining(
            b.warnings,
            "at the full-scale 4 V the op-amp must source 40 mA, beyond its 20 "
            "mA "
            "output limit: raise the load or feedback resistance") == 1);
}

TEST_CASE("a full scale above half the supply span draws a warning") {
  // ±16 V from a 30 V span cannot be reached.
  const Budget b = Compute(DriveStage(1e3, 100e3, 1e6, 16.0));
  CHECK(CountContaining(b.warnings,
                        "the full-scale swing of \xC2\xB1"
                        "16 V exceeds half the 30 V supply span") == 1);
  const Budget fits = Compute(DriveStage(1e3, 100e3, 1e6, 15.0));
  CHECK(CountContaining(fits.warnings, "supply span") == 0);
}

TEST_CASE(
    "without a full scale there is no drive figure and no drive warning") {
  Stage s = DriveStage(1e3, 100e3, 10.0, 1.0);
  s.full_scale_output_v.reset();
  const Budget b = Compute(s);
  CHECK_FALSE(b.full_scale_output_current_a.has_value());
  CHECK(CountContaining(b.warnings, "output limit") == 0);
}

}  // namespace hushgain

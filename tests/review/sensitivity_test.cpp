// Which part to change (review/sensitivity.h): the logarithmic
// sensitivities against identities that hold exactly.
#include "review/sensitivity.h"

#include <doctest/doctest.h>

#include <cmath>
#include <string>

#include "review/review.h"
#include "test_support.h"

namespace hushgain {
namespace {

using test::RelErr;

// Richardson's O(h^4) at h = 1e-3 and the noise on frozen nodes: the
// derivatives are good to about 1e-9; the bandwidth is bisected to 1e-8,
// which a step of 1e-3 turns into 1e-5.
constexpr double kRelDerivative = 1e-6;
constexpr double kRelBandwidthDerivative = 1e-4;

Budget Reviewed(const Stage& stage) {
  ReviewOptions options;
  options.sensitivity = true;
  const BudgetOutcome out = ReviewStage(stage, options);
  REQUIRE_MESSAGE(out.status.ok, out.status.message);
  REQUIRE(out.budget.sensitivity);
  return out.budget;
}

const SensitivityRow& Row(const Budget& b, const std::string& name) {
  for (const SensitivityRow& r : b.sensitivity->rows)
    if (r.parameter == name) return r;
  FAIL("no sensitivity row " << name);
  return b.sensitivity->rows.front();
}

TEST_CASE("d ln(rms) / d ln(e_n) is e_n's share of the noise power") {
  // P = P_other + e_w^2 A with e_n white: d ln sqrt(P) / d ln e_w =
  // e_w^2 A / P, e_n's share (derivation in review/sensitivity.h).
  const Stage stage =
      test::InvertingStage(10e3, 1e6, test::IdealOpAmp(20e-9, 1e-15));
  const Budget b = Reviewed(stage);
  const double share = test::FindContributor(b, "e_n").share;
  CHECK(share > 0.1);
  CHECK(RelErr(Row(b, "e_n").noise, share) < kRelDerivative);
  CHECK(b.sensitivity->largest_error < 1e-6);
}

TEST_CASE("a resistor with only its own thermal noise has half its share") {
  // R_plus at the + input with i_n = 0 and no pin capacitance: its 4kTR_p
  // reaches the output with the noise gain and it changes nothing else, so
  // d ln rms / d ln R_p = (1/2) its share (4kTR is linear in R).
  Stage stage = test::InvertingStage(10e3, 1e6, test::IdealOpAmp(5e-9, 0));
  stage.plus_resistor.mode = PlusResistor::Mode::kValue;
  stage.plus_resistor.ohms = 47e3;
  const Budget b = Reviewed(stage);
  const double share = test::FindContributor(b, "R_plus").share;
  CHECK(share > 0.05);
  CHECK(RelErr(Row(b, "R_plus").noise, 0.5 * share) < kRelDerivative);
}

TEST_CASE("offset and bandwidth sensitivities follow their closed forms") {
  // Offset Vos NG with NG = 1 + R_f/R_in (no bias current): d ln/d ln Vos
  // = 1 and d ln/d ln R_f = (R_f/R_in) / NG. Bandwidth of a single-pole
  // op-amp with A0 >> NG: GBW / NG, so d ln BW / d ln GBW = 1 (REFERENCES.md
  // section 6 for the noise gain; the single-pole closed loop from memory).
  OpAmpModel m = test::IdealOpAmp(5e-9, 0);
  m.gbw_hz = 1e6;
  m.vos_v = 1e-3;
  const Stage stage = test::InvertingStage(10e3, 100e3, m);
  const Budget b = Reviewed(stage);
  REQUIRE(Row(b, "Vos").offset);
  CHECK(RelErr(*Row(b, "Vos").offset, 1.0) < kRelDerivative);
  REQUIRE(Row(b, "R_f").offset);
  CHECK(RelErr(*Row(b, "R_f").offset, 10.0 / 11.0) < kRelDerivative);
  REQUIRE(Row(b, "GBW").bandwidth);
  CHECK(RelErr(*Row(b, "GBW").bandwidth, 1.0) < kRelBandwidthDerivative);
  // Ranked by the largest magnitude of the three.
  const auto& rows = b.sensitivity->rows;
  for (std::size_t i = 1; i < rows.size(); ++i) {
    auto size = [](const SensitivityRow& r) {
      return std::max({std::fabs(r.noise), std::fabs(r.offset.value_or(0)),
                       std::fabs(r.bandwidth.value_or(0))});
    };
    CHECK(size(rows[i - 1]) >= size(rows[i]));
  }
}

TEST_CASE("the advice is the whole budget of the changed stage") {
  // e_n dominates (100 nV/rtHz against 10k / 1M): halving it must lower
  // the output noise, by the ratio a budget of the changed stage gives.
  Stage stage =
      test::InvertingStage(10e3, 1e6, test::IdealOpAmp(100e-9, 1e-15));
  const Budget b = Reviewed(stage);
  const SensitivityBlock& s = *b.sensitivity;
  CHECK(s.advice_parameter == "e_n");
  CHECK(s.advice_factor == 0.5);
  stage.opamp.e_w_v_per_rthz *= 0.5;
  const BudgetOutcome halved = ComputeBudget(stage, BudgetOptions{});
  REQUIRE(halved.status.ok);
  CHECK(RelErr(s.advice_noise_ratio,
               halved.budget.output_rms_v / b.output_rms_v) < 1e-4);
  CHECK(s.advice_noise_ratio < 0.6);
}

}  // namespace
}  // namespace hushgain

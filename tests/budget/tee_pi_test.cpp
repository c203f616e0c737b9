// The T network's pi equivalent in the budget (budget/tee_pi.h): the arms
// from the star-mesh transform, the input arm's current from the engine's
// solution, the output arm's load at full scale.
#include "budget/tee_pi.h"

#include <doctest/doctest.h>

#include <cmath>
#include <complex>

#include "base/physical_constants.h"
#include "budget/compute_budget.h"
#include "test_support.h"

namespace hushgain {
namespace {

using test::RelErr;

constexpr double kR1 = 47e3, kR2 = 220e3, kR3 = 2.2e3, kRin = 4.7e3;

// A T-network stage on an op-amp with a finite A0 and GBW but no output
// resistance and no pin capacitance, so the summing node sits at exactly
// -v_o / A(f).
Stage SinglePoleStage() {
  OpAmpModel m = test::IdealOpAmp(5e-9, 0.5e-12);
  m.open_loop_gain = 1e5;
  m.gbw_hz = 1e6;
  Stage s = test::TeeStage(kRin, kR1, kR2, kR3, m);
  s.band_low_hz = 10;
  s.band_high_hz = 20e3;
  s.reference_hz = 1e3;
  s.full_scale_output_v = 5;
  s.load_ohm = 10e3;
  return s;
}

TEST_CASE("the input arm carries (R2/R3) / |1 + A(f)| of the bridge current") {
  // Star-mesh (Kennelly 1899): the input arm S/R2 and the bridge S/R3 share
  // the summing node; with v_n = -v_o / A(f) (derivation in tee_pi.h) the
  // ratio of their currents is (R2/R3) / |1 + A(f)|, A(f) the macro
  // model's single pole A0 / (1 + j f A0 / GBW).
  const Stage stage = SinglePoleStage();
  const BudgetOutcome out = ComputeBudget(stage, BudgetOptions{});
  REQUIRE_MESSAGE(out.status.ok, out.status.message);
  REQUIRE(out.budget.tee_pi);
  const TeePiBlock& pi = *out.budget.tee_pi;
  auto expected = [&](double f) {
    const std::complex<double> a =
        1.0 / std::complex<double>(1 / stage.opamp.open_loop_gain,
                                   f / stage.opamp.gbw_hz);
    return (kR2 / kR3) / std::abs(1.0 + a);
  };
  CHECK(pi.fraction_at_dc.f_hz == 0);
  CHECK(pi.fraction_at_reference.f_hz == 1e3);
  CHECK(pi.fraction_at_band_high.f_hz == 20e3);
  for (const TeePiBlock::ArmFraction& a :
       {pi.fraction_at_dc, pi.fraction_at_reference,
        pi.fraction_at_band_high}) {
    CAPTURE(a.f_hz);
    CHECK(RelErr(a.fraction, expected(a.f_hz)) < test::kRelIdeal);
  }
  // Tiny at DC, several percent near the top of the band.
  CHECK(pi.fraction_at_dc.fraction < 1e-3);
  CHECK(pi.fraction_at_band_high.fraction > 0.01);
}

TEST_CASE("the pi arms, the output arm's load and the noise gain's term") {
  const Stage stage = SinglePoleStage();
  const BudgetOutcome out = ComputeBudget(stage, BudgetOptions{});
  REQUIRE(out.status.ok);
  const Budget& b = out.budget;
  REQUIRE(b.tee_pi);
  const TeePiBlock& pi = *b.tee_pi;
  // Star-mesh: each pi arm is S over the opposite star arm.
  const double s = kR1 * kR2 + kR2 * kR3 + kR3 * kR1;
  CHECK(RelErr(pi.arms.bridge_ohm, s / kR3) < test::kRelTight);
  CHECK(RelErr(pi.arms.input_arm_ohm, s / kR2) < test::kRelTight);
  CHECK(RelErr(pi.arms.output_arm_ohm, s / kR1) < test::kRelTight);
  CHECK(RelErr(pi.input_arm_noise_gain, kR2 / kR3) < test::kRelTight);
  // The output arm at the full-scale 5 V draws 5 V / (S/R1), a share of the
  // op-amp's output current (load, bridge and arm; the engine's).
  REQUIRE(pi.output_arm_current_a);
  CHECK(RelErr(*pi.output_arm_current_a, 5.0 * kR1 / s) < test::kRelTight);
  REQUIRE(pi.output_arm_share);
  REQUIRE(b.full_scale_output_current_a);
  CHECK(RelErr(*pi.output_arm_share,
               *pi.output_arm_current_a / *b.full_scale_output_current_a) <
        test::kRelTight);
  // At the full scale the op-amp drives the load, the arm and the bridge
  // (the summing node is at virtual ground): 5 (1/R_L + R1/S + 1/Req).
  CHECK(RelErr(*b.full_scale_output_current_a,
               5.0 * (1 / 10e3 + kR1 / s + kR3 / s)) < 1e-3);
  // The sentence's identity: the DC noise gain is 1 + Req/R_a + R2/R3
  // (REFERENCES.md section 6) with an ideal op-amp.
  const double req = s / kR3;
  OpAmpModel ideal = test::IdealOpAmp(5e-9, 0.5e-12);
  Stage exact = stage;
  exact.opamp = ideal;
  const BudgetOutcome ideal_out = ComputeBudget(exact, BudgetOptions{});
  REQUIRE(ideal_out.status.ok);
  CHECK(RelErr(ideal_out.budget.noise_gain_dc, 1 + req / kRin + kR2 / kR3) <
        test::kRelIdeal);
}

TEST_CASE("a plain feedback resistor has no pi block") {
  const Stage stage =
      test::InvertingStage(10e3, 1e6, test::IdealOpAmp(5e-9, 0.5e-12));
  const BudgetOutcome out = ComputeBudget(stage, BudgetOptions{});
  REQUIRE(out.status.ok);
  CHECK_FALSE(out.budget.tee_pi);
}

}  // namespace
}  // namespace hushgain

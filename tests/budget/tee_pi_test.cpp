// The T network's pi equivalent in the budget (budget/tee_pi.h): the arms
// from the star-mesh transform, the input arm's current from the engine's
// solution, the output arm's load at full scale.
#include "budget/tee_pi.h"

#include <doctest/doctest.h>

#include <cmath>
#include <complex>

#include "analysis/mna_system.h"
#include "base/physical_constants.h"
#include "budget/compute_budget.h"
#include "circuit/expand_stage.h"
#include "fixture_stages.h"
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

MnaSystem BuildSystem(const Netlist& net) {
  MnaSystem system;
  const Status s = MnaSystem::Build(net, &system);
  REQUIRE_MESSAGE(s.ok, s.message);
  return system;
}

TEST_CASE("the pi network solved by the engine has the T network's transfers") {
  // The star-mesh transform (Kennelly 1899 for three terminals) is exact at
  // every frequency: the T (R1 from the summing node, R2 to the output, R3
  // to ground) and its pi (S/R3 across, S/R2 and S/R1 to ground) give the
  // same transfer from every excitation to the output. The stage is the
  // JFET-like one with its source resistance, R_out, pin capacitances and
  // load, so the arms load a real output and a node that is not at exactly
  // zero volts. The pi is built from the plain stage with R_f = S/R3 and
  // the two arms added to its nodes.
  Stage tee = test::JfetTeeStage();
  tee.feedback.capacitor_f = 10e-12;
  const TeeNetwork& t = tee.feedback.tee;
  const double s =
      t.r1_ohm * t.r2_ohm + t.r2_ohm * t.r3_ohm + t.r3_ohm * t.r1_ohm;
  Stage plain = tee;
  plain.feedback.kind = Feedback::Kind::kResistor;
  plain.feedback.resistor_ohm = s / t.r3_ohm;
  Netlist pi = ExpandStage(plain);
  NodeId summing = kGround, output = kGround;
  for (const Resistor& r : pi.resistors)
    if (r.name == "R_f") {
      summing = r.a;
      output = r.b;
    }
  REQUIRE(summing != kGround);
  REQUIRE(output != kGround);
  pi.resistors.push_back({"S/R2", summing, kGround, s / t.r2_ohm, true});
  pi.resistors.push_back({"S/R1", output, kGround, s / t.r1_ohm, true});

  const Netlist star = ExpandStage(tee);
  NodeId star_summing = kGround;
  for (const Resistor& r : star.resistors)
    if (r.name == "R1") star_summing = r.a;
  REQUIRE(star_summing != kGround);
  const MnaSystem star_system = BuildSystem(star);
  const MnaSystem pi_system = BuildSystem(pi);
  AdjointSolver star_solver(star_system);
  AdjointSolver pi_solver(pi_system);
  // The signal, e_n (and Vos) at the + input, and a current into the
  // summing node (i_n-, the bias current).
  const std::vector<std::pair<Excitation, Excitation>> ports = {
      {star.signal, pi.signal},
      {OpAmpInputVoltage{0}, OpAmpInputVoltage{0}},
      {CurrentInjection{star_summing, kGround},
       CurrentInjection{summing, kGround}},
  };
  for (double f : {0.0, 1.0, 1e3, 1e5, 1e6, 1e7}) {
    CAPTURE(f);
    REQUIRE(star_solver.SolveAt(f).ok);
    REQUIRE(pi_solver.SolveAt(f).ok);
    for (const auto& [a, b] : ports) {
      const Complex ts = star_solver.Transfer(star_system.Compile(a));
      const Complex tp = pi_solver.Transfer(pi_system.Compile(b));
      CHECK(std::abs(ts - tp) <= 1e-9 * std::abs(ts));
    }
  }
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

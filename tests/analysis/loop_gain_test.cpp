#include "analysis/loop_gain.h"

#include <doctest/doctest.h>

#include <cmath>

#include "base/physical_constants.h"
#include "circuit/expand_stage.h"
#include "test_support.h"

namespace hushgain {
namespace {

using test::RelErr;

TEST_CASE(
    "the loop gain of an inverting stage is A(s) / NG; crossing at f_p "
    "sqrt((A0/NG)^2 - 1)") {
  // Single-pole A(s) = A0 / (1 + s/w_p) (REFERENCES.md section 11; Sedra and
  // Smith, ch. 2); with resistive feedback beta = 1/NG, so |T| = 1 where
  // A0/NG = sqrt(1 + (f/f_p)^2), and the phase there is -atan(f/f_p).
  OpAmpModel m = test::IdealOpAmp();
  m.open_loop_gain = 1e6;
  m.gbw_hz = 1e7;
  const Stage stage = test::InvertingStage(1e3, 100e3, m);
  const Netlist net = ExpandStage(stage);
  MnaSystem system;
  REQUIRE(MnaSystem::Build(net, &system).ok);
  LoopGainSolver solver(system, 0, m);
  const double ng = 101.0, fp = 10.0;
  Complex t;
  REQUIRE(solver.LoopGainAt(0.0, &t).ok);
  CHECK(RelErr(t.real(), 1e6 / ng) < test::kRelTight);
  REQUIRE(solver.LoopGainAt(1e4, &t).ok);
  CHECK(std::abs(t - Complex(1e6 / ng) / Complex(1.0, 1e4 / fp)) <
        1e-9 * std::abs(t));

  const LoopSummary loop = SummarizeLoop(solver, 1e-3, 1e10);
  REQUIRE(loop.status.ok);
  REQUIRE(loop.crossover_found);
  const double fc = fp * std::sqrt((1e6 / ng) * (1e6 / ng) - 1);
  CHECK(RelErr(loop.crossover_hz, fc) < 1e-9);
  CHECK(RelErr(loop.phase_margin_deg, 180 - std::atan(fc / fp) * 180 / kPi) <
        1e-9);
}

// The source of truth for the low-rank path: the dense LU of the same
// matrix. The loop's network is formed here from the system's G and C with
// op-amp 0's controlled-source row replaced by V_amp = 1 (the return-ratio
// drive of analysis/loop_gain.h) and solved by Eigen's partial-pivoting LU;
// T = -A(j w) (V+ - V-). Every frequency must agree to 1e-10 relative,
// whichever path LoopGainAt took. Returns how many frequencies above DC
// kept the low-rank update.
int CheckLoopAgainstDenseLu(const Stage& stage) {
  const Netlist net = ExpandStage(stage);
  MnaSystem system;
  REQUIRE(MnaSystem::Build(net, &system).ok);
  LoopGainSolver solver(system, 0, stage.opamp);
  const int n = system.size(), row = system.OpAmpRow(0);
  RealMatrix g = system.g(), c = system.c();
  g.row(row).setZero();
  c.row(row).setZero();
  g(row, system.OpAmpAmplifierNode(0)) = 1.0;
  ComplexVector b = ComplexVector::Zero(n);
  b[row] = 1.0;
  int low_rank = 0;
  for (int i = 0; i <= 40; ++i) {
    const double f = i == 0 ? 0.0 : 0.01 * std::pow(10.0, (i - 1) / 4.0);
    CAPTURE(f);
    Complex t;
    REQUIRE(solver.LoopGainAt(f, &t).ok);
    if (f == 0) CHECK_FALSE(solver.last_solve_low_rank());
    if (solver.last_solve_low_rank()) ++low_rank;
    const double w = 2.0 * kPi * f;
    ComplexMatrix y(n, n);
    y.real() = g;
    y.imag() = w * c;
    const ComplexVector x = y.partialPivLu().solve(b);
    Complex vd = 0;
    if (system.OpAmpPlus(0) >= 0) vd += x[system.OpAmpPlus(0)];
    if (system.OpAmpMinus(0) >= 0) vd -= x[system.OpAmpMinus(0)];
    const Complex a = 1.0 / Complex(1.0 / stage.opamp.open_loop_gain,
                                    w / (2.0 * kPi * stage.opamp.gbw_hz));
    const Complex expected = -a * vd;
    CHECK(std::abs(t - expected) <= 1e-10 * std::abs(expected));
  }
  return low_rank;
}

TEST_CASE("the low-rank loop gain equals the dense LU: pin capacitances") {
  // The every-element T network without C_f and the compensation resistor:
  // only the pins' capacitances are left in the loop's C (the GBW term
  // sits on the replaced row).
  Stage stage = test::EveryElementTeeStage();
  stage.feedback.capacitor_f = 0;
  stage.plus_resistor = {};
  CHECK(CheckLoopAgainstDenseLu(stage) > 0);
  // One pin capacitance only: rank 1.
  stage.opamp.c_cm_f = 0;
  CHECK(CheckLoopAgainstDenseLu(stage) > 0);
}

TEST_CASE("the low-rank loop gain equals the dense LU: C_f and the pins") {
  CHECK(CheckLoopAgainstDenseLu(test::EveryElementTeeStage()) > 0);
}

TEST_CASE(
    "a high-rank loop capacitance takes the dense LU at every frequency") {
  // A photodiode receiver: C_d and C_f in a network of 3 unknowns, rank 2
  // above n / 2.
  OpAmpModel opamp = test::JfetLikeOpAmp();
  opamp.output_resistance_ohm = 0;
  opamp.c_cm_f = 0;
  opamp.c_diff_f = 0;
  CHECK(CheckLoopAgainstDenseLu(
            test::ReceiverStage(opamp, 47e-12, 500e6, 10e6, 0.4e-12)) == 0);
}

}  // namespace
}  // namespace hushgain

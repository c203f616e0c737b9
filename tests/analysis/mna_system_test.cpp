#include "analysis/mna_system.h"

#include <doctest/doctest.h>

#include <cmath>

#include "base/physical_constants.h"
#include "circuit/expand_stage.h"
#include "noise/noise_source.h"
#include "test_support.h"

namespace hushgain {
namespace {

using test::RelErr;

MnaSystem Build(const Netlist& net) {
  MnaSystem system;
  Status s = MnaSystem::Build(net, &system);
  REQUIRE_MESSAGE(s.ok, s.message);
  return system;
}

TEST_CASE("adjoint transfers equal one direct solve per source") {
  // REFERENCES.md section 10 (Director and Rohrer 1969): z^T b_k from one
  // transposed solve equals x_out from solving Y x = b_k.
  const Stage stage = test::EveryElementTeeStage();
  const Netlist net = ExpandStage(stage);
  const MnaSystem system = Build(net);
  std::vector<NoiseSource> sources = CollectNoiseSources(net, 300);
  REQUIRE(sources.size() == 10);
  AdjointSolver solver(system);
  for (double f : {0.0, 1.0, 1e3, 1e5, 3e6}) {
    REQUIRE(solver.SolveAt(f).ok);
    for (const NoiseSource& source : sources) {
      Port port = system.Compile(source.excitation);
      ComplexVector x;
      REQUIRE(DirectSolve(system, f, port, &x).ok);
      CAPTURE(f);
      CAPTURE(source.name);
      Complex direct = x[system.output_index()];
      Complex adjoint = solver.Transfer(port);
      CHECK(std::abs(adjoint - direct) <= 1e-12 * std::abs(direct) + 1e-300);
    }
  }
}

TEST_CASE("a single-pole op-amp puts the closed-loop pole at GBW/NG + f_p") {
  // REFERENCES.md section 11 (Sedra and Smith, ch. 2): A0 = 1e6, GBW =
  // 10 MHz, Rf/Rin = 100: f_3dB = 99 019.90 Hz, DC gain -99.989 90.
  OpAmpModel m = test::IdealOpAmp();
  m.open_loop_gain = 1e6;
  m.gbw_hz = 1e7;
  Stage stage = test::InvertingStage(1e3, 100e3, m);
  const Netlist net = ExpandStage(stage);
  const MnaSystem system = Build(net);
  AdjointSolver solver(system);
  const Port signal = system.Compile(net.signal);
  REQUIRE(solver.SolveAt(0).ok);
  const double dc = solver.Transfer(signal).real();
  CHECK(RelErr(dc, -100.0 * 1e6 / (1e6 + 101.0)) < test::kRelTight);
  CHECK(RelErr(dc, -99.98990) < 1e-7);
  const double f3 = 1e7 / 101.0 + 10.0;
  CHECK(RelErr(f3, 99019.90) < 1e-7);
  REQUIRE(solver.SolveAt(f3).ok);
  CHECK(RelErr(std::abs(solver.Transfer(signal)),
               std::abs(dc) / std::sqrt(2.0)) < 1e-9);
}

TEST_CASE("a node without a DC path to ground is refused by name") {
  Netlist net;
  NodeId a = net.AddNode("a");
  NodeId island = net.AddNode("island");
  net.resistors.push_back({"R", a, kGround, 1e3, true});
  net.capacitors.push_back({"C", a, island, 1e-9});
  MnaSystem system;
  Status s = MnaSystem::Build(net, &system);
  CHECK_FALSE(s.ok);
  CHECK(s.message == "node 'island' has no DC path to ground");
}

TEST_CASE("a singular solve is a status naming the frequency; not a NaN") {
  // Two ideal voltage sources in parallel at different values: singular.
  Netlist net;
  NodeId a = net.AddNode("a");
  net.voltage_sources.push_back({"V1", a, kGround});
  net.voltage_sources.push_back({"V2", a, kGround});
  net.output = a;
  MnaSystem system = Build(net);
  AdjointSolver solver(system);
  Status s = solver.SolveAt(50.0);
  CHECK_FALSE(s.ok);
  CHECK(s.message ==
        "the network is singular or too ill-conditioned to solve at 50 Hz");
}

// The source of truth for the low-rank path: the dense LU of the same
// matrix, Y(j w)^T formed from the system's G and C and solved for e_out by
// Eigen's partial-pivoting LU (not the solver's own factorization). Every
// noise source's transfer and the signal's must agree to 1e-10 relative,
// whichever path SolveAt took. Returns how many of the frequencies (DC
// excluded) kept the low-rank update.
int CheckAgainstDenseLu(const Stage& stage, int expected_rank) {
  const Netlist net = ExpandStage(stage);
  const MnaSystem system = Build(net);
  AdjointSolver solver(system);
  CHECK(solver.capacitance_rank() == expected_rank);
  std::vector<Port> ports = {system.Compile(net.signal)};
  for (const NoiseSource& source : CollectNoiseSources(net, 300))
    ports.push_back(system.Compile(source.excitation));
  const int n = system.size();
  ComplexVector e_out = ComplexVector::Zero(n);
  e_out[system.output_index()] = 1.0;
  int low_rank = 0;
  for (int i = 0; i <= 36; ++i) {
    const double f = i == 0 ? 0.0 : 0.01 * std::pow(10.0, (i - 1) / 4.0);
    CAPTURE(f);
    REQUIRE(solver.SolveAt(f).ok);
    if (f == 0) CHECK_FALSE(solver.last_solve_low_rank());
    if (solver.last_solve_low_rank()) ++low_rank;
    ComplexMatrix y(n, n);
    y.real() = system.g().transpose();
    y.imag() = 2.0 * kPi * f * system.c().transpose();
    const ComplexVector z = y.partialPivLu().solve(e_out);
    for (const Port& port : ports) {
      if (port.IsNull()) continue;
      Complex expected = 0;
      if (port.plus >= 0) expected += z[port.plus];
      if (port.minus >= 0) expected -= z[port.minus];
      CAPTURE(port.plus);
      CAPTURE(port.minus);
      CHECK(std::abs(solver.Transfer(port) - expected) <=
            1e-10 * std::abs(expected) + 1e-300);
    }
  }
  return low_rank;
}

// The every-element T network without C_f and the compensation resistor:
// the - pin's capacitance and the GBW term, rank 2 of n = 8.
Stage RankTwoTee() {
  Stage stage = test::EveryElementTeeStage();
  stage.feedback.capacitor_f = 0;
  stage.plus_resistor = {};
  return stage;
}

TEST_CASE("the low-rank adjoint solve equals the dense LU: rank 2") {
  CHECK(CheckAgainstDenseLu(RankTwoTee(), 2) > 0);
}

TEST_CASE("the low-rank adjoint solve equals the dense LU: rank 1") {
  // Without pin capacitances only the GBW term is left.
  Stage stage = RankTwoTee();
  stage.opamp.c_cm_f = 0;
  stage.opamp.c_diff_f = 0;
  CHECK(CheckAgainstDenseLu(stage, 1) > 0);
}

TEST_CASE("the low-rank adjoint solve equals the dense LU: rank 4 of 9") {
  // C_f, both pin capacitances and the GBW term: the r x r elimination.
  CHECK(CheckAgainstDenseLu(test::EveryElementTeeStage(), 4) > 0);
}

TEST_CASE("a high-rank capacitance takes the dense LU at every frequency") {
  // A photodiode receiver: C_d, C_f and the GBW term, rank 3 of n = 3,
  // above n / 2.
  OpAmpModel opamp = test::JfetLikeOpAmp();
  opamp.output_resistance_ohm = 0;
  opamp.c_cm_f = 0;
  opamp.c_diff_f = 0;
  const Stage stage = test::ReceiverStage(opamp, 47e-12, 500e6, 10e6, 0.4e-12);
  CHECK(CheckAgainstDenseLu(stage, -1) == 0);
}

TEST_CASE("a low-rank update that loses digits falls back to the dense LU") {
  // 10 Mohm beside 100 ohm around A0 = 1e6 (G's pivots spread over about
  // 1e11): the figures still equal the dense LU's wherever the update's
  // residual is refused.
  Stage stage = test::TeeStage(100, 10e6, 10e6, 100, test::JfetLikeOpAmp());
  stage.load_ohm = 2e3;
  const int low_rank = CheckAgainstDenseLu(stage, 2);
  CHECK(low_rank > 0);
  CHECK(low_rank < 36);
}

}  // namespace
}  // namespace hushgain

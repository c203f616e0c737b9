#include "analysis/mna_system.h"

#include <doctest/doctest.h>

#include <cmath>

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

}  // namespace
}  // namespace hushgain

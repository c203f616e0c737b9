// The restampable solver against the engine's adjoint solver (REFERENCES.md
// section 10: one transposed solve gives every transfer): the same transfers
// for new resistor values, at DC and across frequency, through the low-rank
// update of the capacitance matrix; and the DC node voltages against a
// direct solve.
#include "analysis/restamp_solver.h"

#include <doctest/doctest.h>

#include <cmath>

#include "analysis/dc_solution.h"
#include "circuit/expand_stage.h"
#include "noise/noise_source.h"
#include "test_support.h"

namespace hushgain {
namespace {

using test::RelErr;

constexpr double kRelSolve = 1e-10;

// The every-element T-network stage with its compensation resistor
// bypassed (so the bypass capacitor's restamp is exercised too).
Stage NetworkStage() {
  Stage stage = test::EveryElementTeeStage();
  stage.plus_resistor_bypass_f = 1e-9;
  return stage;
}

// Checks every noise source's |transfer|^2 against AdjointSolver after
// moving every resistor by a different few per cent.
void CheckAgainstAdjoint(const Stage& base, int expected_rank) {
  const Netlist net = ExpandStage(base);
  MnaSystem system;
  REQUIRE(MnaSystem::Build(net, &system).ok);
  RestampSolver fast(system, net);
  CHECK(fast.capacitance_rank() == expected_rank);
  // New values: every resistor moved by a different few per cent.
  Netlist changed = net;
  std::vector<double> ohms;
  for (std::size_t k = 0; k < changed.resistors.size(); ++k) {
    changed.resistors[k].ohms *= 1.0 + 0.013 * (static_cast<double>(k) - 3.0);
    ohms.push_back(changed.resistors[k].ohms);
  }
  MnaSystem reference_system;
  REQUIRE(MnaSystem::Build(changed, &reference_system).ok);
  AdjointSolver reference(reference_system);
  fast.SetResistors(ohms.data());
  const std::vector<NoiseSource> sources = CollectNoiseSources(changed, 300);
  // TransferNorms of every source port (rank 1 or 2: without forming z).
  std::vector<Port> ports;
  for (const NoiseSource& s : sources)
    ports.push_back(system.Compile(s.excitation));
  fast.SetNormPorts(ports);
  std::vector<double> norms(ports.size());
  for (double f : {0.0, 0.1, 10.0, 1e3, 1e5, 3e6}) {
    CAPTURE(f);
    REQUIRE(reference.SolveAt(f).ok);
    REQUIRE(fast.TransferNorms(f, norms.data()).ok);
    for (std::size_t k = 0; k < ports.size(); ++k) {
      CAPTURE(sources[k].name);
      CHECK(RelErr(norms[k], std::norm(reference.Transfer(ports[k]))) <
            kRelSolve);
    }
    REQUIRE(fast.SolveAdjoint(f).ok);
    for (const NoiseSource& s : sources) {
      CAPTURE(s.name);
      const Port port = system.Compile(s.excitation);
      CHECK(RelErr(fast.TransferNorm(port),
                   std::norm(reference.Transfer(port))) < kRelSolve);
    }
  }
}

TEST_CASE("restamped values give the adjoint solver's transfers: rank 4 of 9") {
  // C_f, C_plus, both pin capacitances and the GBW term: the + pin, - pin
  // and output block has rank 3, the GBW term adds 1.
  CheckAgainstAdjoint(NetworkStage(), 4);
}

TEST_CASE(
    "restamped values give the adjoint solver's transfers: low-rank path") {
  // Without C_f and R_plus: the - pin's capacitance and the GBW term, rank 2
  // of n = 8: the Woodbury update runs.
  Stage stage = NetworkStage();
  stage.feedback.capacitor_f = 0;
  stage.plus_resistor = {};
  stage.plus_resistor_bypass_f = 0;
  CheckAgainstAdjoint(stage, 2);
  // Without pin capacitances only the GBW term is left: rank 1.
  Stage gbw_only = stage;
  gbw_only.opamp.c_cm_f = 0;
  gbw_only.opamp.c_diff_f = 0;
  CheckAgainstAdjoint(gbw_only, 1);
  // A photodiode stage (C_d, C_f, the GBW term: rank 3 of n = 3, above
  // n / 2): the dense complex LU runs.
  Stage tia = stage;
  tia.topology = Topology::kTransimpedance;
  tia.photodiode = {47e-12, 500e6, 100e-12, 0.5};
  tia.feedback.kind = Feedback::Kind::kResistor;
  tia.feedback.resistor_ohm = 10e6;
  tia.feedback.capacitor_f = 0.4e-12;
  tia.opamp.output_resistance_ohm = 0;
  tia.load_ohm.reset();
  CheckAgainstAdjoint(tia, -1);
}

TEST_CASE("the DC node voltages of a restamped network match a direct solve") {
  const Stage base = NetworkStage();
  const Netlist net = ExpandStage(base);
  MnaSystem system;
  REQUIRE(MnaSystem::Build(net, &system).ok);
  RestampSolver fast(system, net);
  std::vector<double> ohms;
  for (const Resistor& r : net.resistors) ohms.push_back(r.ohms);
  fast.SetResistors(ohms.data());
  REQUIRE(fast.SolveAdjoint(0.0).ok);
  // 1 mV at the source, 25 uV of Vos and 1 nA out of the - pin.
  const std::vector<DcStimulus> stimuli = {
      {system.Compile(net.signal), 1e-3},
      {system.Compile(Excitation{OpAmpInputVoltage{0}}), 25e-6},
      {system.Compile(
           Excitation{CurrentInjection{net.opamps[0].minus, kGround}}),
       -1e-9}};
  std::vector<double> expected;
  REQUIRE(SolveDc(system, stimuli, &expected).ok);
  std::vector<double> x(system.size(), 0.0);
  for (const DcStimulus& s : stimuli) {
    if (s.port.plus >= 0) x[s.port.plus] += s.value;
    if (s.port.minus >= 0) x[s.port.minus] -= s.value;
  }
  fast.SolveDirectDc(x.data());
  for (int i = 0; i < system.size(); ++i) {
    CAPTURE(system.UnknownName(i));
    CHECK(std::fabs(x[i] - expected[i]) <=
          kRelSolve * (std::fabs(expected[i]) + 1e-6));
  }
}

}  // namespace
}  // namespace hushgain

namespace hushgain {
namespace {

TEST_CASE(
    "new capacitor values give the adjoint solver's transfers of the changed "
    "network") {
  // Every capacitor (C_f, C3, C_plus) moved by a different few per cent,
  // then the resistors too: the low-rank split of C is redone per call.
  Stage stage = NetworkStage();
  stage.feedback.capacitor_f = 22e-12;
  stage.feedback.tee.c3_f = 4.7e-6;
  const Netlist net = ExpandStage(stage);
  MnaSystem system;
  REQUIRE(MnaSystem::Build(net, &system).ok);
  RestampSolver fast(system, net);
  REQUIRE(fast.capacitor_count() == 3);
  Netlist changed = net;
  std::vector<double> farads, ohms;
  for (std::size_t k = 0; k < changed.capacitors.size(); ++k) {
    changed.capacitors[k].farads *= 1.0 + 0.04 * (static_cast<double>(k) - 1.3);
    farads.push_back(changed.capacitors[k].farads);
  }
  for (std::size_t k = 0; k < changed.resistors.size(); ++k) {
    changed.resistors[k].ohms *= 1.0 + 0.011 * (static_cast<double>(k) - 2.0);
    ohms.push_back(changed.resistors[k].ohms);
  }
  MnaSystem reference_system;
  REQUIRE(MnaSystem::Build(changed, &reference_system).ok);
  AdjointSolver reference(reference_system);
  fast.SetCapacitors(farads.data());
  fast.SetResistors(ohms.data());
  const std::vector<NoiseSource> sources = CollectNoiseSources(changed, 300);
  // TransferNorms of every source port (rank 1 or 2: without forming z).
  std::vector<Port> ports;
  for (const NoiseSource& s : sources)
    ports.push_back(system.Compile(s.excitation));
  fast.SetNormPorts(ports);
  std::vector<double> norms(ports.size());
  for (double f : {0.0, 0.1, 10.0, 1e3, 1e5, 3e6}) {
    CAPTURE(f);
    REQUIRE(reference.SolveAt(f).ok);
    REQUIRE(fast.TransferNorms(f, norms.data()).ok);
    for (std::size_t k = 0; k < ports.size(); ++k) {
      CAPTURE(sources[k].name);
      CHECK(RelErr(norms[k], std::norm(reference.Transfer(ports[k]))) <
            kRelSolve);
    }
    REQUIRE(fast.SolveAdjoint(f).ok);
    for (const NoiseSource& s : sources) {
      CAPTURE(s.name);
      const Port port = system.Compile(s.excitation);
      CHECK(RelErr(fast.TransferNorm(port),
                   std::norm(reference.Transfer(port))) < kRelSolve);
    }
  }
}

}  // namespace
}  // namespace hushgain

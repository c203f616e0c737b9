#include "analysis/loop_gain.h"

#include <doctest/doctest.h>

#include <cmath>

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

}  // namespace
}  // namespace hushgain

// The star-mesh (pi) equivalent of a T network and its noise-equivalent
// resistance: the arms against the transform's formulas and against the
// terminal resistances of both networks, the pi solved by the engine against
// the T at every frequency, and R_n against the engine's resistor noise.
#include "circuit/tee_equivalents.h"

#include <doctest/doctest.h>

#include <cmath>

#include "analysis/mna_system.h"
#include "circuit/expand_stage.h"
#include "circuit/feedback_network.h"
#include "test_support.h"

namespace hushgain {
namespace {

using test::RelErr;

constexpr double kRelArm = 1e-12;

double Parallel(double a, double b) { return a * b / (a + b); }

TEST_CASE("the pi arms are S/R3 S/R2 and S/R1 with S = R1 R2 + R2 R3 + R3 R1") {
  // Star-mesh transform (Kennelly 1899; REFERENCES.md sections 6 and 13):
  // the arm opposite star arm R_k is S / R_k.
  for (const TeeNetwork t :
       {TeeNetwork{47e3, 220e3, 2.2e3}, TeeNetwork{100e3, 100e3, 100},
        TeeNetwork{1, 1e9, 1e-3}}) {
    const PiEquivalent pi = StarMesh(t);
    const double s =
        t.r1_ohm * t.r2_ohm + t.r2_ohm * t.r3_ohm + t.r3_ohm * t.r1_ohm;
    CHECK(RelErr(pi.bridge_ohm, s / t.r3_ohm) < kRelArm);
    CHECK(RelErr(pi.input_arm_ohm, s / t.r2_ohm) < kRelArm);
    CHECK(RelErr(pi.output_arm_ohm, s / t.r1_ohm) < kRelArm);
    // The bridge is the T's transresistance R1 + R2 + R1 R2 / R3.
    Feedback fb;
    fb.kind = Feedback::Kind::kTee;
    fb.tee = t;
    CHECK(RelErr(pi.bridge_ohm, FeedbackEquivalentOhm(fb)) < kRelArm);
  }
}

TEST_CASE("the pi and the T have the same three terminal-pair resistances") {
  // The defining property of the transform (Kennelly 1899): between each
  // pair of terminals, the third left open, both networks measure the same.
  const TeeNetwork t{47e3, 220e3, 2.2e3};
  const PiEquivalent pi = StarMesh(t);
  // summing node - output (ground open): R1 + R2 vs bridge || (in + out)
  CHECK(RelErr(Parallel(pi.bridge_ohm, pi.input_arm_ohm + pi.output_arm_ohm),
               t.r1_ohm + t.r2_ohm) < kRelArm);
  // summing node - ground: R1 + R3 vs in || (bridge + out)
  CHECK(RelErr(Parallel(pi.input_arm_ohm, pi.bridge_ohm + pi.output_arm_ohm),
               t.r1_ohm + t.r3_ohm) < kRelArm);
  // output - ground: R2 + R3 vs out || (bridge + in)
  CHECK(RelErr(Parallel(pi.output_arm_ohm, pi.bridge_ohm + pi.input_arm_ohm),
               t.r2_ohm + t.r3_ohm) < kRelArm);
}

// The stage's netlist with R1, R2, R3 replaced by the three pi arms.
Netlist PiNetlist(const Netlist& tee_net, const TeeNetwork& t) {
  Netlist net = tee_net;
  NodeId summing = kGround, output = kGround;
  for (const Resistor& r : tee_net.resistors) {
    if (r.name == "R1") summing = r.a;
    if (r.name == "R2") output = r.b;
  }
  REQUIRE(summing != kGround);
  REQUIRE(output != kGround);
  std::erase_if(net.resistors, [](const Resistor& r) {
    return r.name == "R1" || r.name == "R2" || r.name == "R3";
  });
  const PiEquivalent pi = StarMesh(t);
  net.resistors.push_back({"bridge", summing, output, pi.bridge_ohm, true});
  net.resistors.push_back(
      {"input arm", summing, kGround, pi.input_arm_ohm, true});
  net.resistors.push_back(
      {"output arm", output, kGround, pi.output_arm_ohm, true});
  return net;  // the tee node stays, now unconnected: give it a path below
}

TEST_CASE("the pi network solved by the engine has the T's transfer") {
  // A real op-amp (finite A0 and GBW, R_out, pin capacitances), a load and
  // C_f, so the comparison covers the whole frequency range.
  Stage stage = test::EveryElementTeeStage();
  stage.plus_resistor.mode = PlusResistor::Mode::kNone;
  const TeeNetwork t = stage.feedback.tee;
  const Netlist tee_net = ExpandStage(stage);
  Netlist pi_net = PiNetlist(tee_net, t);
  // The T's centre node is left without parts; tie it to ground through a
  // resistor that touches nothing else, so the system stays regular.
  NodeId centre = kGround;
  for (const Resistor& r : tee_net.resistors)
    if (r.name == "R3") centre = r.a;
  pi_net.resistors.push_back({"tie", centre, kGround, 1e3, false});

  MnaSystem tee_system, pi_system;
  REQUIRE(MnaSystem::Build(tee_net, &tee_system).ok);
  REQUIRE(MnaSystem::Build(pi_net, &pi_system).ok);
  AdjointSolver tee_solver(tee_system), pi_solver(pi_system);
  const Port tee_port = tee_system.Compile(tee_net.signal);
  const Port pi_port = pi_system.Compile(pi_net.signal);
  const Port tee_en = tee_system.Compile(Excitation{OpAmpInputVoltage{0}});
  const Port pi_en = pi_system.Compile(Excitation{OpAmpInputVoltage{0}});
  for (double f = 0; f < 1e9; f = f == 0 ? 1e-2 : f * 1.7) {
    CAPTURE(f);
    REQUIRE(tee_solver.SolveAt(f).ok);
    REQUIRE(pi_solver.SolveAt(f).ok);
    const Complex h_tee = tee_solver.Transfer(tee_port);
    const Complex h_pi = pi_solver.Transfer(pi_port);
    CHECK(std::abs(h_pi - h_tee) <= 1e-9 * std::abs(h_tee));
    const Complex ng_tee = tee_solver.Transfer(tee_en);
    const Complex ng_pi = pi_solver.Transfer(pi_en);
    CHECK(std::abs(ng_pi - ng_tee) <= 1e-9 * std::abs(ng_tee));
  }
}

TEST_CASE("the noise-equivalent resistance gives the T's resistor noise") {
  // Derived here: the three resistors' output noise (gains of REFERENCES.md
  // section 6) equals 4kT / R_n x Req^2. Checked against the engine's R1, R2
  // and R3 densities at low frequency with a near-ideal op-amp.
  const TeeNetwork t{100e3, 100e3, 100};
  const double rn = TeeNoiseEquivalentOhm(t);
  const double req = StarMesh(t).bridge_ohm;
  const double g = t.r2_ohm / t.r3_ohm;
  CHECK(RelErr(rn, req * req /
                       (t.r1_ohm * (1 + g) * (1 + g) + t.r2_ohm +
                        t.r3_ohm * g * g)) < kRelArm);
  // 100.2 MOhm built this way is as noisy as about 100 kOhm.
  CHECK(RelErr(rn, 100.2e6 * 100.2e6 /
                       (100e3 * 1001.0 * 1001.0 + 100e3 +
                        100 * 1000.0 * 1000.0)) < kRelArm);
  CHECK(rn < req / 900);

  const Stage stage =
      test::TeeStage(1e9, t.r1_ohm, t.r2_ohm, t.r3_ohm, test::IdealOpAmp());
  const Budget b = test::ComputeOrFail(stage, 1e-6);
  double psd = 0;
  for (const char* name : {"R1", "R2", "R3"}) {
    const double d =
        test::FindContributor(b, name).output_density_ref_v_per_rthz;
    psd += d * d;
  }
  CHECK(RelErr(psd, test::FourKT(300.0) / rn * req * req) < test::kRelIdeal);
}

}  // namespace
}  // namespace hushgain

// The headroom check (budget/headroom.h) alone, and the budget's stages that
// cannot work: the offset or a DC output beyond full scale or the supply, a
// gain the op-amp cannot deliver. Expected values are worked here by hand.
#include "budget/headroom.h"

#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <string>

#include "budget/compute_budget.h"
#include "test_support.h"

namespace hushgain {
namespace {

bool Has(const std::vector<StageProblem>& v, StageProblem p) {
  return std::find(v.begin(), v.end(), p) != v.end();
}

HeadroomInputs Inputs(double offset, double fs, double supply) {
  HeadroomInputs in;
  in.offset_v = offset;
  in.dc_total_v = offset;
  in.full_scale_v = fs;
  in.supply_span_v = supply;
  return in;
}

TEST_CASE("an offset inside full scale and the rails draws nothing") {
  // 0.3 V + 10 V = 10.3 V <= 15 V, half of a 30 V span.
  const HeadroomCheck c = CheckHeadroom(Inputs(0.3, 10, 30));
  CHECK(c.warnings.empty());
  CHECK(c.problems.empty());
  CHECK(HeadroomProblemBits(Inputs(0.3, 10, 30)) == 0);
}

TEST_CASE("a 10.79 V offset beyond a 10 V full scale also clips on 30 V") {
  // 10.79 V > 10 V; 10.79 + 10 = 20.79 V > 15 V; 10.79 V < 15 V.
  const HeadroomCheck c = CheckHeadroom(Inputs(10.79, 10, 30));
  REQUIRE(c.warnings.size() == 2);
  CHECK(c.warnings[0] ==
        "the worst-case output offset (10.79 V) exceeds the full-scale swing "
        "(\xC2\xB1"
        "10 V)");
  CHECK(c.warnings[1] ==
        "the worst-case DC output (10.79 V) plus the full-scale swing (10 V) "
        "exceeds half the 30 V supply span (15 V): the signal clips");
  CHECK(c.problems ==
        std::vector<StageProblem>{StageProblem::kOffsetBeyondFullScale,
                                  StageProblem::kSwingBeyondSupply});
  CHECK(HeadroomProblemBits(Inputs(10.79, 10, 30)) ==
        (StageProblemBit(StageProblem::kOffsetBeyondFullScale) |
         StageProblemBit(StageProblem::kSwingBeyondSupply)));
}

TEST_CASE("an offset beyond half the supply sits at a rail") {
  HeadroomInputs in = Inputs(16, 10, 30);
  in.full_scale_v.reset();  // no full scale: only the supply counts
  const HeadroomCheck c = CheckHeadroom(in);
  REQUIRE(c.warnings.size() == 1);
  CHECK(c.warnings[0] ==
        "the worst-case output offset (16 V) exceeds half the 30 V supply "
        "span (15 V): the output sits at a rail");
  CHECK(c.problems ==
        std::vector<StageProblem>{StageProblem::kOffsetBeyondSupply});
}

TEST_CASE("a DC output term is checked on its own, by magnitude") {
  // A photocurrent of 1 uA through 10 Mohm: -10 V at the output, beyond a
  // 4 V full scale but inside half of 30 V.
  HeadroomInputs in = Inputs(0.001, 4, 30);
  in.dc_outputs = {{"I_ph", -10.0}};
  in.dc_total_v = 0.001 + 10.0;
  const HeadroomCheck c = CheckHeadroom(in);
  REQUIRE(c.warnings.size() == 1);
  CHECK(c.warnings[0] ==
        "the DC output from I_ph (10 V) exceeds the full-scale swing "
        "(\xC2\xB1"
        "4 V)");
  CHECK(c.problems ==
        std::vector<StageProblem>{StageProblem::kDcBeyondFullScale});
  // 10.001 V + 4 V = 14.001 V stays inside 15 V: no clipping.
  CHECK_FALSE(Has(c.problems, StageProblem::kSwingBeyondSupply));
}

TEST_CASE("a 1 Hz GBW collapses the gain, and the budget says so") {
  // Rf/Rin = 100 over 10 Hz .. 1 kHz. GBW 1 Hz: |G| ~ GBW / f << 100 in
  // the whole band (single pole, Sedra and Smith ch. 2). GBW 10 MHz: no
  // word. Before, the collapsed stage printed its noise with no warning.
  Stage stage = test::InvertingStage(1e3, 100e3, test::IdealOpAmp(5e-9));
  stage.opamp.open_loop_gain = 1e6;
  stage.band_low_hz = 10;
  stage.band_high_hz = 1e3;
  stage.reference_hz = 100;
  stage.opamp.gbw_hz = 1;
  const BudgetOutcome slow = ComputeBudget(stage, BudgetOptions{});
  REQUIRE(slow.status.ok);
  CHECK(Has(slow.budget.problems, StageProblem::kGainCollapsed));
  bool worded = false;
  for (const std::string& w : slow.budget.warnings)
    worded = worded || w.rfind("the signal gain has collapsed ", 0) == 0;
  CHECK(worded);
  stage.opamp.gbw_hz = 10e6;
  const BudgetOutcome fast = ComputeBudget(stage, BudgetOptions{});
  REQUIRE(fast.status.ok);
  CHECK(fast.budget.problems.empty());
}

TEST_CASE("a photocurrent's DC output beyond full scale is flagged") {
  // 10 Mohm transimpedance, photocurrent 1 uA -> -10 V at the output
  // (Z(0) = -R_f with A0 = 1e12), beyond a 4 V full scale, inside half of
  // the 30 V default span; 10 V + 4 V < 15 V: no clipping.
  Stage s;
  s.name = "dc outputs";
  s.temperature_k = 300;
  s.band_low_hz = 1;
  s.band_high_hz = 1e3;
  s.reference_hz = 30;
  s.topology = Topology::kTransimpedance;
  s.photodiode.capacitance_f = 10e-12;
  s.photodiode.photocurrent_a = 1e-6;
  s.opamp = test::IdealOpAmp(5e-9, 1e-15);
  s.feedback.resistor_ohm = 10e6;
  s.feedback.capacitor_f = 10e-12;
  s.full_scale_output_v = 4.0;
  const BudgetOutcome r = ComputeBudget(s, BudgetOptions{});
  REQUIRE(r.status.ok);
  const Budget& b = r.budget;
  double photo_v = 0;
  for (const DcOutputTerm& t : b.dc_outputs)
    if (t.name == "I_ph") photo_v = t.volts;
  CHECK(test::RelErr(photo_v, -10.0) < 1e-9);
  CHECK(Has(b.problems, StageProblem::kDcBeyondFullScale));
  CHECK_FALSE(Has(b.problems, StageProblem::kSwingBeyondSupply));
}

}  // namespace
}  // namespace hushgain

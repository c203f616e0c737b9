// The T-network comparison block on hand-made budgets: which contributors
// the tee adds, removes, raises, lowers or leaves, and the cost ratio.
#include "review/tee_comparison.h"

#include <doctest/doctest.h>

#include "test_support.h"

namespace hushgain {
namespace {

Contributor Named(const std::string& name, double rms) {
  Contributor c;
  c.name = name;
  c.output_rms_v = rms;
  return c;
}

TEST_CASE("the comparison names each contributor's change") {
  Budget tee, plain;
  tee.output_rms_v = 2e-3;
  plain.output_rms_v = 1e-3;
  tee.contributors = {Named("e_n", 1.5e-3), Named("R3", 1e-4),
                      Named("R_in", 5e-4), Named("i_n-", 2e-5)};
  plain.contributors = {Named("e_n", 1e-3), Named("R_f", 1e-4),
                        Named("R_in", 5e-4 * (1 + 1e-5)), Named("i_n-", 4e-5)};
  const TeeComparison c = CompareTee(tee, plain, 1e8);
  CHECK(c.equivalent_resistance_ohm == 1e8);
  CHECK(c.noise_cost_ratio == 2.0);
  REQUIRE(c.changes.size() == 5);
  CHECK(c.changes[0].kind == TeeChange::Kind::kRaised);   // e_n
  CHECK(c.changes[1].kind == TeeChange::Kind::kAdded);    // R3
  CHECK(c.changes[2].kind == TeeChange::Kind::kSame);     // R_in, 1e-5 off
  CHECK(c.changes[3].kind == TeeChange::Kind::kLowered);  // i_n-
  CHECK(c.changes[4].name == "R_f");
  CHECK(c.changes[4].kind == TeeChange::Kind::kRemoved);
}

TEST_CASE("the plain equivalent is one resistor of R1 + R2 + R1 R2 / R3") {
  // The T-to-single-resistor equivalence (star-mesh transform; Kennelly
  // 1899 for the three-terminal case): 100k + 100k + 100k*100k/1k = 10.2M.
  const Stage tee = test::TeeStage(10e3, 100e3, 100e3, 1e3, OpAmpModel{});
  const Stage plain = PlainEquivalent(tee);
  CHECK(plain.feedback.kind == Feedback::Kind::kResistor);
  CHECK(test::RelErr(plain.feedback.resistor_ohm, 10.2e6) < test::kRelIdeal);
  CHECK(plain.input_resistor_ohm == tee.input_resistor_ohm);
}

}  // namespace
}  // namespace hushgain

#include "design/tee_sweep.h"

#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>

#include "circuit/inverting_topology.h"
#include "review/review.h"
#include "test_support.h"

namespace hushgain {
namespace {

using test::RelErr;

// A realistic op-amp: finite GBW and A0, 1/f corners, pin capacitance.
OpAmpModel RealisticOpAmp() {
  OpAmpModel m = test::IdealOpAmp(8e-9, 5e-15);
  m.f_cv_hz = 20;
  m.f_ci_hz = 100;
  m.open_loop_gain = 3e5;
  m.gbw_hz = 4e6;
  m.c_cm_f = 4e-12;
  m.c_diff_f = 2e-12;
  m.output_resistance_ohm = 60;
  m.vos_v = 200e-6;
  m.ib_a = 3e-12;
  m.ios_a = 1e-12;
  return m;
}

Stage HydrophoneLike() {
  Stage s = test::TeeStage(10e3, 100e3, 100e3, 1.02e3, RealisticOpAmp(), 290);
  s.source.resistance_ohm = 1e3;
  s.band_low_hz = 10;
  s.band_high_hz = 5e3;
  s.load_ohm = 2e3;
  s.feedback.capacitor_f = 1e-12;
  return s;
}

void CheckSameBudget(const Budget& a, const Budget& b) {
  CHECK(a.output_rms_v == b.output_rms_v);
  CHECK(a.input_rms == b.input_rms);
  CHECK(a.noise_gain_dc == b.noise_gain_dc);
  CHECK(a.noise_gain_ref == b.noise_gain_ref);
  CHECK(a.signal_gain_dc == b.signal_gain_dc);
  CHECK(a.offset.worst_case_v == b.offset.worst_case_v);
  CHECK(a.bandwidth_3db_hz == b.bandwidth_3db_hz);
  REQUIRE(a.contributors.size() == b.contributors.size());
  for (std::size_t i = 0; i < a.contributors.size(); ++i) {
    CHECK(a.contributors[i].name == b.contributors[i].name);
    CHECK(a.contributors[i].output_rms_v == b.contributors[i].output_rms_v);
  }
}

TEST_CASE("the sweep's end point is the plain stage's budget exactly") {
  // The end point "largest resistor = Req" is one feedback resistor Req =
  // R1 + R2 + R1 R2 / R3 (Kennelly 1899; REFERENCES.md section 6). Built
  // here by hand, not through the code under test.
  const Stage stage = HydrophoneLike();
  const double req = 100e3 + 100e3 + 100e3 * 100e3 / 1.02e3;
  Stage plain = stage;
  plain.feedback.kind = Feedback::Kind::kResistor;
  plain.feedback.resistor_ohm = req;
  BudgetOptions options;
  const BudgetOutcome expected = ComputeBudget(plain, options);
  REQUIRE(expected.status.ok);

  TeeSweepOptions sweep;
  const TeeSweepResult result = SweepTee(stage, sweep);
  REQUIRE(result.status.ok);
  REQUIRE(result.rows.size() == 13);
  const TeeSweepRow& end = result.rows.front();
  CHECK(end.plain);
  CHECK(RelErr(end.largest_ohm, req) < test::kRelTight);
  CHECK(end.noise_cost_ratio == 1.0);
  CheckSameBudget(end.budget, expected.budget);
  // The smallest row is Req / 1000 by default.
  CHECK(RelErr(result.rows.back().largest_ohm, req / 1000) < test::kRelTight);
}

TEST_CASE("the tee approaches the end point continuously as L -> Req") {
  // Under the default rule at L > Req/3: R1 = R3 = L, R2 = (Req - L)/2,
  // so R2 -> 0 and the T network becomes R1 = Req with R3 as a load at
  // the op-amp output: its noise ratio against the plain stage -> 1.
  const Stage stage = HydrophoneLike();
  const double req = FeedbackEquivalentOhm(stage.feedback);
  double previous = 1e9;
  for (double shortfall : {0.3, 0.1, 0.01, 1e-5}) {
    Stage s = stage;
    s.feedback.tee = TeeForLargest(req, req * (1 - shortfall), std::nullopt);
    const BudgetOutcome b = ReviewStage(s, ReviewOptions{});
    REQUIRE(b.status.ok);
    // Both budgets carry the integration's 1e-4 (power) tolerance.
    const double excess = std::fabs(b.budget.tee->noise_cost_ratio - 1);
    CAPTURE(shortfall);
    // Below about 1e-6 the difference is the integration's own noise.
    if (shortfall > 1e-3) CHECK(excess < previous);
    previous = excess;
  }
  CHECK(previous < 1e-5);
}

TEST_CASE("the sweep rule keeps Req and L and takes the least R2/R3") {
  // The rule's claim: among networks with all resistors <= L and Req
  // fixed, k = R2/R3 (the tee's addition to the e_n noise gain) is least.
  // Checked against a scan of (R1, R2) on a grid, R3 solved from Req.
  const double req = 10e6;
  for (double l : {20e3, 1e6, req / 3, 4e6, 9e6}) {
    const TeeNetwork t = TeeForLargest(req, l, std::nullopt);
    CAPTURE(l);
    CHECK(RelErr(t.r1_ohm + t.r2_ohm + t.r1_ohm * t.r2_ohm / t.r3_ohm, req) <
          test::kRelTight);
    CHECK(RelErr(std::max({t.r1_ohm, t.r2_ohm, t.r3_ohm}), l) <
          test::kRelTight);
    const double k_rule = t.r2_ohm / t.r3_ohm;
    double k_best = 1e300;
    constexpr int kGrid = 400;
    for (int i = 1; i <= kGrid; ++i) {
      for (int j = 1; j <= kGrid; ++j) {
        const double r1 = l * i / kGrid;
        const double r2 = l * j / kGrid;
        if (r1 + r2 >= req) continue;
        const double r3 = r1 * r2 / (req - r1 - r2);
        if (r3 > l * (1 + 1e-12)) continue;
        k_best = std::min(k_best, r2 / r3);
      }
    }
    CHECK(k_rule <= k_best * (1 + 1e-9));
  }
}

TEST_CASE("a fixed R1/R2 ratio is kept along the sweep") {
  const double req = 10e6;
  for (double rho : {0.25, 1.0, 3.0}) {
    for (double l : {10e3, 300e3, 3e6, 8e6}) {
      const TeeNetwork t = TeeForLargest(req, l, rho);
      CAPTURE(rho);
      CAPTURE(l);
      CHECK(RelErr(t.r1_ohm / t.r2_ohm, rho) < test::kRelTight);
      CHECK(RelErr(t.r1_ohm + t.r2_ohm + t.r1_ohm * t.r2_ohm / t.r3_ohm, req) <
            test::kRelTight);
      CHECK(RelErr(std::max({t.r1_ohm, t.r2_ohm, t.r3_ohm}), l) <
            test::kRelTight);
    }
  }
}

TEST_CASE("a tee whose R3 is very large costs nothing against the plain") {
  // As R3 -> infinity the tee is R1 + R2 in series: the same thermal noise
  // 4kT(R1 + R2) as one resistor Req = R1 + R2 + R1 R2 / R3 -> R1 + R2,
  // and NG_T = 1 + R2/R3 + Req/Rin -> 1 + Req/Rin (REFERENCES.md section
  // 6). So the noise cost ratio -> 1, the excess shrinking like R2 / R3.
  double previous = 1e9;
  for (double r3 : {1e7, 1e9, 1e11}) {
    Stage s = test::TeeStage(10e3, 470e3, 470e3, r3, RealisticOpAmp());
    s.band_low_hz = 1;
    s.band_high_hz = 1e3;
    const BudgetOutcome b = ReviewStage(s, ReviewOptions{});
    REQUIRE(b.status.ok);
    const double excess = std::fabs(b.budget.tee->noise_cost_ratio - 1);
    CAPTURE(r3);
    CHECK(excess < previous);
    previous = excess;
  }
  CHECK(previous < 1e-4);
}

TEST_CASE("the e_n noise gain grows as 1 + R2/R3 + Req/Rin as R3 shrinks") {
  // Derivation (ideal op-amp, DC, + input at e_n, source shorted): the
  // summing node sits at e_n; KCL there: e_n/Rin + (e_n - v_T)/R1 = 0, so
  // v_T = e_n (1 + R1/Rin). KCL at the tee node: (v_T - e_n)/R1 + v_T/R3 +
  // (v_T - v_out)/R2 = 0, so v_out = v_T + R2 (v_T - e_n)/R1 + R2 v_T/R3
  // = e_n [(1 + R1/Rin)(1 + R2/R3) + R2/Rin] = e_n [1 + R2/R3 + Req/Rin].
  // Req fixed at 1 MOhm with R1 = R2 = r: r = R3 (sqrt(1 + Req/R3) - 1).
  const double req = 1e6;
  const double rin = 10e3;
  double previous = 0;
  for (double r3 : {1e6, 1e5, 1e4, 1e3, 100.0}) {
    const double r = r3 * (std::sqrt(1 + req / r3) - 1);
    Stage s = test::TeeStage(rin, r, r, r3, test::IdealOpAmp(5e-9, 0));
    BudgetOptions options;
    const BudgetOutcome b = ComputeBudget(s, options);
    REQUIRE(b.status.ok);
    const double expected = 1 + r / r3 + req / rin;
    CAPTURE(r3);
    CHECK(RelErr(b.budget.noise_gain_dc, expected) < test::kRelIdeal);
    CHECK(b.budget.noise_gain_dc > previous);
    previous = b.budget.noise_gain_dc;
  }
}

TEST_CASE("sweep rows shrink the largest resistor and raise the noise cost") {
  const TeeSweepResult result = SweepTee(HydrophoneLike(), TeeSweepOptions{});
  REQUIRE(result.status.ok);
  for (std::size_t i = 1; i < result.rows.size(); ++i) {
    const TeeSweepRow& r = result.rows[i];
    CHECK(r.largest_ohm < result.rows[i - 1].largest_ohm);
    CHECK(r.noise_cost_ratio >= result.rows[i - 1].noise_cost_ratio - 1e-6);
    CHECK(RelErr(r.noise_cost_ratio,
                 r.budget.output_rms_v / result.rows[0].budget.output_rms_v) <
          test::kRelTight);
  }
}

TEST_CASE("sweep options name the field they break") {
  TeeSweepOptions o;
  o.points = 1;
  CHECK(o.Validate() == "points: expected 2 to 10000, got 1");
  o = TeeSweepOptions{};
  o.r1_over_r2 = -2;
  CHECK(o.Validate() == "r1_over_r2: expected a positive ratio, got -2");
  CHECK(TeeSweepOptions{}.Validate().empty());
}

}  // namespace
}  // namespace hushgain

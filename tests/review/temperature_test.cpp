// The budget over temperature and the bias-current compensation resistor:
// the bias-current laws, resistor tempco, 4kT, and the section 6 T-network
// offsets with and without the balance resistor.
#include <doctest/doctest.h>

#include <cmath>

#include "budget/compute_budget.h"
#include "circuit/stage_at_temperature.h"
#include "review/review.h"
#include "test_support.h"

namespace hushgain {
namespace {

using test::RelErr;

Budget Compute(const Stage& stage) {
  ReviewOptions options;
  options.budget.integration.relative_tolerance = 1e-6;
  BudgetOutcome outcome = ReviewStage(stage, options);
  REQUIRE_MESSAGE(outcome.status.ok, outcome.status.message);
  return outcome.budget;
}

double C(double celsius) { return celsius + kZeroCelsiusK; }

TEST_CASE("FET bias current doubles every 10 °C: x4 at 45 °C, x1/4 at 5 °C") {
  // Common practice, no source: a FET input's gate leakage roughly doubles
  // every 10 °C. With R_plus = 0 the Ib term is Ib- x Rf (REFERENCES.md
  // section 6), so it follows the law exactly.
  OpAmpModel m = test::IdealOpAmp();
  m.ib_a = 5e-12;
  m.ib_law = BiasTemperatureLaw::kDoubling;
  m.ib_law_value = 10;
  Stage stage = test::InvertingStage(10e3, 1e9, m, C(25));
  stage.temperature_range = TemperatureRange{C(5), C(45)};
  const Budget b = Compute(stage);
  REQUIRE(b.temperature.has_value());
  const double at_25 = 5e-12 * 1e9;  // Ib Rf
  CHECK(RelErr(b.temperature->nominal.offset.ib_v, at_25) < test::kRelIdeal);
  CHECK(RelErr(b.temperature->max.offset.ib_v, 4 * at_25) < test::kRelIdeal);
  CHECK(RelErr(b.temperature->min.offset.ib_v, at_25 / 4) < test::kRelIdeal);
  CHECK(b.temperature->max.offset_dominant == "Ib");
  // Drift of the worst case toward each end: (wc(T) - wc(25)) / (T - 25).
  CHECK(RelErr(b.temperature->drift_to_max_v_per_k, (4 * at_25 - at_25) / 20) <
        test::kRelIdeal);
  CHECK(RelErr(b.temperature->drift_to_min_v_per_k, (at_25 / 4 - at_25) / -20) <
        test::kRelIdeal);
}

TEST_CASE("a bipolar coefficient law, Vos drift and Ios scaled like Ib") {
  // Ib(T) = Ib (1 + c (T - 25)), c = -0.5 %/°C: x0.775 at 70 °C; Ios follows
  // the same factor; |Vos(T)| = |Vos| + |drift| |T - 25|.
  OpAmpModel m = test::IdealOpAmp();
  m.ib_a = 50e-9;
  m.ios_a = 10e-9;
  m.vos_v = 30e-6;
  m.vos_drift_v_per_k = 0.3e-6;
  m.ib_law = BiasTemperatureLaw::kCoefficient;
  m.ib_law_value = -0.005;
  const Stage at_70 =
      StageAtTemperature(test::InvertingStage(1e3, 100e3, m), C(70));
  CHECK(RelErr(at_70.opamp.ib_a, 50e-9 * 0.775) < test::kRelTight);
  CHECK(RelErr(at_70.opamp.ios_a, 10e-9 * 0.775) < test::kRelTight);
  CHECK(RelErr(at_70.opamp.vos_v, 30e-6 + 0.3e-6 * 45) < test::kRelTight);
  const Stage at_m20 =
      StageAtTemperature(test::InvertingStage(1e3, 100e3, m), C(-20));
  CHECK(RelErr(at_m20.opamp.vos_v, 30e-6 + 0.3e-6 * 45) < test::kRelTight);
  CHECK(RelErr(at_m20.opamp.ib_a, 50e-9 * 1.225) < test::kRelTight);
}

TEST_CASE("resistor tempco and 4kT at each end of the range") {
  // R(T) = R (1 + tc (T - 25 °C)); R_f's thermal noise reaches the output
  // with gain 1 (section 6): density sqrt(4 k T R_f(T)) (Johnson 1928,
  // Nyquist 1928; k exact in the 2019 SI).
  Stage stage = test::InvertingStage(10e3, 1e6, test::IdealOpAmp(), C(25));
  stage.temperature_range = TemperatureRange{C(-40), C(85)};
  stage.resistors = ResistorSpec{"x", {"test film", -40, 100e-6, 0}, 0};
  const Stage hot = StageAtTemperature(stage, C(85));
  CHECK(RelErr(hot.feedback.resistor_ohm, 1e6 * (1 + 100e-6 * 60)) <
        test::kRelTight);
  CHECK(RelErr(hot.input_resistor_ohm, 10e3 * (1 + 100e-6 * 60)) <
        test::kRelTight);
  BudgetOptions options;
  const BudgetOutcome hot_budget = ComputeBudgetAsGiven(hot, options);
  REQUIRE(hot_budget.status.ok);
  const double rf = 1e6 * (1 + 100e-6 * 60);
  CHECK(RelErr(test::FindContributor(hot_budget.budget, "R_f")
                   .output_density_ref_v_per_rthz,
               std::sqrt(test::FourKT(C(85)) * rf)) < test::kRelIdeal);
  const Budget b = Compute(stage);
  REQUIRE(b.temperature.has_value());
  CHECK(RelErr(b.temperature->max.output_rms_v,
               hot_budget.budget.output_rms_v) < test::kRelTight);
  CHECK(b.temperature->max.output_rms_v > b.temperature->nominal.output_rms_v);
  CHECK(b.temperature->nominal.output_rms_v > b.temperature->min.output_rms_v);
}

TEST_CASE(
    "compensation resistor on the section 6 T network: 33.912 21 mV without, "
    "Ios Req with") {
  // REFERENCES.md section 6 worked example: Rin 4.7k, R1 47k, R2 220k,
  // R3 2.2k, 300 K, Vos 25 uV, Ib- 1.0 nA, Ib+ 0.9 nA, e_n 5 nV, i_n 0.5 pA.
  // Without R_plus: Vos NG_T + Ib- Req = 33.912 21 mV. At the balance
  // Rp = Req / NG_T = 4290.001 the Ib terms cancel and Ios Req remains.
  OpAmpModel m = test::IdealOpAmp(5e-9, 0.5e-12);
  m.vos_v = 25e-6;
  m.ib_a = 0.95e-9;
  m.ios_a = 0.1e-9;
  const Stage stage = test::TeeStage(4.7e3, 47e3, 220e3, 2.2e3, m, 300.0);
  const Budget b = Compute(stage);
  REQUIRE(b.compensation.has_value());
  const CompensationBlock& c = *b.compensation;
  const double req = 47e3 + 220e3 + 47e3 * 220e3 / 2.2e3;
  const double ng = 1 + 220e3 / 2.2e3 + req / 4.7e3;
  CHECK(RelErr(c.balance_ohm, req / ng) < test::kRelTight);
  CHECK(RelErr(c.balance_ohm, 4290.001) < 1e-6);
  CHECK(RelErr(c.offset_without_v, 33.91221e-3) < 1e-6);
  CHECK(RelErr(c.offset_with_v, 25e-6 * ng + 0.1e-9 * req) < test::kRelIdeal);
  CHECK(std::fabs(c.ib_with_v) < 1e-12);
  // The noise R_plus adds: its 4kTRp and i_n+ Rp, both through NG_T, white,
  // over the 0.1 .. 10 Hz band of the test stage.
  const double added_density_sq = (test::FourKT(300.0) * c.balance_ohm +
                                   0.25e-24 * c.balance_ohm * c.balance_ohm) *
                                  ng * ng;
  CHECK(RelErr(c.noise_with_v * c.noise_with_v -
                   c.noise_without_v * c.noise_without_v,
               added_density_sq * 9.9) < 1e-5);
  CHECK(RelErr(c.noise_without_v, 11617.20e-9 * std::sqrt(9.9)) < 1e-6);
  CHECK(c.worth_doing);    // 33.9 mV -> 29.4 mV, 13 % lower
  CHECK(c.noise_matters);  // about 40 % of the power, no bypass
}

TEST_CASE("compensation beside a dominant Vos term is not worth fitting") {
  // The same network with Vos 2.5 mV: Vos NG_T = 2.89 V against Ib- Req =
  // 4.97 uV, so the balance resistor changes the worst case by under
  // 1e-5; its noise advice is not shown though R_plus adds ~40 % of the
  // power.
  OpAmpModel m = test::IdealOpAmp(5e-9, 0.5e-12);
  m.vos_v = 2.5e-3;
  m.ib_a = 1e-12;
  const Stage stage = test::TeeStage(4.7e3, 47e3, 220e3, 2.2e3, m, 300.0);
  const Budget b = Compute(stage);
  REQUIRE(b.compensation.has_value());
  const CompensationBlock& c = *b.compensation;
  CHECK(c.offset_with_v > 0.9 * c.offset_without_v);
  CHECK(c.added_share > kCompensationNoiseShare);
  CHECK_FALSE(c.worth_doing);
  CHECK_FALSE(c.noise_matters);
}

TEST_CASE("compensation of a stage with its own R_plus grounds the + input") {
  // The "without" figures are those of the stage with the + input grounded:
  // for a stage without R_plus its own budget, for one with R_plus a
  // budget of its own. 1 M at the + input adds 4kTR and i_n+ R through the
  // noise gain, so the two differ (common practice, no source).
  OpAmpModel m = test::IdealOpAmp(5e-9, 0.5e-12);
  Stage grounded = test::TeeStage(4.7e3, 47e3, 220e3, 2.2e3, m, 300.0);
  Stage with_own = grounded;
  with_own.plus_resistor = {PlusResistor::Mode::kValue, 1e6};
  const Budget a = Compute(grounded);
  const Budget b = Compute(with_own);
  REQUIRE(a.compensation.has_value());
  REQUIRE(b.compensation.has_value());
  CHECK(a.compensation->noise_without_v == a.output_rms_v);
  CHECK(a.compensation->offset_without_v == a.offset.worst_case_v);
  CHECK(b.output_rms_v > 1.01 * a.output_rms_v);
  CHECK(RelErr(b.compensation->noise_without_v, a.output_rms_v) < 1e-12);
  CHECK(RelErr(b.compensation->offset_without_v, a.offset.worst_case_v) <
        1e-12);
}

TEST_CASE(
    "a bypass capacitor across R_plus removes its noise above 1/(2 pi R C)") {
  OpAmpModel m = test::IdealOpAmp(5e-9, 0.5e-12);
  Stage stage = test::TeeStage(4.7e3, 47e3, 220e3, 2.2e3, m, 300.0);
  stage.plus_resistor.mode = PlusResistor::Mode::kAuto;
  const Budget open = Compute(stage);
  stage.plus_resistor_bypass_f = 1.0;  // corner 37 uHz, far below the band
  const Budget bypassed = Compute(stage);
  REQUIRE(bypassed.compensation.has_value());
  CHECK_FALSE(bypassed.compensation->noise_matters);
  // R_plus's share collapses: its 4kTR is shorted by 1 F over 0.1 .. 10 Hz,
  // by |Z| / R = 1 / sqrt(1 + (2 pi f R C)^2) < 4e-4.
  CHECK(test::FindContributor(bypassed, "R_plus").share < 1e-6);
  CHECK(test::FindContributor(open, "R_plus").share > 0.3);
}

}  // namespace
}  // namespace hushgain

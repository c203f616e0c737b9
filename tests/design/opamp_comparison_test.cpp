// The same stage with several op-amps: every row is the review `budget`
// prints, the noise power splits by kind as the closed-form output terms of
// an inverting stage do, R_opt = e_n / i_n at the reference, and the rows
// are ranked with the op-amps that fit first. Expected values are built here
// from closed forms.
#include "design/opamp_comparison.h"

#include <doctest/doctest.h>

#include <cmath>

#include "circuit/stage_at_temperature.h"
#include "test_support.h"

namespace hushgain {
namespace {

using test::RelErr;

OpAmpComparisonOptions Options(OpAmpRanking ranking) {
  OpAmpComparisonOptions o;
  o.ranking = ranking;
  o.review.budget.integration.relative_tolerance = 1e-8;
  REQUIRE(o.Validate().empty());
  return o;
}

std::vector<std::string> Order(const OpAmpComparison& c) {
  std::vector<std::string> out;
  for (const OpAmpComparisonRow& r : c.rows) out.push_back(r.device);
  return out;
}

TEST_CASE("the optimum source resistance is e_n over i_n at the reference") {
  // e_n(f) = e_w sqrt(1 + f_cv / f), i_n(f) = i_w sqrt(1 + f_ci / f)
  // (circuit/opamp_model.h); R_opt = e_n / i_n where the two input-referred
  // terms e_n and i_n R_s are equal (textbook noise matching, from memory).
  OpAmpModel m = test::IdealOpAmp(4e-9, 0.4e-12);
  m.f_cv_hz = 20;
  m.f_ci_hz = 200;
  const double f = 50;
  const double expected =
      4e-9 * std::sqrt(1 + 20 / f) / (0.4e-12 * std::sqrt(1 + 200 / f));
  const std::optional<double> at25 =
      OptimumSourceResistanceOhm(m, f, kDeviceReferenceK);
  REQUIRE(at25.has_value());
  CHECK(RelErr(*at25, expected) < 1e-12);

  // A FET input whose i_n^2 follows its bias current, doubling every 10 K:
  // 20 K above 25 °C i_n is sqrt(2^2) = 2 times larger (gate shot noise
  // sqrt(2 q I_b), Schottky 1918), so R_opt halves.
  m.current_noise_temperature = CurrentNoiseTemperature::kWithBiasCurrent;
  m.ib_a = 1e-12;
  m.ib_law = BiasTemperatureLaw::kDoubling;
  m.ib_law_value = 10;
  const std::optional<double> at45 =
      OptimumSourceResistanceOhm(m, f, kDeviceReferenceK + 20);
  REQUIRE(at45.has_value());
  CHECK(RelErr(*at45, expected / 2) < 1e-12);

  // No current noise: no optimum.
  CHECK_FALSE(OptimumSourceResistanceOhm(test::IdealOpAmp(4e-9, 0), f,
                                         kDeviceReferenceK)
                  .has_value());
}

TEST_CASE(
    "the noise power splits by kind as the output terms of an inverting "
    "stage") {
  // REFERENCES.md section 6, the simple example (Franco, derived there):
  // R_in 2.2k, R_f 330k, 300 K, e_n 5 nV/rtHz, i_n 0.5 pA/rtHz; output
  // terms e_n NG, i_n- R_f, sqrt(4kT R_in) R_f/R_in, sqrt(4kT R_f). All
  // white and the op-amp ideal, so the shares of the band's noise power are
  // those of the densities.
  const double rin = 2.2e3, rf = 330e3, e = 5e-9, i = 0.5e-12;
  const Stage stage =
      test::InvertingStage(rin, rf, test::IdealOpAmp(1e-9, 0), 300.0);
  const double four_kt = test::FourKT(300.0);
  const double en2 = std::pow(e * (1 + rf / rin), 2);
  const double in2 = std::pow(i * rf, 2);
  const double r2 = four_kt * rin * std::pow(rf / rin, 2) + four_kt * rf;
  const double total = en2 + in2 + r2;

  const OpAmpComparison c =
      CompareOpAmps(stage, {{"quiet", test::IdealOpAmp(e, i)}},
                    Options(OpAmpRanking::kInputNoise));
  REQUIRE(c.rows.size() == 1);
  const OpAmpComparisonRow& row = c.rows.front();
  REQUIRE_MESSAGE(row.status.ok, row.status.message);
  CHECK(RelErr(row.shares.voltage_noise, en2 / total) < 1e-6);
  CHECK(RelErr(row.shares.current_noise, in2 / total) < 1e-6);
  CHECK(RelErr(row.shares.resistor, r2 / total) < 1e-6);
  CHECK(row.shares.other == 0);
  // The section's published output terms: e_n 755.0, i_n 165.0, R_in
  // 905.597, R_f 73.942, RSS 1192.821 nV/rtHz.
  CHECK(std::fabs(row.shares.voltage_noise - std::pow(755.0 / 1192.821, 2)) <
        1e-5);
  // The source as the op-amp sees it (R_s 0 + R_in) against R_opt = 10k.
  REQUIRE(c.voltage_source);
  CHECK(c.source_resistance_seen_ohm == rin);
  REQUIRE(row.optimum_source_ohm.has_value());
  CHECK(RelErr(*row.optimum_source_ohm, e / i) < 1e-12);
  CHECK(RelErr(*row.source_to_optimum, rin / (e / i)) < 1e-12);
  CHECK(row.Fits());
}

TEST_CASE("each row is the review of the stage with that op-amp") {
  const Stage stage = test::JfetTeeStage();
  OpAmpModel other = test::IdealOpAmp(3e-9, 1e-12);
  other.open_loop_gain = 2e5;
  other.gbw_hz = 8e6;
  other.vos_v = 50e-6;
  const OpAmpComparisonOptions options = Options(OpAmpRanking::kInputNoise);
  const OpAmpComparison c = CompareOpAmps(
      stage, {{"jfet", test::JfetLikeOpAmp()}, {"bipolar", other}}, options);
  REQUIRE(c.rows.size() == 2);
  for (const OpAmpComparisonRow& row : c.rows) {
    CAPTURE(row.device);
    Stage with = stage;
    with.opamp = row.device == "jfet" ? test::JfetLikeOpAmp() : other;
    const BudgetOutcome direct = ReviewStage(with, options.review);
    REQUIRE(direct.status.ok);
    CHECK(row.budget.input_rms == direct.budget.input_rms);
    CHECK(row.budget.offset.worst_case_v == direct.budget.offset.worst_case_v);
    CHECK(row.budget.loop.phase_margin_deg ==
          direct.budget.loop.phase_margin_deg);
    CHECK(row.budget.bandwidth_3db_hz == direct.budget.bandwidth_3db_hz);
    double sum = 0;
    for (const Contributor& k : direct.budget.contributors) sum += k.share;
    CHECK(std::fabs(row.shares.voltage_noise + row.shares.current_noise +
                    row.shares.resistor + row.shares.other - sum) < 1e-12);
  }
}

TEST_CASE("rows are ranked by input noise or offset with the fitting first") {
  // On an ideal op-amp the input-referred noise rises with e_n and the
  // worst-case offset is Vos NG (REFERENCES.md section 6), so the order
  // follows e_n, or Vos.
  const Stage stage = test::InvertingStage(2.2e3, 330e3, test::IdealOpAmp());
  auto device = [](double e_n, double vos) {
    OpAmpModel m = test::IdealOpAmp(e_n, 0);
    m.vos_v = vos;
    return m;
  };
  // The quietest of all, with a gain-bandwidth of 1 Hz: its gain collapses
  // in the band, so it ranks after every op-amp that fits.
  OpAmpModel slow = device(0.1e-9, 0);
  slow.open_loop_gain = 1e3;
  slow.gbw_hz = 1;
  const std::vector<NamedOpAmp> opamps = {{"ten", device(10e-9, 1e-3)},
                                          {"slow", slow},
                                          {"one", device(1e-9, 3e-3)},
                                          {"five", device(5e-9, 2e-3)}};

  const OpAmpComparison by_noise =
      CompareOpAmps(stage, opamps, Options(OpAmpRanking::kInputNoise));
  CHECK(Order(by_noise) ==
        std::vector<std::string>{"one", "five", "ten", "slow"});
  for (std::size_t k = 0; k < by_noise.rows.size(); ++k)
    CHECK(by_noise.rows[k].rank == static_cast<int>(k) + 1);
  CHECK_FALSE(by_noise.rows.back().Fits());
  CHECK(by_noise.rows[1].budget.input_rms < by_noise.rows[2].budget.input_rms);

  const OpAmpComparison by_offset =
      CompareOpAmps(stage, opamps, Options(OpAmpRanking::kOffset));
  CHECK(Order(by_offset) ==
        std::vector<std::string>{"ten", "five", "one", "slow"});
  const double ng = 1 + 330e3 / 2.2e3;
  CHECK(RelErr(by_offset.rows.front().budget.offset.worst_case_v, 1e-3 * ng) <
        test::kRelIdeal);
}

TEST_CASE("a refused op-amp is a row after the others and not an abort") {
  // A phase-margin target for the automatic C_f that the slow op-amp's loop
  // cannot reach (its second pole sits near the crossover), while the
  // ideal one's can.
  Stage stage = test::ReceiverStage(test::IdealOpAmp(), 100e-12, 0, 1e6, 0);
  stage.capacitor_target =
      CapacitorTarget{CapacitorTarget::Kind::kPhaseMargin, 89.0};
  OpAmpModel slow = test::IdealOpAmp(10e-9, 1e-15);
  slow.open_loop_gain = 1e5;
  slow.gbw_hz = 1e5;
  slow.output_resistance_ohm = 1e3;
  slow.c_cm_f = 1e-9;
  const OpAmpComparison c =
      CompareOpAmps(stage, {{"slow", slow}, {"ideal", test::IdealOpAmp()}},
                    Options(OpAmpRanking::kInputNoise));
  REQUIRE(c.rows.size() == 2);
  CHECK(c.rows[0].device == "ideal");
  CHECK(c.rows[0].status.ok);
  CHECK(c.rows[0].rank == 1);
  CHECK(c.rows[1].device == "slow");
  CHECK_FALSE(c.rows[1].status.ok);
  CHECK(c.rows[1].rank == 0);
  CHECK_FALSE(c.rows[1].Fits());
  CHECK(c.rows[1].status.message.find("no feedback capacitor") == 0);
  // A photodiode is no voltage source: no optimum source resistance.
  CHECK_FALSE(c.voltage_source);
  CHECK_FALSE(c.rows[0].optimum_source_ohm.has_value());
}

}  // namespace
}  // namespace hushgain

// Resistor excess noise from the noise index against REFERENCES.md section 8
// (IEC 60195; Conrad, Newman and Stansbury 1960; the density conversion
// derived there), and end to end through the budget.
#include "noise/excess_noise.h"

#include <doctest/doctest.h>

#include <cmath>

#include "budget/compute_budget.h"
#include "test_support.h"

namespace hushgain {
namespace {

using test::RelErr;

// The section quotes 5 or 6 significant digits.
constexpr double kRelQuoted = 2e-5;

TEST_CASE("noise index to 1/f density: the section 8 values") {
  // e_ex(f) = 10^(NI/20) 1e-6 V_DC / sqrt(ln(10) f) (section 8, derived there).
  const double sqrt_ln10 = std::sqrt(std::log(10.0));
  CHECK(RelErr(sqrt_ln10, 1.51742713) < 1e-8);
  CHECK(RelErr(ExcessNoiseDensity(-20, 1.0, 1.0), 0.1e-6 / sqrt_ln10) <
        test::kRelTight);
  CHECK(RelErr(ExcessNoiseDensity(-20, 1.0, 1.0), 65.901e-9) < kRelQuoted);
  CHECK(RelErr(ExcessNoiseDensity(-20, 1.0, 1e3), 2.08397e-9) < kRelQuoted);
  CHECK(RelErr(ExcessNoiseDensity(0, 10.0, 1.0), 6.5901e-6) < kRelQuoted);
  CHECK(RelErr(ExcessNoiseDensity(-30, 5.0, 10.0), 32.9505e-9) < kRelQuoted);
}

TEST_CASE(
    "excess noise meets thermal noise at U_dec^2 / (ln10 4kTR): 262.13 Hz") {
  // 100 kOhm, 10 V, -20 dB, 300 K (section 8): S_ex(f) = K / f equals 4kTR at
  // f = K / (4kTR).
  const double k = ExcessNoiseCoefficient(-20, 10.0);
  const double corner = k / (test::FourKT(300.0) * 100e3);
  CHECK(RelErr(corner, 262.13) < kRelQuoted);
  CHECK(RelErr(ExcessNoiseDensity(-20, 10.0, corner),
               std::sqrt(test::FourKT(300.0) * 100e3)) < test::kRelTight);
}

TEST_CASE("excess noise over five decades: 2.236 07 uV rms") {
  // 10^(NI/20) 1e-6 V_DC sqrt(log10(fH / fL)), 0.1 Hz .. 10 kHz, 10 V, -20 dB.
  CHECK(RelErr(ExcessNoiseRms(-20, 10.0, 0.1, 1e4), 2.23607e-6) < kRelQuoted);
  CHECK(RelErr(ExcessNoiseRms(-20, 10.0, 0.1, 1e4), 1e-6 * std::sqrt(5.0)) <
        test::kRelTight);
}

TEST_CASE(
    "the budget adds R_in and R_f excess from the DC solution at the DC "
    "input") {
  // Ideal op-amp, no offsets: with V_in at the input, R_in drops V_in and R_f
  // drops V_in Rf / Rin (the summing node is at 0 V). R_f's series voltage
  // reaches the output with gain 1, R_in's with Rf / Rin (REFERENCES.md
  // section 6, as for their thermal noise), so the output rms of each is
  // 10^(NI/20) 1e-6 V_DC sqrt(decades) times that gain.
  Stage stage =
      test::InvertingStage(10e3, 100e3, test::IdealOpAmp(1e-9, 0), 300.0);
  stage.dc_input = 0.2;
  ResistorSpec thick{"thick-film", {"thick film", -10, 0, 0.01}, 0.01};
  stage.resistors = thick;
  BudgetOptions options;
  options.integration.relative_tolerance = 1e-8;
  const BudgetOutcome out = ComputeBudget(stage, options);
  REQUIRE_MESSAGE(out.status.ok, out.status.message);
  const Budget& b = out.budget;
  const double decades = std::log10(10.0 / 0.1);
  const double rin_out =
      std::pow(10.0, -0.5) * 1e-6 * 0.2 * std::sqrt(decades) * 10.0;
  const double rf_out = std::pow(10.0, -0.5) * 1e-6 * 2.0 * std::sqrt(decades);
  CHECK(RelErr(test::FindContributor(b, "R_in excess").output_rms_v, rin_out) <
        test::kRelIdeal);
  CHECK(RelErr(test::FindContributor(b, "R_f excess").output_rms_v, rf_out) <
        test::kRelIdeal);
  CHECK(test::FindContributor(b, "R_f excess").kind == NoiseKind::kExcess);
  // The source density is quoted as the series voltage e_ex at the reference.
  CHECK(RelErr(test::FindContributor(b, "R_f excess").source_density_ref,
               ExcessNoiseDensity(-10, 2.0, 1.0)) < test::kRelIdeal);
  REQUIRE(b.resistor_drops.size() == 2);
  CHECK(RelErr(std::fabs(b.resistor_drops[1].v_dc), 2.0) < test::kRelIdeal);
  // Both drops reach the output as V_in Rf / Rin: equal shares, and the
  // advice names one of them with that share.
  CHECK(RelErr(rin_out, rf_out) < test::kRelTight);
  REQUIRE(b.excess_advice.has_value());
  CHECK(RelErr(b.excess_advice->share,
               test::FindContributor(b, b.excess_advice->resistor + " excess")
                   .share) < test::kRelTight);
}

TEST_CASE(
    "the excess advice prices a quieter technology by 10^(dNI/10) in power") {
  Stage stage =
      test::InvertingStage(10e3, 100e3, test::IdealOpAmp(1e-9, 0), 300.0);
  stage.dc_input = 0.2;
  stage.resistors =
      ResistorSpec{"thick-film", {"thick film", -10, 0, 0.01}, 0.01};
  BudgetOptions options;
  options.integration.relative_tolerance = 1e-8;
  options.upgrade_candidates = {
      {"thin-film", {"thin film", -35, 0, 0.001}, 0.001}};
  const BudgetOutcome thick = ComputeBudget(stage, options);
  REQUIRE(thick.status.ok);
  REQUIRE(thick.budget.excess_advice.has_value());
  REQUIRE(thick.budget.excess_advice->alternatives.size() == 1);
  // The same stage with R_in in thin film, computed through the engine.
  Stage upgraded = stage;
  upgraded.resistor_overrides["R_in"] = {
      "thin-film", {"thin film", -35, 0, 0.001}, 0.001};
  const BudgetOutcome thin = ComputeBudget(upgraded, options);
  REQUIRE(thin.status.ok);
  CHECK(RelErr(thick.budget.excess_advice->alternatives[0].output_rms_v,
               thin.budget.output_rms_v) < 1e-6);
}

}  // namespace
}  // namespace hushgain

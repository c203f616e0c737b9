#include "design/closed_form_budget.h"

#include <doctest/doctest.h>

#include <cmath>

#include "budget/compute_budget.h"
#include "test_support.h"

namespace hushgain {
namespace {

using test::RelErr;

// REFERENCES.md section 6 prints 6 to 7 significant digits.
constexpr double kRelPrinted = 2e-6;

// The op-amp of the REFERENCES.md section 6 worked example: e_n = 5 nV/rtHz,
// i_n = 0.5 pA/rtHz, Vos = 25 uV, Ib- = 1.0 nA, Ib+ = 0.9 nA, i.e. Ib =
// 0.95 nA and Ios = Ib+ - Ib- = -0.1 nA (Ib+- = Ib +- Ios/2).
OpAmpModel WorkedExampleOpAmp() {
  OpAmpModel m = test::IdealOpAmp(5e-9, 0.5e-12);
  m.vos_v = 25e-6;
  m.ib_a = 0.95e-9;
  m.ios_a = 0.1e-9;
  return m;
}

// A white-noise band 1 kHz wide ("brick wall"), starting far below 1 Hz.
Stage WithBrickWall(Stage s) {
  s.band_low_hz = 1e-6;
  s.band_high_hz = 1e3 + 1e-6;
  return s;
}

TEST_CASE("closed form reproduces the worked T-network example") {
  // REFERENCES.md section 6 (derived there by sympy nodal analysis): Rin =
  // 4.7k, R1 = 47k, R2 = 220k, R3 = 2.2k, 300 K. Req = 4.967 M, NG_T =
  // 1157.8085, RSS 11 617.20 nV/rtHz at the output (Rp = 0), which over a
  // 1 kHz brick-wall band is 11 617.20 nV x sqrt(1000) = 367.368 uV rms.
  const Stage stage = WithBrickWall(
      test::TeeStage(4.7e3, 47e3, 220e3, 2.2e3, WorkedExampleOpAmp()));
  const ClosedFormModel model = MakeClosedFormModel(stage);
  const ClosedFormFigures f = ClosedFormTee(model, 4.7e3, 47e3, 220e3, 2.2e3);
  CHECK(RelErr(f.equivalent_ohm, 4.967e6) < test::kRelTight);
  CHECK(RelErr(f.gain, 1056.8085) < kRelPrinted);
  CHECK(RelErr(f.noise_gain, 1157.8085) < kRelPrinted);
  CHECK(RelErr(f.output_rms_v, 11617.20e-9 * std::sqrt(1000.0)) < kRelPrinted);
  CHECK(RelErr(f.output_rms_v, 367.368e-6) < kRelPrinted);

  // Offsets with Rp = 0: Vos NG = 28.945 21 mV and Ib- Req = 4.967 mV, total
  // 33.912 21 mV (REFERENCES.md section 6). With Rp = 0 every term adds, so
  // the worst case is that total.
  CHECK(RelErr(f.offset_worst_case_v, 33.91221e-3) < kRelPrinted);
}

TEST_CASE("closed-form offset with R_plus = 4.3k bounds the signed example") {
  // REFERENCES.md section 6: with Rp = 4.3 kOhm the signed total is
  // Vos NG + Ib- Req - Ib+ Rp NG = 29.431 49 mV. The worst case takes the
  // Ib term |Ib (Req - Rp NG)| with the sign opposite to the one it has in
  // that sum, so it exceeds the signed total by twice that term.
  Stage stage = WithBrickWall(
      test::TeeStage(4.7e3, 47e3, 220e3, 2.2e3, WorkedExampleOpAmp()));
  stage.plus_resistor.mode = PlusResistor::Mode::kValue;
  stage.plus_resistor.ohms = 4.3e3;
  const ClosedFormFigures f =
      ClosedFormTee(MakeClosedFormModel(stage), 4.7e3, 47e3, 220e3, 2.2e3);
  const double ng = 1 + 220e3 / 2.2e3 + 4.967e6 / 4.7e3;
  const double ib_term = 0.95e-9 * (4.967e6 - 4.3e3 * ng);  // negative
  CHECK(ib_term < 0);
  CHECK(RelErr(f.offset_worst_case_v, 29.43149e-3 + 2 * std::fabs(ib_term)) <
        kRelPrinted);
  // That Rp adds 9772.445 (thermal) and 2489.288 (i_n+) nV/rtHz: RSS
  // 15 383.65 nV/rtHz.
  CHECK(RelErr(f.output_rms_v, 15383.65e-9 * std::sqrt(1000.0)) < kRelPrinted);
}

TEST_CASE("closed form reproduces the plain inverting example") {
  // REFERENCES.md section 6, simple example: Rin = 2.2k, Rf = 330k, 300 K:
  // NG = 151, RSS 1192.821 nV/rtHz; Vos -> 3.775 mV, Ib- -> 0.33 mV.
  OpAmpModel m = WorkedExampleOpAmp();
  m.ib_a = 1e-9;  // Ib- = 1.0 nA with Ios = 0 for this check
  m.ios_a = 0;
  const Stage stage = WithBrickWall(test::InvertingStage(2.2e3, 330e3, m));
  const ClosedFormFigures f =
      ClosedFormPlain(MakeClosedFormModel(stage), 2.2e3, 330e3);
  CHECK(RelErr(f.noise_gain, 151.0) < test::kRelTight);
  CHECK(RelErr(f.output_rms_v, 1192.821e-9 * std::sqrt(1000.0)) < kRelPrinted);
  CHECK(RelErr(f.offset_worst_case_v, 3.775e-3 + 0.33e-3) < test::kRelTight);
}

TEST_CASE("closed form integrates 1/f plus white voltage noise exactly") {
  // REFERENCES.md section 4, example A: e_w = 10 nV/rtHz, f_c = 100 Hz over
  // 0.1 Hz to 10 kHz -> 1.055 992 071 uV rms, times the noise gain at the
  // output. Resistor noise is removed by a temperature near 0 K.
  OpAmpModel m = test::IdealOpAmp(10e-9, 0);
  m.f_cv_hz = 100;
  Stage stage = test::TeeStage(10e3, 100e3, 100e3, 1e3, m, 1e-30);
  stage.band_low_hz = 0.1;
  stage.band_high_hz = 10e3;
  const ClosedFormFigures f =
      ClosedFormTee(MakeClosedFormModel(stage), 10e3, 100e3, 100e3, 1e3);
  const double ng = 1 + 100.0 + 10.2e6 / 10e3;  // 1 + R2/R3 + Req/Rin
  CHECK(RelErr(f.noise_gain, ng) < test::kRelTight);
  CHECK(RelErr(f.output_rms_v / ng, 1.055992071e-6) < 1e-9);
}

TEST_CASE("closed form agrees with the full engine for an ideal op-amp") {
  // Independent paths to the same physics: the closed form of the header
  // against MNA with adjoint solve and adaptive integration (target 1e-4
  // in power). Source resistance, auto R_plus and 1/f corners included.
  OpAmpModel m = test::IdealOpAmp(4e-9, 20e-15);
  m.f_cv_hz = 30;
  m.f_ci_hz = 200;
  m.vos_v = 50e-6;
  m.ib_a = 2e-12;
  m.ios_a = 1e-12;
  Stage stage = test::TeeStage(3.3e3, 68e3, 150e3, 1.8e3, m, 310);
  stage.source.resistance_ohm = 470;
  stage.plus_resistor.mode = PlusResistor::Mode::kAuto;
  stage.band_low_hz = 0.5;
  stage.band_high_hz = 2e3;
  BudgetOptions options;
  const BudgetOutcome full = ComputeBudget(stage, options);
  REQUIRE(full.status.ok);
  const ClosedFormFigures f =
      ClosedFormTee(MakeClosedFormModel(stage), 3.3e3, 68e3, 150e3, 1.8e3);
  CHECK(RelErr(f.output_power_v2,
               full.budget.output_rms_v * full.budget.output_rms_v) <
        2 * test::kRelIntegral);
  CHECK(RelErr(f.noise_gain, full.budget.noise_gain_dc) < test::kRelIdeal);
  CHECK(RelErr(f.gain, std::fabs(full.budget.signal_gain_dc)) <
        test::kRelIdeal);
  CHECK(RelErr(f.offset_worst_case_v, full.budget.offset.worst_case_v) <
        test::kRelIdeal);
}

TEST_CASE("the power row equals the closed form network by network") {
  OpAmpModel m = test::IdealOpAmp(7e-9, 1e-12);
  m.f_cv_hz = 10;
  for (PlusResistor::Mode mode :
       {PlusResistor::Mode::kNone, PlusResistor::Mode::kValue,
        PlusResistor::Mode::kAuto}) {
    Stage stage = test::TeeStage(1e3, 1e3, 1e3, 1e3, m);
    stage.source.resistance_ohm = 100;
    stage.plus_resistor.mode = mode;
    stage.plus_resistor.ohms = 2e3;
    const ClosedFormModel model = MakeClosedFormModel(stage);
    const double r3[] = {100, 470, 1e3, 22e3};
    double inv[4];
    double row[4];
    for (int j = 0; j < 4; ++j) inv[j] = 1 / r3[j];
    ClosedFormTeePowerRow(model, 2.2e3, 47e3, 33e3, inv, 4, row);
    for (int j = 0; j < 4; ++j) {
      const ClosedFormFigures f =
          ClosedFormTee(model, 2.2e3, 47e3, 33e3, r3[j]);
      CHECK(RelErr(row[j], f.output_power_v2) < 1e-12);
    }
  }
}

TEST_CASE("a shunt across R_plus scales its terms by 1 / (1 + Rp B) squared") {
  // The closed form's power splits into the + input resistor's terms,
  // (4kT B Rp + i_n^2 Bi Rp^2) NG^2 (header), and the rest, which is the
  // power without R_plus. With plus_shunt_s = B only the first is scaled,
  // by 1 / (1 + Rp B)^2; the row function agrees network by network.
  OpAmpModel m = test::IdealOpAmp(7e-9, 1e-12);
  for (PlusResistor::Mode mode :
       {PlusResistor::Mode::kValue, PlusResistor::Mode::kAuto}) {
    Stage stage = test::TeeStage(1e3, 1e3, 1e3, 1e3, m);
    stage.source.resistance_ohm = 100;
    stage.plus_resistor.mode = mode;
    stage.plus_resistor.ohms = 2e3;
    const ClosedFormModel plain = MakeClosedFormModel(stage);
    CHECK(plain.plus_shunt_s == 0);
    ClosedFormModel none = plain;
    none.plus_mode = PlusResistor::Mode::kNone;
    ClosedFormModel shunted = plain;
    shunted.plus_shunt_s = 1e-3;  // 1 mS: Rp B of 2 for 2 kOhm
    const double r3[] = {100, 470, 1e3, 22e3};
    double inv[4];
    double row[4];
    for (int j = 0; j < 4; ++j) inv[j] = 1 / r3[j];
    ClosedFormTeePowerRow(shunted, 2.2e3, 47e3, 33e3, inv, 4, row);
    for (int j = 0; j < 4; ++j) {
      CAPTURE(j);
      const double rp =
          mode == PlusResistor::Mode::kValue
              ? 2e3
              : 1 / (1 / 2.3e3 + 1 / (47e3 + 1 / (1 / 33e3 + inv[j])));
      const double p_none =
          ClosedFormTee(none, 2.2e3, 47e3, 33e3, r3[j]).output_power_v2;
      const double p_plus =
          ClosedFormTee(plain, 2.2e3, 47e3, 33e3, r3[j]).output_power_v2;
      const double expected =
          p_none + (p_plus - p_none) / ((1 + rp * 1e-3) * (1 + rp * 1e-3));
      REQUIRE(p_plus > p_none * 1.01);
      CHECK(
          RelErr(
              ClosedFormTee(shunted, 2.2e3, 47e3, 33e3, r3[j]).output_power_v2,
              expected) < 1e-12);
      CHECK(RelErr(row[j], expected) < 1e-12);
    }
  }
}

}  // namespace
}  // namespace hushgain

namespace hushgain {
namespace {

TEST_CASE(
    "the closed-form DC gain equals the engine's with finite A0 and R_o") {
  // The nodal solution in closed_form_budget.h against the MNA solve of the
  // whole macro model at DC (finite A0, R_o into a load, pin capacitances
  // that do not act at DC), for networks whose noise gain spans 10 to 1e4
  // so that A0 = 2e4 takes from 0.05 % to a third of the ideal gain.
  OpAmpModel m = test::IdealOpAmp(5e-9, 1e-13);
  m.open_loop_gain = 2e4;
  m.gbw_hz = 1e6;
  m.output_resistance_ohm = 150;
  m.c_cm_f = 5e-12;
  struct Net {
    double r_in, r1, r2, r3;
  };
  for (const Net& n : {Net{10e3, 10e3, 10e3, 1e6}, Net{1e3, 47e3, 47e3, 470},
                       Net{10e3, 100e3, 100e3, 100}, Net{220, 1e3, 2.2e3, 2.2},
                       Net{4.7e3, 1e6, 33e3, 33e3}}) {
    for (double load : {0.0, 600.0}) {
      Stage s = test::TeeStage(n.r_in, n.r1, n.r2, n.r3, m);
      s.source.resistance_ohm = 50;
      if (load > 0) s.load_ohm = load;
      const ClosedFormModel model = MakeClosedFormModel(s);
      const BudgetOutcome full = ComputeBudget(s, BudgetOptions{});
      REQUIRE_MESSAGE(full.status.ok, full.status.message);
      CAPTURE(n.r3);
      CAPTURE(load);
      const double closed =
          ClosedFormTeeDcGain(model, n.r_in, n.r1, n.r2, n.r3);
      CHECK(test::RelErr(closed, std::fabs(full.budget.signal_gain_dc)) <
            test::kRelTight);
      // And below the ideal Req / Ra, the search's window rule.
      const double ideal = (n.r1 + n.r2 + n.r1 * n.r2 / n.r3) / (50 + n.r_in);
      CHECK(closed < ideal);
    }
  }
  // R_o = 0: the source's output is the amplifier node itself.
  m.output_resistance_ohm = 0;
  Stage s = test::TeeStage(1e3, 47e3, 47e3, 470, m);
  const BudgetOutcome full = ComputeBudget(s, BudgetOptions{});
  REQUIRE(full.status.ok);
  CHECK(test::RelErr(
            ClosedFormTeeDcGain(MakeClosedFormModel(s), 1e3, 47e3, 47e3, 470),
            std::fabs(full.budget.signal_gain_dc)) < test::kRelTight);
}

}  // namespace
}  // namespace hushgain

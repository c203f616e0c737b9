// A capacitive sensor in the inverting topology (source.capacitive): its
// open-circuit voltage V_s = Q / C_s behind C_s, the leakage R_leak across
// its terminals, straight into the - input (a charge amplifier) or through
// R_in. Every expected value is a closed form derived here by nodal analysis
// with an ideal op-amp (the summing node a virtual ground):
//   Z_f = R_f / (1 + s R_f C_f)    the feedback's transimpedance; for a T
//                                  network with C_f across it, R_eq in place
//                                  of R_f (R_eq = R1 + R2 + R1 R2 / R3,
//                                  Kennelly 1899)
//   V_out / V_s = -s C_s Z_f, so V_out / Q = (V_out / V_s) / C_s = -s Z_f,
//                 which is -1 / C_f in the passband, s R_f C_f >> 1
//                 (REFERENCES.md section 13: charge amplifier; derived here)
//   a current i into the summing node gives V_out = -i Z_f
//   e_n's noise gain is 1 + Z_f Y_in with Y_in = s (C_s + C_in) + 1 / R_leak
//   the low corner is 1 / (2 pi R_f C_f)
// and kT/C (REFERENCES.md section 12) for the leakage across C_s.
#include <doctest/doctest.h>

#include <cmath>
#include <complex>
#include <string>
#include <vector>

#include "budget/compute_budget.h"
#include "circuit/expand_stage.h"
#include "noise/spectrum_evaluator.h"
#include "test_support.h"

namespace hushgain {
namespace {

using test::FindContributor;
using test::RelErr;
using cplx = std::complex<double>;

constexpr double kT = 300.0;
constexpr double kCs = 1e-9, kCf = 100e-12, kRf = 1e9, kRleak = 10e9;
constexpr double kCin = 10e-12;  // the op-amp's C_cm + C_diff

// A charge amplifier: 1 nF sensor with 10 GOhm leakage, 1 GOhm || 100 pF.
Stage ChargeAmp() {
  Stage s = test::InvertingStage(0, kRf, test::IdealOpAmp(5e-9, 2e-15), kT);
  s.input_resistor_ohm = 0;
  s.capacitive = CapacitiveSensor{kCs, kRleak};
  s.feedback.capacitor_f = kCf;
  s.opamp.c_cm_f = 4e-12;
  s.opamp.c_diff_f = kCin - 4e-12;
  s.band_low_hz = 10;
  s.band_high_hz = 10e3;
  s.reference_hz = 1e3;
  return s;
}

cplx S(double f) { return cplx(0, 2 * kPi * f); }

cplx Zf(double f, double r = kRf) { return r / (1.0 + S(f) * r * kCf); }

// The engine's transfers at f: signal, e_n and every noise source by name.
struct Transfers {
  cplx signal, e_n;
  std::vector<std::pair<std::string, double>> output_psd;  // per source
};

Transfers EngineAt(const Stage& stage, double f) {
  const Netlist net = ExpandStage(stage);
  SpectrumEvaluator ev;
  REQUIRE(SpectrumEvaluator::Create(net, stage.temperature_k, &ev).ok);
  std::vector<double> psd(ev.source_count());
  REQUIRE(ev.Densities(f, psd.data()).ok);
  Transfers t;
  t.signal = ev.Transfer(ev.Compile(net.signal));
  t.e_n = ev.Transfer(ev.Compile(Excitation{OpAmpInputVoltage{0}}));
  for (int k = 0; k < ev.source_count(); ++k)
    t.output_psd.push_back({ev.sources()[k].name, psd[k]});
  return t;
}

double OutputDensity(const Transfers& t, const std::string& name) {
  for (const auto& [n, psd] : t.output_psd)
    if (n == name) return std::sqrt(psd);
  FAIL("no source " << name);
  return 0;
}

TEST_CASE("a charge amplifier gives V_out = -Q / C_f in its passband") {
  const Stage s = ChargeAmp();
  // V_out / Q = (V_out / V_s) / C_s = -Z_f s: the passband value -1/C_f
  // times the high-pass s R_f C_f / (1 + s R_f C_f).
  for (double f : {0.1, 1.0, 10.0, 1e3, 1e5}) {
    CAPTURE(f);
    const cplx per_coulomb = EngineAt(s, f).signal / kCs;
    const cplx expected = -Zf(f) * S(f);
    CHECK(std::abs(per_coulomb - expected) / std::abs(expected) <
          test::kRelIdeal);
  }
  // Far above the corner (1.59 Hz) the gain is -1/C_f: 1 pC gives -10 mV.
  const cplx far = EngineAt(s, 1e5).signal / kCs;
  CHECK(RelErr(far.real() * 1e-12, -1e-12 / kCf) < 1e-6);
  CHECK(std::fabs(far.imag() / far.real()) < 2e-5);  // 1/(w R_f C_f)

  // The budget's charge gain is the passband gain over C_s: 1/C_f once the
  // band reaches far above the corner (its top at 10 kHz: 1 - 1.3e-8).
  const Budget b = test::ComputeOrFail(s, 1e-8);
  REQUIRE(b.charge);
  CHECK(b.blocks_dc);
  CHECK(RelErr(b.charge->charge_gain_v_per_c, 1 / kCf) < test::kRelIdeal);
  CHECK(RelErr(b.charge->charge_gain_v_per_c, b.passband_gain / kCs) <
        test::kRelTight);
  CHECK(b.charge->sensor_capacitance_f == kCs);
  CHECK(b.charge->leakage_resistance_ohm == kRleak);
  CHECK(b.input_unit == "V");
}

TEST_CASE(
    "the e_n noise gain of a charge amplifier is 1 + (C_s + C_in)/C_f in its "
    "passband") {
  const Stage s = ChargeAmp();
  for (double f : {0.01, 1.0, 10.0, 1e3, 1e5}) {
    CAPTURE(f);
    const cplx y_in = S(f) * (kCs + kCin) + 1.0 / kRleak;
    const double expected = std::abs(1.0 + Zf(f) * y_in);
    CHECK(RelErr(std::abs(EngineAt(s, f).e_n), expected) < test::kRelIdeal);
  }
  // At 100 kHz the plateau is reached to 1e-9 (its pole 1/(2 pi R_f C_f)).
  CHECK(RelErr(std::abs(EngineAt(s, 1e5).e_n), 1 + (kCs + kCin) / kCf) < 1e-6);
  const Budget b = test::ComputeOrFail(s, 1e-8);
  REQUIRE(b.charge);
  CHECK(RelErr(b.charge->noise_gain_plateau_estimate, 1 + (kCs + kCin) / kCf) <
        test::kRelTight);
  CHECK(RelErr(b.charge->input_capacitance_f, kCs + kCin) < test::kRelTight);
  // At DC C_s is open: 1 + R_f / R_leak.
  CHECK(RelErr(b.noise_gain_dc, 1 + kRf / kRleak) < test::kRelIdeal);
}

TEST_CASE(
    "the low corner of a charge amplifier is 1/(2 pi R_f C_f) and with a T "
    "network 1/(2 pi R_eq C_f) and the high one GBW / (1 + (C_s + C_in)/C_f)") {
  Stage s = ChargeAmp();
  s.band_high_hz = 100e3;
  Budget b = test::ComputeOrFail(s, 1e-6);
  REQUIRE(b.charge);
  const double fc = 1 / (2 * kPi * kRf * kCf);
  CHECK(RelErr(b.bandwidth_low_hz, fc) < test::kRelIdeal);
  CHECK(RelErr(b.charge->low_corner_estimate_hz, fc) < test::kRelTight);
  CHECK_FALSE(b.charge->feedback_is_tee);
  // The high corner is the op-amp's: GBW over the plateau noise gain
  // 1 + (C_s + C_in)/C_f (REFERENCES.md section 11, f_-3dB = GBW/NG + f_p;
  // f_p = 1 kHz is 1e-11 of it here).
  CHECK(RelErr(b.bandwidth_3db_hz, s.opamp.gbw_hz / (1 + (kCs + kCin) / kCf)) <
        test::kRelIdeal);

  // 1 M, 1 M, 1 k: R_eq = 1 M + 1 M + 1 G = 1.002 GOhm.
  s.feedback.kind = Feedback::Kind::kTee;
  s.feedback.tee = {1e6, 1e6, 1e3};
  const double req = 1e6 + 1e6 + 1e6 * 1e6 / 1e3;
  b = test::ComputeOrFail(s, 1e-6);
  REQUIRE(b.charge);
  CHECK(RelErr(b.bandwidth_low_hz, 1 / (2 * kPi * req * kCf)) <
        test::kRelIdeal);
  CHECK(RelErr(b.charge->feedback_dc_ohm, req) < test::kRelTight);
  CHECK(b.charge->feedback_is_tee);
}

TEST_CASE("every contributor of a charge amplifier matches nodal analysis") {
  const Stage s = ChargeAmp();
  const double four_kt = test::FourKT(kT);
  for (double f : {0.3, 3.0, 100.0, 1e3, 1e4}) {
    CAPTURE(f);
    const Transfers t = EngineAt(s, f);
    const double zf = std::abs(Zf(f));
    // Currents into the virtual ground: -i Z_f.
    CHECK(RelErr(OutputDensity(t, "R_leak"), std::sqrt(four_kt / kRleak) * zf) <
          test::kRelIdeal);
    CHECK(RelErr(OutputDensity(t, "R_f"), std::sqrt(four_kt / kRf) * zf) <
          test::kRelIdeal);
    CHECK(RelErr(OutputDensity(t, "i_n-"), 2e-15 * zf) < test::kRelIdeal);
    const cplx y_in = S(f) * (kCs + kCin) + 1.0 / kRleak;
    CHECK(RelErr(OutputDensity(t, "e_n"), 5e-9 * std::abs(1.0 + Zf(f) * y_in)) <
          test::kRelIdeal);
  }
  // Over the band: |Z_f|^2 integrates to R_f / (2 pi C_f) (atan(x_h) -
  // atan(x_l)), x = 2 pi f R_f C_f, so a current density i^2 gives
  // i^2 R_f (atan(x_h) - atan(x_l)) / (2 pi C_f).
  const Budget b = test::ComputeOrFail(s, 1e-10);
  const double x_l = 2 * kPi * 10 * kRf * kCf, x_h = 2 * kPi * 1e4 * kRf * kCf;
  const double band = kRf * (std::atan(x_h) - std::atan(x_l)) / (2 * kPi * kCf);
  CHECK(RelErr(FindContributor(b, "R_f").output_rms_v,
               std::sqrt(four_kt / kRf * band)) < test::kRelIdeal);
  CHECK(RelErr(FindContributor(b, "R_leak").output_rms_v,
               std::sqrt(four_kt / kRleak * band)) < test::kRelIdeal);
  CHECK(RelErr(FindContributor(b, "i_n-").output_rms_v,
               std::sqrt(4e-30 * band)) < test::kRelIdeal);
}

TEST_CASE(
    "every contributor of a charge amplifier with a T network matches "
    "nodal analysis") {
  // The summing node is a virtual ground (at e for e_n); unknowns v_t (the
  // tee node) and v_o:
  //   tee      v_t (1/R1 + 1/R2 + 1/R3) - v_o / R2 = j_t + e / R1
  //   summing  -v_t / R1 - v_o s C_f = j_s - e (Y_in + 1/R1 + s C_f)
  // with j_s, j_t currents injected at the summing and tee nodes.
  Stage s = ChargeAmp();
  s.feedback.kind = Feedback::Kind::kTee;
  const double r1 = 2e6, r2 = 1e6, r3 = 4.7e3;
  s.feedback.tee = {r1, r2, r3};
  const double four_kt = test::FourKT(kT);
  for (double f : {0.3, 3.0, 100.0, 1e3, 1e4}) {
    CAPTURE(f);
    const cplx sc = S(f) * kCf;
    const cplx y_in = S(f) * (kCs + kCin) + 1.0 / kRleak;
    auto vout = [&](cplx j_s, cplx j_t, cplx e) {
      // [g_t, -1/R2; -1/R1, -s C_f] [v_t; v_o] = [rhs_t; rhs_s]
      const cplx g_t = 1 / r1 + 1 / r2 + 1 / r3;
      const cplx rhs_t = j_t + e / r1;
      const cplx rhs_s = j_s - e * (y_in + 1 / r1 + sc);
      const cplx a = g_t, b = -1.0 / r2, c = -1.0 / r1, d = -sc;
      return (a * rhs_s - c * rhs_t) / (a * d - b * c);
    };
    const Transfers t = EngineAt(s, f);
    CHECK(RelErr(OutputDensity(t, "R1"),
                 std::sqrt(four_kt / r1) * std::abs(vout(-1.0, 1.0, 0.0))) <
          test::kRelIdeal);
    CHECK(RelErr(OutputDensity(t, "R3"),
                 std::sqrt(four_kt / r3) * std::abs(vout(0.0, 1.0, 0.0))) <
          test::kRelIdeal);
    // R2 ends at the output, which the ideal op-amp holds: only its tee
    // end counts.
    CHECK(RelErr(OutputDensity(t, "R2"),
                 std::sqrt(four_kt / r2) * std::abs(vout(0.0, 1.0, 0.0))) <
          test::kRelIdeal);
    CHECK(RelErr(OutputDensity(t, "R_leak"),
                 std::sqrt(four_kt / kRleak) * std::abs(vout(1.0, 0.0, 0.0))) <
          test::kRelIdeal);
    CHECK(RelErr(std::abs(t.e_n), std::abs(vout(0.0, 0.0, 1.0))) <
          test::kRelIdeal);
    // The signal: V_s drives s C_s into the virtual ground.
    CHECK(RelErr(std::abs(t.signal), std::abs(vout(S(f) * kCs, 0.0, 0.0))) <
          test::kRelIdeal);
  }
}

TEST_CASE(
    "the leakage resistance across the sensor capacitance integrates to kT/C "
    "at the sensor node") {
  // With R_in the sensor node x floats: C_s to the (AC-grounded) source,
  // R_leak to ground, R_in to the virtual ground. R_leak's current noise
  // 4kT/R_leak sees Z_x = R_p / (1 + s R_p C_s), R_p = R_leak || R_in, and
  // reaches the output through -R_f / R_in (no C_f: a flat feedback):
  //   integral of (4kT/R_leak) |Z_x|^2 df from f_l to f_h
  //     = (kT/C_s) (R_p / R_leak) (2/pi) (atan(f_h/f_c) - atan(f_l/f_c)),
  // f_c = 1/(2 pi R_p C_s); over 0..infinity it is kT/C_s shared between the
  // node's resistors in proportion to their conductance (REFERENCES.md
  // section 12, equipartition).
  const double r_leak = 100e6, r_in = 10e9, rf = 100e9;
  Stage s = test::InvertingStage(r_in, rf, test::IdealOpAmp(), kT);
  s.capacitive = CapacitiveSensor{kCs, r_leak};
  const double rp = r_leak * r_in / (r_leak + r_in);
  const double fc = 1 / (2 * kPi * rp * kCs);
  s.band_low_hz = 1e-4 * fc;
  s.band_high_hz = 1e5 * fc;
  s.reference_hz = 10 * fc;
  const Budget b = test::ComputeOrFail(s, 1e-10);
  const double at_node = FindContributor(b, "R_leak").output_rms_v * r_in / rf;
  const double kt_c = kBoltzmannJPerK * kT / kCs;
  const double band =
      2 / kPi *
      (std::atan(s.band_high_hz / fc) - std::atan(s.band_low_hz / fc));
  CHECK(RelErr(at_node * at_node, kt_c * rp / r_leak * band) < test::kRelIdeal);
  // The band covers the corner: kT/C_s (R_p / R_leak) within 1e-4, and
  // R_p / R_leak = 0.990 here; 1 nF at 300 K is 2.035 uV rms (section 12
  // lists 20.351 774 uV for 10 pF; sqrt(kT/C) scales as 1/sqrt(C)).
  CHECK(RelErr(at_node * at_node, kt_c * rp / r_leak) < 1e-4);
  CHECK(RelErr(std::sqrt(kt_c), 20.351774e-6 / 10) < 1e-7);
}

TEST_CASE(
    "a capacitive sensor's own noise passes with the signal gain exactly") {
  Stage s = ChargeAmp();
  s.sensor_noise = SensorNoise{30e-9, 10.0};
  for (double f : {0.5, 10.0, 1e3, 1e4}) {
    CAPTURE(f);
    const Transfers t = EngineAt(s, f);
    const double own = 30e-9 * std::sqrt(1 + 10.0 / f);
    CHECK(RelErr(OutputDensity(t, "sensor"), own * std::abs(t.signal)) <
          test::kRelTight);
    // And the signal transfer is s C_s Z_f (V/V from V_s).
    CHECK(RelErr(std::abs(t.signal), std::abs(S(f) * kCs * Zf(f))) <
          test::kRelIdeal);
  }
}

TEST_CASE(
    "input-referred charge is the input-referred voltage times C_s and the "
    "measurand divides it by the sensitivity") {
  Stage s = ChargeAmp();
  s.sensitivity = Sensitivity{10e-12, "g", true};  // 10 pC per g
  const Budget b = test::ComputeOrFail(s, 1e-8);
  REQUIRE(b.charge);
  CHECK(RelErr(b.charge->input_rms_c, b.input_rms * kCs) < 1e-12);
  CHECK(RelErr(b.charge->input_density_ref_c_per_rthz,
               b.input_density_ref_per_rthz * kCs) < 1e-12);
  REQUIRE(b.measurand);
  CHECK(b.measurand->sensitivity_unit == "C");
  CHECK(RelErr(b.measurand->input_referred_rms,
               b.charge->input_rms_c / 10e-12) < 1e-12);
  CHECK(RelErr(b.measurand->input_referred_density_at_reference,
               b.charge->input_density_ref_c_per_rthz / 10e-12) < 1e-12);
  // The same sensor stated in volts (10 pC / 1 nF = 10 mV per g) resolves
  // the same acceleration.
  s.sensitivity = Sensitivity{10e-12 / kCs, "g", false};
  const Budget v = test::ComputeOrFail(s, 1e-8);
  REQUIRE(v.measurand);
  CHECK(v.measurand->sensitivity_unit == "V");
  CHECK(RelErr(v.measurand->input_referred_rms,
               b.measurand->input_referred_rms) < 1e-12);
}

TEST_CASE("a charge amplifier without C_f is warned of as a differentiator") {
  // 1 kOhm with 1 nF: the loop's second pole at 159 kHz, below the 1 MHz
  // GBW, keeps some margin; a gigaohm R_f without C_f would oscillate.
  Stage s = ChargeAmp();
  s.capacitive->leakage_resistance_ohm = 0;
  s.feedback.resistor_ohm = 1e3;
  s.feedback.capacitor_f = 0;
  s.opamp.gbw_hz = 1e6;
  s.opamp.open_loop_gain = 1e5;
  ReviewOptions options;
  BudgetOutcome outcome = ReviewStage(s, options);
  REQUIRE(outcome.status.ok);
  bool found = false;
  for (const std::string& w : outcome.budget.warnings)
    if (w ==
        "no feedback capacitor: the sensor's capacitance drives the - input "
        "straight into the feedback resistance, so the stage differentiates "
        "its charge (gain rising with frequency) instead of measuring it; a "
        "charge amplifier needs C_f")
      found = true;
  CHECK(found);
}

}  // namespace
}  // namespace hushgain

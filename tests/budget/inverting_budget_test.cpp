// The budget of a plain inverting stage against closed forms (ideal op-amp,
// low frequency) and published values.
#include <doctest/doctest.h>

#include <cmath>

#include "budget/compute_budget.h"
#include "test_support.h"

namespace hushgain {
namespace {

using test::FindContributor;
using test::RelErr;

Budget Compute(const Stage& stage, double tolerance = 1e-6) {
  return test::ComputeOrFail(stage, tolerance);
}

// REFERENCES.md section 6, "simple example" (values chosen there, derived by
// nodal analysis; textbook-standard, e.g. Franco, Design with Operational
// Amplifiers and Analog ICs, 4th ed.): Rin = 2.2k, Rf = 330k, 300 K,
// e_n = 5 nV/rtHz, i_n = 0.5 pA/rtHz, Vos = 25 uV, Ib- = 1.0 nA, Ib+ = 0.9 nA.
Stage SimpleExample() {
  OpAmpModel m = test::IdealOpAmp(5e-9, 0.5e-12);
  m.vos_v = 25e-6;
  m.ib_a = 0.95e-9;  // Ib+ = Ib + Ios/2 = 0.9 nA, Ib- = Ib - Ios/2 = 1.0 nA
  m.ios_a = 0.1e-9;  // sign unknown; the example takes Ib- > Ib+
  return test::InvertingStage(2.2e3, 330e3, m, 300.0);
}

TEST_CASE("plain inverting stage: every contributor matches its closed form") {
  const Stage stage = SimpleExample();
  const Budget b = Compute(stage);
  const double rin = 2.2e3, rf = 330e3, kt4 = test::FourKT(300.0);
  const double ng = 1 + rf / rin;  // noise gain 1 + Rf/Rin
  // Output densities (V/rtHz): Rin -> sqrt(4kTRin) Rf/Rin; Rf -> sqrt(4kTRf);
  // e_n -> e_n NG; i_n- -> i_n Rf.
  const double rin_out = std::sqrt(kt4 * rin) * rf / rin;
  const double rf_out = std::sqrt(kt4 * rf);
  const double en_out = 5e-9 * ng;
  const double in_out = 0.5e-12 * rf;
  CHECK(RelErr(b.noise_gain_dc, ng) < test::kRelIdeal);
  CHECK(RelErr(b.signal_gain_dc, -rf / rin) < test::kRelIdeal);
  CHECK(RelErr(FindContributor(b, "R_in").output_density_ref_v_per_rthz,
               rin_out) < test::kRelIdeal);
  CHECK(RelErr(FindContributor(b, "R_f").output_density_ref_v_per_rthz,
               rf_out) < test::kRelIdeal);
  CHECK(RelErr(FindContributor(b, "e_n").output_density_ref_v_per_rthz,
               en_out) < test::kRelIdeal);
  CHECK(RelErr(FindContributor(b, "i_n-").output_density_ref_v_per_rthz,
               in_out) < test::kRelIdeal);
  const double rss = std::sqrt(rin_out * rin_out + rf_out * rf_out +
                               en_out * en_out + in_out * in_out);
  CHECK(RelErr(b.output_density_ref_v_per_rthz, rss) < test::kRelIdeal);

  // The published figures of section 6, nV/rtHz.
  CHECK(ng == 151.0);
  CHECK(RelErr(rin_out * 1e9, 905.597) < 1e-6);
  CHECK(RelErr(rf_out * 1e9, 73.942) < 1e-5);
  CHECK(RelErr(b.output_density_ref_v_per_rthz * 1e9, 1192.821) < 1e-6);

  // White noise over 0.1 .. 10 Hz: rms = density sqrt(9.9 Hz).
  CHECK(RelErr(b.output_rms_v, rss * std::sqrt(9.9)) < test::kRelIntegral);
  CHECK(RelErr(b.input_rms, rss * std::sqrt(9.9) / (rf / rin)) <
        test::kRelIntegral);
  CHECK(RelErr(b.output_peak_to_peak_v, 6.6 * b.output_rms_v) <
        test::kRelTight);
  double shares = 0;
  for (const Contributor& c : b.contributors) shares += c.share;
  CHECK(RelErr(shares, 1.0) < test::kRelTight);
  CHECK(RelErr(FindContributor(b, "e_n").share, en_out * en_out / (rss * rss)) <
        test::kRelIdeal);
}

TEST_CASE(
    "plain inverting stage: offsets Vos NG; Ib- Rf and the balance resistor") {
  // Vout = Vos NG + Ib- Rf - Ib+ Rp NG (REFERENCES.md section 6).
  const Stage stage = SimpleExample();
  const Budget b = Compute(stage);
  CHECK(RelErr(b.offset.vos_v, 25e-6 * 151) < test::kRelIdeal);
  CHECK(RelErr(b.offset.vos_v, 3.775e-3) < test::kRelIdeal);
  // With Rp = 0 only Ib- acts: Ib Rf (the Ib term) + (Ios/2) Rf (the Ios term).
  CHECK(RelErr(b.offset.ib_v, 0.95e-9 * 330e3) < test::kRelIdeal);
  CHECK(RelErr(b.offset.ios_v, 0.05e-9 * 330e3) < test::kRelIdeal);
  CHECK(RelErr(b.offset.vos_v + b.offset.ib_v + b.offset.ios_v,
               3.775e-3 + 0.33e-3) < test::kRelIdeal);
  CHECK(RelErr(b.offset.worst_case_v, 4.105e-3) < test::kRelIdeal);
  CHECK(RelErr(b.offset.rss_v,
               std::hypot(3.775e-3, std::hypot(0.3135e-3, 0.0165e-3))) <
        test::kRelIdeal);
  // Rp(balance) = Rin || Rf = 2185.43 ohm.
  CHECK(RelErr(b.offset.balance_resistor_ohm, 2.2e3 * 330e3 / 332.2e3) <
        test::kRelTight);
  CHECK(RelErr(b.offset.balance_resistor_ohm, 2185.43) < 1e-6);
}

TEST_CASE(
    "with R_plus at the balance value the Ib term cancels and Ios Rf remains") {
  Stage stage = SimpleExample();
  stage.plus_resistor.mode = PlusResistor::Mode::kAuto;
  const Budget b = Compute(stage);
  CHECK(b.offset.ib_v == 0.0);
  // Residual (Ios/2)(Rp NG + Rf) = Ios Rf at balance.
  CHECK(RelErr(b.offset.ios_v, 0.1e-9 * 330e3) < test::kRelIdeal);
  CHECK(RelErr(b.offset.plus_resistor_ohm, b.offset.balance_resistor_ohm) <
        test::kRelTight);
  // R_plus adds its thermal noise and i_n+ through the full noise gain.
  const double rp = 2.2e3 * 330e3 / 332.2e3;
  CHECK(RelErr(FindContributor(b, "R_plus").output_density_ref_v_per_rthz,
               std::sqrt(test::FourKT(300) * rp) * 151) < test::kRelIdeal);
  CHECK(RelErr(FindContributor(b, "i_n+").output_density_ref_v_per_rthz,
               0.5e-12 * rp * 151) < test::kRelIdeal);
}

TEST_CASE("the source resistance adds in series with R_in") {
  Stage stage = SimpleExample();
  stage.source.resistance_ohm = 350;
  const Budget b = Compute(stage);
  const double rin = 2.2e3 + 350;
  CHECK(RelErr(b.signal_gain_dc, -330e3 / rin) < test::kRelIdeal);
  CHECK(RelErr(FindContributor(b, "R_source").output_density_ref_v_per_rthz,
               std::sqrt(test::FourKT(300) * 350) * 330e3 / rin) <
        test::kRelIdeal);
  CHECK(RelErr(b.noise_gain_dc, 1 + 330e3 / rin) < test::kRelIdeal);
}

TEST_CASE(
    "e_n with a 1/f corner integrates to NG e_w sqrt(f_c ln(fH/fL) + fH - "
    "fL)") {
  // REFERENCES.md section 4, example B scaled by the noise gain: 0.1..10 Hz,
  // e_w = 10 nV/rtHz, f_c = 100 Hz gives 216.890 991 nV rms at the input.
  OpAmpModel m = test::IdealOpAmp(10e-9, 0);
  m.f_cv_hz = 100;
  const Stage stage = test::InvertingStage(1e3, 99e3, m, 300.0);
  const Budget b = Compute(stage, 1e-5);
  const double e_n_rms = FindContributor(b, "e_n").output_rms_v;
  CHECK(RelErr(e_n_rms, 100 * 10e-9 * std::sqrt(100 * std::log(100.0) + 9.9)) <
        test::kRelIntegral);
  CHECK(RelErr(e_n_rms / 100, 216.890991e-9) < test::kRelIntegral);
}

TEST_CASE("thermal noise of R_f with C_f integrates to kT/C_f") {
  // kT/C: integral of 4kTR/(1 + (2 pi f R C)^2) = kT/C (REFERENCES.md
  // section 12; equipartition). 300 K, 10 pF: 20.351 774 uV rms.
  OpAmpModel m = test::IdealOpAmp();
  Stage stage = test::InvertingStage(1e6, 1e6, m, 300.0);
  stage.feedback.capacitor_f = 10e-12;
  stage.band_low_hz = 1e-2;   // misses 4 R C f_low = 4e-7 of the total
  stage.band_high_hz = 1e12;  // misses (2/pi) f_c / f_high = 1e-8
  stage.reference_hz = 1.0;
  const Budget b = Compute(stage, 1e-7);
  const double rf_rms = FindContributor(b, "R_f").output_rms_v;
  CHECK(RelErr(rf_rms * rf_rms, kBoltzmannJPerK * 300.0 / 10e-12) <
        test::kRelIntegral);
  CHECK(RelErr(rf_rms, 20.351774e-6) < test::kRelIntegral);
}

TEST_CASE("finite GBW sets the -3 dB bandwidth at GBW/NG + f_p") {
  // REFERENCES.md section 11: A0 = 1e6, GBW = 10 MHz, Rf/Rin = 100 ->
  // 99 019.90 Hz (Sedra and Smith, Microelectronic Circuits, ch. 2).
  OpAmpModel m = test::IdealOpAmp();
  m.open_loop_gain = 1e6;
  m.gbw_hz = 1e7;
  const Stage stage = test::InvertingStage(1e3, 100e3, m, 300.0);
  const Budget b = Compute(stage);
  CHECK(RelErr(b.bandwidth_3db_hz, 99019.90) < 1e-6);
  CHECK(b.peaking_db == doctest::Approx(0.0).epsilon(1e-9));
}

TEST_CASE("a flat stage's input-referred rms is output rms over its gain") {
  // G = -R_f/R_in at every frequency (ideal op-amp): the integral of
  // S_out / |G|^2 is the output power over G^2.
  const Budget b = Compute(
      test::InvertingStage(1e3, 100e3, test::IdealOpAmp(5e-9), 300.0), 1e-7);
  CHECK(RelErr(b.input_rms, b.output_rms_v / 100.0) < 1e-6);
  CHECK(RelErr(b.input_rms, b.input_rms_at_reference_gain) < 1e-6);
}

TEST_CASE(
    "with a pole inside the band the input-referred rms is the integral") {
  // R_in 1k, R_f 100k, C_f 1.59 nF: f_c = 1/(2 pi R_f C_f) = 1 kHz inside
  // 0.1 Hz .. 10 kHz; ideal op-amp, e_n 5 nV white, 300 K. Referred to the
  // input through G(f) = -(R_f/R_in) / (1 + j f/f_c), each density is (a =
  // R_in/R_f; derived here):
  //   R_in: 4kT R_in;  R_f: 4kT R_f a^2;
  //   e_n: e_n^2 |1 + 1/G|^2 = e_n^2 ((1 + a)^2 + a^2 (f/f_c)^2),
  // so over f1..f2 the input power is
  //   (4kT R_in + 4kT R_f a^2 + e_n^2 (1 + a)^2) (f2 - f1)
  //     + e_n^2 a^2 (f2^3 - f1^3) / (3 f_c^2).
  const double rin = 1e3, rf = 100e3, fc = 1e3, en = 5e-9;
  const double cf = 1 / (2 * kPi * rf * fc), a = rin / rf;
  const double f1 = 0.1, f2 = 10e3, four_kt = test::FourKT(300.0);
  Stage stage = test::InvertingStage(rin, rf, test::IdealOpAmp(en), 300.0);
  stage.feedback.capacitor_f = cf;
  stage.band_low_hz = f1;
  stage.band_high_hz = f2;
  stage.reference_hz = 10.0;
  const double power =
      (four_kt * rin + four_kt * rf * a * a + en * en * (1 + a) * (1 + a)) *
          (f2 - f1) +
      en * en * a * a * (f2 * f2 * f2 - f1 * f1 * f1) / (3 * fc * fc);
  const Budget b = Compute(stage, 1e-7);
  CHECK(RelErr(b.input_rms, std::sqrt(power)) < 1e-6);
  // The old definition, output rms / |G(10 Hz)|, is far below it: the
  // output rolls off above 1 kHz while the input-referred noise does not.
  CHECK(b.input_rms_at_reference_gain < 0.5 * b.input_rms);
}

TEST_CASE("a single-pole stage's e_n noise gain is flat: no peak above DC") {
  // NG(s) = NG0 / (1 + s NG0 / w_t) for A(s) = A0 / (1 + s A0 / w_t):
  // |NG| falls monotonically from DC (Sedra and Smith, ch. 2), so there is
  // no peak to report; before, the "peak" was the reference's value.
  OpAmpModel m = test::IdealOpAmp();
  m.open_loop_gain = 1e6;
  m.gbw_hz = 1e7;
  const Budget b = Compute(test::InvertingStage(1e3, 100e3, m, 300.0));
  CHECK(b.noise_gain_flat);
  CHECK(b.noise_gain_peak == b.noise_gain_dc);
  CHECK(b.noise_gain_peak_hz == 0);
  const double ng0 = 101.0 / (1 + 101.0 / 1e6);
  CHECK(RelErr(b.noise_gain_dc, ng0) < test::kRelTight);
}

TEST_CASE(
    "the full-scale swing gives SNR of a sine and the p-p dynamic range") {
  Stage stage = SimpleExample();
  stage.full_scale_output_v = 4.0;
  const Budget b = Compute(stage);
  REQUIRE(b.snr_db.has_value());
  CHECK(RelErr(*b.snr_db, 20 * std::log10(4.0 / std::sqrt(2.0) /
                                          b.output_rms_v)) < test::kRelTight);
  CHECK(RelErr(*b.dynamic_range_db,
               20 * std::log10(8.0 / (6.6 * b.output_rms_v))) <
        test::kRelTight);
}

}  // namespace
}  // namespace hushgain

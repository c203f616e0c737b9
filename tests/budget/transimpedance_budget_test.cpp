// Photodiode transimpedance stages against REFERENCES.md section 7 (all of it
// derived there and checked by evaluating the full loop numerically; the
// mechanisms are the textbook ones: J. G. Graeme, Photodiode Amplifiers,
// McGraw-Hill 1996; P. C. D. Hobbs, Building Electro-Optical Systems, 2nd
// ed., Wiley 2009, ch. 18).
#include <doctest/doctest.h>

#include <cmath>
#include <complex>
#include <tuple>

#include "budget/compute_budget.h"
#include "budget/feedback_capacitor.h"
#include "circuit/expand_stage.h"
#include "circuit/stage_at_temperature.h"
#include "noise/spectrum_evaluator.h"
#include "test_support.h"

namespace hushgain {
namespace {

using test::FindContributor;
using test::RelErr;

constexpr double kRf = 10e6, kCd = 47e-12, kCin = 3e-12, kGbw = 10e6;
constexpr double kC = kCd + kCin;

// The section 7 worked example: A(s) ~ w_t / s (A0 = 1e9 here), 300 K.
Stage WorkedExample(double cf) {
  Stage s;
  s.name = "section 7 example";
  s.temperature_k = 300;
  s.band_low_hz = 1e-3;
  s.band_high_hz = 1e10;
  s.reference_hz = 1e3;
  s.topology = Topology::kTransimpedance;
  s.photodiode.capacitance_f = kCd;
  // 100 pA flowing at 300 K: the value at 25 °C under the default doubling
  // law (circuit/stage_at_temperature.h), and a reverse bias so it flows.
  s.photodiode.dark_current_a =
      100e-12 / PhotodiodeTemperatureFactor(s.photodiode, 300);
  s.photodiode.reverse_bias_v = 5;
  s.photodiode.responsivity_a_per_w = 0.5;
  s.opamp = test::IdealOpAmp(10e-9, 1e-15);
  s.opamp.open_loop_gain = 1e9;
  s.opamp.gbw_hz = kGbw;
  s.opamp.c_cm_f = kCin;
  s.feedback.resistor_ohm = kRf;
  s.feedback.capacitor_f = cf;
  return s;
}

Budget Compute(const Stage& stage, double tolerance = 1e-5) {
  return test::ComputeOrFail(stage, tolerance);
}

// Butterworth (Q = 1/sqrt 2): C_f = sqrt(2 w_t R_f C - 1) / (w_t R_f), exact.
double ButterworthCf() {
  const double wt = 2 * kPi * kGbw;
  return std::sqrt(2 * wt * kRf * kC - 1) / (wt * kRf);
}

TEST_CASE(
    "the e_n noise gain is 1 + Z_f s C and tends to 1 + C/C_f at high "
    "frequency") {
  // 1/beta = (1 + s R_f (C + C_f)) / (1 + s R_f C_f), an ideal op-amp.
  Stage stage = WorkedExample(0.4e-12);
  stage.opamp = test::IdealOpAmp(10e-9, 0);
  stage.opamp.c_cm_f = kCin;
  const Netlist net = ExpandStage(stage);
  SpectrumEvaluator ev;
  REQUIRE(SpectrumEvaluator::Create(net, 300, &ev).ok);
  const Port e_n = ev.Compile(Excitation{OpAmpInputVoltage{0}});
  const double cf = 0.4e-12;
  for (double f : {10.0, 1e3, 1e5, 1e6}) {
    REQUIRE(ev.SolveAt(f).ok);
    const std::complex<double> s(0, 2 * kPi * f);
    const double expected =
        std::abs((1.0 + s * kRf * (kC + cf)) / (1.0 + s * kRf * cf));
    CAPTURE(f);
    CHECK(RelErr(std::abs(ev.Transfer(e_n)), expected) < test::kRelIdeal);
  }
  const double fp = 1 / (2 * kPi * kRf * cf);
  REQUIRE(ev.SolveAt(1e3 * fp).ok);
  CHECK(RelErr(std::abs(ev.Transfer(e_n)), 1 + kC / cf) <
        1e-5);  // (fp/f)^2 short of the limit
}

TEST_CASE(
    "transimpedance at low frequency equals R_f; or the tee's equivalent") {
  Stage stage = WorkedExample(0.4e-12);
  stage.opamp = test::IdealOpAmp(10e-9, 0);
  CHECK(RelErr(Compute(stage).signal_gain_dc, -kRf) < test::kRelIdeal);
  stage.feedback.kind = Feedback::Kind::kTee;
  stage.feedback.tee = {100e3, 100e3, 1e3};
  const Budget tee = Compute(stage);
  CHECK(RelErr(tee.signal_gain_dc, -(200e3 + 1e10 / 1e3)) < test::kRelIdeal);
  CHECK(tee.input_unit == "A");
}

TEST_CASE(
    "the Butterworth C_f found on the response matches the exact closed form") {
  // Section 7: C_f = 0.398 939 pF, Q = 0.707 11, PM 65.59 deg, f_3dB =
  // sqrt(GBW / (2 pi R_f (C + C_f))) = 56 195.2 Hz.
  CHECK(RelErr(ButterworthCf(), 0.398939e-12) < 1e-5);
  Stage stage = WorkedExample(0);
  stage.capacitor_target =
      CapacitorTarget{CapacitorTarget::Kind::kButterworth, 0};
  const Budget b = Compute(stage, 1e-4);
  REQUIRE(b.capacitor_choice.has_value());
  CHECK(RelErr(b.capacitor_choice->chosen_f, ButterworthCf()) < 0.01);
  CHECK(RelErr(b.feedback_capacitor_f, b.capacitor_choice->chosen_f) <
        test::kRelTight);
  // The textbook estimate sqrt(C / (pi R_f GBW)) sits beside it.
  CHECK(RelErr(b.capacitor_choice->estimate_f,
               std::sqrt(kC / (kPi * kRf * kGbw))) < test::kRelTight);
  const double f0 = std::sqrt(kGbw / (2 * kPi * kRf * (kC + ButterworthCf())));
  CHECK(RelErr(f0, 56195.2) < 1e-5);
  CHECK(RelErr(b.bandwidth_3db_hz, f0) < 0.01);
  CHECK(b.loop.phase_margin_deg == doctest::Approx(65.59).epsilon(0.005));
  CHECK(b.peaking_db < 0.01);
}

TEST_CASE("a phase-margin C_f is the smallest that meets the target") {
  // 60 deg over photodiodes of 10 pF .. 10 nF on 100 kohm, with and without
  // 100 ohm of output resistance (which makes the margin non-monotonic in
  // C_f). Before, a bisection over the whole range refused the 1 nF case
  // ("at most 31.59 deg") though larger C_f meet it.
  for (double cd : {10e-12, 100e-12, 1e-9, 10e-9})
    for (double rout : {0.0, 100.0}) {
      CAPTURE(cd);
      CAPTURE(rout);
      Stage stage = WorkedExample(0);
      stage.photodiode.capacitance_f = cd;
      stage.feedback.resistor_ohm = 100e3;
      stage.opamp.output_resistance_ohm = rout;
      const CapacitorOutcome cap = ChooseFeedbackCapacitor(
          stage, CapacitorTarget{CapacitorTarget::Kind::kPhaseMargin, 60});
      REQUIRE_MESSAGE(cap.status.ok, cap.status.message);
      REQUIRE(cap.choice.chosen_f > 0);
      auto margin = [&](double cf) {
        Stage s = stage;
        s.feedback.capacitor_f = cf;
        const StageLoop loop = ComputeStageLoop(s);
        REQUIRE(loop.status.ok);
        return loop.loop.crossover_found ? loop.loop.phase_margin_deg : 180.0;
      };
      CHECK(margin(cap.choice.chosen_f) >= 60 - 1e-3);
      CHECK(margin(0.95 * cap.choice.chosen_f) < 60);
    }
}

TEST_CASE("bandwidth, peaking and DC gain do not move with the band") {
  // The 52-degree C_f of section 7 (1.217 dB of peaking, f_3dB 71 383 Hz):
  // the same stage asked about a wide band, a narrow band below the corner
  // and a band whose reference sits on its own roll-off. Before, the
  // -3 dB point was measured against the gain at the reference.
  const Budget wide = Compute(WorkedExample(0.282892e-12), 1e-4);
  for (const auto& [low, high, ref] :
       {std::tuple{10.0, 5e3, 200.0}, std::tuple{100e3, 1e6, 316e3},
        std::tuple{1e3, 200e3, 60e3}}) {
    CAPTURE(ref);
    Stage stage = WorkedExample(0.282892e-12);
    stage.band_low_hz = low;
    stage.band_high_hz = high;
    stage.reference_hz = ref;
    const Budget b = Compute(stage, 1e-4);
    CHECK(RelErr(b.bandwidth_3db_hz, wide.bandwidth_3db_hz) < 1e-6);
    CHECK(std::fabs(b.peaking_db - wide.peaking_db) < 1e-6);
    CHECK(RelErr(b.signal_gain_dc, wide.signal_gain_dc) < 1e-6);
    CHECK(RelErr(b.passband_gain, wide.passband_gain) < 1e-6);
  }
  CHECK(RelErr(wide.bandwidth_3db_hz, 71383) < 2e-3);
  CHECK(wide.peaking_db == doctest::Approx(1.217).epsilon(0.01));
}

TEST_CASE("the e_n noise gain's peak is its true maximum over frequency") {
  // Section 7 loop with the 52-degree C_f: NG(s) = (1/beta) / (1 + 1/(A
  // beta)), 1/beta = 1 + Z_f s C, Z_f = R_f / (1 + s R_f C_f), A(s) = A0 /
  // (1 + s A0 / w_t); its maximum found here by a dense scan (5e4 points a
  // decade, so the magnitude there is exact to ~1e-9).
  const double cf = 0.282892e-12, a0 = 1e9, wt = 2 * kPi * kGbw;
  auto ng = [&](double f) {
    const std::complex<double> s(0, 2 * kPi * f);
    const std::complex<double> zf = kRf / (1.0 + s * kRf * cf);
    const std::complex<double> inv_beta = 1.0 + zf * s * kC;
    const std::complex<double> a = a0 / (1.0 + s * a0 / wt);
    return std::abs(inv_beta / (1.0 + inv_beta / a));
  };
  double best = 0, best_hz = 0;
  for (int i = 0; i <= 200000; ++i) {
    const double f = 1e4 * std::pow(10.0, 4.0 * i / 200000);
    if (ng(f) > best) {
      best = ng(f);
      best_hz = f;
    }
  }
  const Budget b = Compute(WorkedExample(cf), 1e-4);
  CHECK_FALSE(b.noise_gain_flat);
  CHECK(RelErr(b.noise_gain_peak, best) < 1e-6);
  CHECK(RelErr(b.noise_gain_peak_hz, best_hz) < 1e-3);
}

TEST_CASE(
    "the classic C_f = sqrt(C / (2 pi R_f GBW)) gives about 52 degrees and 1.2 "
    "dB; not 45") {
  // Section 7, "45 deg" choice: exact C_f = 0.282 892 pF gives Q 0.9944,
  // 1.217 dB of peaking, a true phase margin of 52.08 deg, f_3dB 71 383 Hz.
  const Budget exact = Compute(WorkedExample(0.282892e-12), 1e-4);
  CHECK(exact.loop.phase_margin_deg == doctest::Approx(52.08).epsilon(0.002));
  CHECK(exact.peaking_db == doctest::Approx(1.217).epsilon(0.01));
  CHECK(RelErr(exact.bandwidth_3db_hz, 71383) < 2e-3);
  const Budget classic =
      Compute(WorkedExample(std::sqrt(kC / (2 * kPi * kRf * kGbw))), 1e-4);
  CHECK(classic.loop.phase_margin_deg > 51.0);
  CHECK(classic.loop.phase_margin_deg < 53.0);
  CHECK(classic.peaking_db > 1.1);
  CHECK(classic.peaking_db < 1.35);
}

TEST_CASE(
    "the section 7 Butterworth budget: R_f; e_n; i_n and shot noise rms") {
  // 1 mHz .. 10 GHz, rms at the output: R_f 101.691, e_n 444.589, i_n 2.498,
  // shot 14.142, total 456.297 uV. A0 = 1e9 stands in for the ideal
  // integrator of the derivation: 0.5 % allowed.
  const Budget b = Compute(WorkedExample(ButterworthCf()), 1e-5);
  CHECK(RelErr(FindContributor(b, "R_f").output_rms_v, 101.691e-6) < 5e-3);
  CHECK(RelErr(FindContributor(b, "e_n").output_rms_v, 444.589e-6) < 5e-3);
  CHECK(RelErr(FindContributor(b, "i_n-").output_rms_v, 2.498e-6) < 5e-3);
  CHECK(RelErr(FindContributor(b, "I_dark").output_rms_v, 14.142e-6) < 5e-3);
  CHECK(RelErr(b.output_rms_v, 456.297e-6) < 5e-3);
  // The e_n plateau: 1 + C/C_f = 126.33.
  REQUIRE(b.photodiode.has_value());
  CHECK(RelErr(b.photodiode->noise_gain_plateau_estimate, 126.33) < 1e-4);
}

TEST_CASE(
    "R_f with C_f integrates to kT/C_f at the output (ideal op-amp; C_d = 0)") {
  // REFERENCES.md section 12: kT/C; 300 K and 1 pF: 64.357 960 uV rms.
  Stage stage = WorkedExample(1e-12);
  stage.photodiode.capacitance_f = 0;
  stage.photodiode.dark_current_a = 0;
  stage.opamp = test::IdealOpAmp();
  stage.band_low_hz = 1e-3;  // misses 4 R C f_low = 4e-8
  stage.band_high_hz = 1e12;
  const Budget b = Compute(stage, 1e-7);
  const double rf_rms = FindContributor(b, "R_f").output_rms_v;
  CHECK(RelErr(rf_rms * rf_rms, kBoltzmannJPerK * 300 / 1e-12) < 1e-4);
  CHECK(RelErr(rf_rms, 64.357960e-6) < 1e-4);
}

TEST_CASE(
    "dark-current shot noise is sqrt(2 q I) at the input and NEP is i_n;in / "
    "R") {
  // Schottky 1918; REFERENCES.md section 2: 100 pA -> 5.660 701 fA/rtHz.
  const Budget b = Compute(WorkedExample(ButterworthCf()), 1e-4);
  const Contributor& shot = FindContributor(b, "I_dark");
  CHECK(shot.kind == NoiseKind::kShot);
  CHECK(RelErr(shot.source_density_ref,
               std::sqrt(2 * kElementaryChargeC * 100e-12)) < test::kRelTight);
  CHECK(RelErr(shot.source_density_ref * 1e15, 5.660701) < 1e-6);
  CHECK(RelErr(shot.output_density_ref_v_per_rthz / b.signal_gain_ref,
               shot.source_density_ref) < 1e-6);
  REQUIRE(b.photodiode.has_value());
  CHECK(RelErr(b.photodiode->nep_w_per_rthz,
               b.input_density_ref_per_rthz / 0.5) < test::kRelTight);
  CHECK(RelErr(b.photodiode->nep_rms_w, b.input_rms / 0.5) < test::kRelTight);
  // The dark current's DC output: I_dark times the DC transimpedance.
  CHECK(RelErr(b.offset.dark_v, 100e-12 * b.signal_gain_dc) < test::kRelTight);
  CHECK(RelErr(b.offset.dark_v, -1e-3) < 1e-6);
}

TEST_CASE(
    "no C_f with a large C_d: margin below 20 degrees and a severe warning") {
  // Two poles in the loop (the op-amp's and R_f (C_d + C_in)): an
  // uncompensated TIA is close to oscillation (Graeme 1996, stability).
  Stage stage = WorkedExample(0);
  stage.photodiode.capacitance_f = 100e-12;
  stage.band_high_hz = 1e5;
  const Budget b = Compute(stage, 1e-4);
  REQUIRE(b.loop.crossover_found);
  CHECK(b.loop.phase_margin_deg < 20);
  CHECK(b.loop.phase_margin_deg > 0);
  bool warned = false;
  for (const std::string& w : b.warnings)
    warned = warned || w.rfind("severe: phase margin", 0) == 0;
  CHECK(warned);
}

TEST_CASE("a C_f chosen for a 60 degree margin meets it within 2 degrees") {
  Stage stage = WorkedExample(0);
  stage.photodiode.capacitance_f = 100e-12;
  stage.band_high_hz = 1e5;
  stage.capacitor_target =
      CapacitorTarget{CapacitorTarget::Kind::kPhaseMargin, 60.0};
  const Budget b = Compute(stage, 1e-4);
  CHECK(b.loop.phase_margin_deg == doctest::Approx(60.0).epsilon(2.0 / 60));
  for (const std::string& w : b.warnings)
    CHECK(w.find("phase margin") == std::string::npos);
}

}  // namespace
}  // namespace hushgain

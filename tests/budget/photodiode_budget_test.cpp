// A photodiode receiver as built: its average photocurrent's shot noise and
// DC output, the bias mode (the dark current flows only under reverse bias;
// at zero bias the junction's noise is the thermal noise of R_sh), the bias
// supply's noise, the series resistance and the temperature law of the dark
// current and R_sh. Every expected value is built here from a closed form
// whose source is named beside it.
#include <doctest/doctest.h>

#include <cmath>
#include <complex>
#include <string>

#include "base/physical_constants.h"
#include "budget/compute_budget.h"
#include "circuit/expand_stage.h"
#include "circuit/stage_at_temperature.h"
#include "noise/spectrum_evaluator.h"
#include "test_support.h"

namespace hushgain {
namespace {

using test::FindContributor;
using test::RelErr;

constexpr double kRf = 10e6, kCf = 1e-12, kCd = 100e-12, kRsh = 1e9;

// A transimpedance stage on an ideal op-amp (A0 = 1e12) at 25 °C, where the
// dark current and R_sh are as given.
Stage Receiver() {
  return test::ReceiverStage(test::IdealOpAmp(10e-9, 1e-15), kCd, kRsh, kRf,
                             kCf);
}

// The output density of the source named `name`, and |Z_t| (the signal's
// transfer), at f; fails the test when the source is missing.
struct Seen {
  double density = 0;
  double transimpedance = 0;
};
Seen OutputDensity(const Stage& stage, const std::string& name, double f) {
  const Netlist net = ExpandStage(stage);
  SpectrumEvaluator ev;
  REQUIRE(SpectrumEvaluator::Create(net, stage.temperature_k, &ev).ok);
  std::vector<double> psd(ev.source_count());
  REQUIRE(ev.Densities(f, psd.data()).ok);
  for (int k = 0; k < ev.source_count(); ++k)
    if (ev.sources()[k].name == name)
      return {std::sqrt(psd[k]), std::abs(ev.Transfer(ev.Compile(net.signal)))};
  FAIL("no source " << name);
  return {};
}

bool HasContributor(const Budget& b, const std::string& name) {
  for (const Contributor& c : b.contributors)
    if (c.name == name) return true;
  return false;
}

const DcOutputTerm* FindDcOutput(const Budget& b, const std::string& name) {
  for (const DcOutputTerm& t : b.dc_outputs)
    if (t.name == name) return &t;
  return nullptr;
}

TEST_CASE(
    "the photocurrent's shot noise is sqrt(2 q I_ph) |Z_t(f)| at every "
    "frequency and equals the dark current's with the same current") {
  // Schottky 1918 (REFERENCES.md section 2): i = sqrt(2 q I), white; it
  // enters where the signal does, so it reaches the output through Z_t.
  constexpr double kI = 400e-9;
  Stage lit = Receiver();
  lit.photodiode.photocurrent_a = kI;
  Stage dark = Receiver();
  dark.photodiode.reverse_bias_v = 5;
  dark.photodiode.dark_current_a = kI;
  for (double f : {1.0, 100.0, 10e3, 1e6}) {
    CAPTURE(f);
    const Seen ph = OutputDensity(lit, "I_ph", f);
    CHECK(RelErr(ph.density, std::sqrt(2 * kElementaryChargeC * kI) *
                                 ph.transimpedance) < test::kRelTight);
    CHECK(RelErr(ph.density, OutputDensity(dark, "I_dark", f).density) <
          test::kRelTight);
  }
  // The numbers: 400 nA gives 358 fA/rtHz (section 2: 1 uA ->
  // 566.07 fA/rtHz, scaled by sqrt 0.4).
  CHECK(std::sqrt(2 * kElementaryChargeC * kI) ==
        doctest::Approx(566.07007e-15 * std::sqrt(0.4)).epsilon(1e-7));
  const Budget b = test::ComputeOrFail(lit, 1e-6);
  const Contributor& c = FindContributor(b, "I_ph");
  CHECK(c.kind == NoiseKind::kShot);
  CHECK(RelErr(c.source_density_ref, std::sqrt(2 * kElementaryChargeC * kI)) <
        test::kRelTight);
}

TEST_CASE(
    "the photocurrent's DC output is I_ph times the DC transimpedance and is "
    "no offset") {
  // Ideal op-amp: a virtual ground at the - input, so every photo-ampere
  // flows through R_f: V = -I_ph R_f (REFERENCES.md section 7 at DC).
  Stage s = Receiver();
  s.photodiode.photocurrent_a = 1e-6;
  const Budget b = test::ComputeOrFail(s, 1e-6);
  const DcOutputTerm* ph = FindDcOutput(b, "I_ph");
  REQUIRE(ph != nullptr);
  CHECK(RelErr(ph->volts, -1e-6 * kRf) < test::kRelIdeal);
  CHECK(b.offset.dark_v == 0);
  CHECK(FindDcOutput(b, "I_dark") == nullptr);
  REQUIRE(b.photodiode.has_value());
  CHECK(b.photodiode->photocurrent_a == 1e-6);
}

TEST_CASE(
    "zero bias: no dark-current contributor or DC term; reverse bias: both") {
  Stage s = Receiver();
  s.photodiode.dark_current_a = 1e-9;
  const Budget zero = test::ComputeOrFail(s, 1e-6);
  CHECK_FALSE(HasContributor(zero, "I_dark"));
  CHECK(zero.offset.dark_v == 0);
  CHECK(FindDcOutput(zero, "I_dark") == nullptr);
  CHECK(zero.photodiode->dark_current_a == 0);
  bool warned = false;
  for (const std::string& w : zero.warnings)
    warned =
        warned || w.find("dark current is not counted") != std::string::npos;
  CHECK(warned);

  s.photodiode.reverse_bias_v = 5;
  const Budget reverse = test::ComputeOrFail(s, 1e-6);
  // Shot noise of 1 nA: 17.900 707 fA/rtHz (REFERENCES.md section 2) at the
  // output through Z_t at the reference frequency.
  const Contributor& c = FindContributor(reverse, "I_dark");
  CHECK(c.source_density_ref == doctest::Approx(17.900707e-15).epsilon(1e-7));
  CHECK(RelErr(c.output_density_ref_v_per_rthz,
               17.900707e-15 * reverse.signal_gain_ref) < 1e-7);
  // DC: I_dark R_f through the virtual ground, signed like the signal.
  CHECK(RelErr(reverse.offset.dark_v, -1e-9 * kRf) < test::kRelIdeal);
  const DcOutputTerm* term = FindDcOutput(reverse, "I_dark");
  REQUIRE(term != nullptr);
  CHECK(term->volts == reverse.offset.dark_v);
}

TEST_CASE(
    "at zero bias the thermal noise of R_sh equals the junction's 4 q I_s "
    "when R_sh = V_T / I_s") {
  // A diode I = I_s (exp(V/V_T) - 1) at V = 0 carries two opposite currents
  // I_s, each with shot noise 2 q I_s (Schottky 1918): 4 q I_s in all. Its
  // small-signal conductance there is dI/dV = I_s / V_T, so R_sh = V_T / I_s
  // and 4kT / R_sh = 4 kT I_s q / (kT) = 4 q I_s (V_T = kT/q). Derived here.
  constexpr double kIs = 2e-12;
  Stage s = Receiver();
  const double vt = kBoltzmannJPerK * s.temperature_k / kElementaryChargeC;
  s.photodiode.shunt_resistance_ohm = vt / kIs;
  for (double f : {1.0, 1e3}) {
    const Seen r = OutputDensity(s, "R_sh", f);
    CHECK(RelErr(r.density, std::sqrt(4 * kElementaryChargeC * kIs) *
                                r.transimpedance) < test::kRelTight);
  }
}

TEST_CASE(
    "the series resistance puts a zero in the noise gain: 1 + Z_f / (R_s + "
    "Z_d)") {
  // Ideal op-amp, e_n in series with the + input: the noise gain is
  // 1 + Z_f / Z_in with Z_in the impedance from the - input to ground,
  // here R_s + (R_sh || 1/(s C_d)) (the op-amp's pins add no capacitance).
  // At high frequency it levels at 1 + Z_f / R_s instead of rising with C_d
  // (the zero at 1 / (2 pi R_s C_d) = 31.8 MHz here). At 100 MHz the ideal
  // op-amp's gain GBW / f = 1e7 against a noise gain of 33 leaves 3e-6.
  // R_s's own thermal voltage sqrt(4kT R_s) and the bias supply's noise e_b
  // sit in series with the diode: each reaches the output as Z_f / Z_in.
  constexpr double kRs = 50, kEb = 20e-9;
  Stage s = Receiver();
  s.opamp = test::IdealOpAmp(10e-9, 0);
  s.photodiode.series_resistance_ohm = kRs;
  s.photodiode.reverse_bias_v = 10;
  s.photodiode.bias_noise_v_per_rthz = kEb;
  const Netlist net = ExpandStage(s);
  SpectrumEvaluator ev;
  REQUIRE(SpectrumEvaluator::Create(net, 300, &ev).ok);
  std::vector<double> psd(ev.source_count());
  auto index = [&](const std::string& name) {
    for (int k = 0; k < ev.source_count(); ++k)
      if (ev.sources()[k].name == name) return k;
    FAIL("no source " << name);
    return -1;
  };
  const int en = index("e_n"), rs = index("R_s"), vb = index("V_bias");
  CHECK(ev.sources()[vb].kind == NoiseKind::kSupply);
  for (double f : {10.0, 1e4, 1e6, 1e8}) {
    CAPTURE(f);
    REQUIRE(ev.Densities(f, psd.data()).ok);
    const std::complex<double> jw(0, 2 * kPi * f);
    const std::complex<double> zf = kRf / (1.0 + jw * kRf * kCf);
    const std::complex<double> zd = 1.0 / (1.0 / kRsh + jw * kCd);
    const std::complex<double> zin = kRs + zd;
    constexpr double kRelFiniteGain = 1e-5;
    CHECK(RelErr(std::sqrt(psd[en]), 10e-9 * std::abs(1.0 + zf / zin)) <
          kRelFiniteGain);
    CHECK(RelErr(std::sqrt(psd[rs]), std::sqrt(test::FourKT(300) * kRs) *
                                         std::abs(zf / zin)) < kRelFiniteGain);
    CHECK(RelErr(std::sqrt(psd[vb]), kEb * std::abs(zf / zin)) <
          kRelFiniteGain);
  }
  // The + input's balance resistance is the DC resistance at the - input:
  // (R_s + R_sh) || R_f.
  const double diode = kRs + kRsh;
  CHECK(RelErr(BalanceResistorOhm(s), diode * kRf / (diode + kRf)) <
        test::kRelTight);
}

TEST_CASE(
    "the dark current doubles and R_sh halves every doubling interval from "
    "25 C") {
  // Common practice, no source: silicon photodiodes' dark current doubles
  // about every 8 to 10 degC and R_sh halves about as often.
  Stage s = Receiver();
  s.photodiode.reverse_bias_v = 5;
  s.photodiode.dark_current_a = 1e-9;
  s.photodiode.doubling_interval_k = 8;
  const Stage hot = StageAtTemperature(s, kDeviceReferenceK + 24);
  CHECK(RelErr(hot.photodiode.dark_current_a, 8e-9) < test::kRelTight);
  CHECK(RelErr(hot.photodiode.shunt_resistance_ohm, kRsh / 8) <
        test::kRelTight);
  const Stage cold = StageAtTemperature(s, kDeviceReferenceK - 8);
  CHECK(RelErr(cold.photodiode.dark_current_a, 0.5e-9) < test::kRelTight);
  CHECK(RelErr(cold.photodiode.shunt_resistance_ohm, 2 * kRsh) <
        test::kRelTight);
  // The budget at 45 C (default interval 10 C: x4) sees both.
  s.photodiode.doubling_interval_k = 10;
  s.temperature_k = kDeviceReferenceK + 20;
  const Budget b = test::ComputeOrFail(s, 1e-6);
  CHECK(RelErr(b.offset.dark_v, -4e-9 * kRf) < test::kRelIdeal);
  CHECK(RelErr(b.photodiode->shunt_resistance_ohm, kRsh / 4) < test::kRelTight);
  CHECK(RelErr(FindContributor(b, "R_sh").source_density_ref,
               std::sqrt(test::FourKT(s.temperature_k) * kRsh / 4)) <
        test::kRelTight);
}

TEST_CASE(
    "a T network in a photodiode stage reports its noise-equivalent "
    "resistance: 102 MOhm as a T is as noisy as about 1 MOhm") {
  // R1 = R2 = 1 M, R3 = 10 k: Req = R1 + R2 + R1 R2 / R3 = 102 M (Kennelly
  // 1899). R_n = Req^2 / (R1 (1 + R2/R3)^2 + R2 + R3 (R2/R3)^2)
  // (REFERENCES.md section 6 noise gains) = 1.0099 M, computed here.
  constexpr double kR1 = 1e6, kR2 = 1e6, kR3 = 10e3;
  const double req = kR1 + kR2 + kR1 * kR2 / kR3;
  const double k = kR2 / kR3;
  const double rn = req * req / (kR1 * (1 + k) * (1 + k) + kR2 + kR3 * k * k);
  CHECK(req == doctest::Approx(102e6));
  CHECK(rn == doctest::Approx(1.0099e6).epsilon(1e-4));
  Stage s = Receiver();
  s.opamp = test::IdealOpAmp(0, 0);
  s.feedback.kind = Feedback::Kind::kTee;
  s.feedback.tee = {kR1, kR2, kR3};
  s.feedback.capacitor_f = 0;
  s.photodiode.shunt_resistance_ohm = 0;
  const Budget b = test::ComputeOrFail(s, 1e-8);
  REQUIRE(b.photodiode.has_value());
  CHECK(RelErr(b.photodiode->tee_noise_equivalent_ohm, rn) < test::kRelTight);
  // The T's three resistors together make the output noise of R_n's
  // current 4kT/R_n through Req, over the band (ideal op-amp, no C_f: flat).
  double tee_power = 0;
  for (const char* name : {"R1", "R2", "R3"})
    tee_power += std::pow(FindContributor(b, name).output_rms_v, 2);
  const double band = s.band_high_hz - s.band_low_hz;
  CHECK(RelErr(std::sqrt(tee_power),
               std::sqrt(test::FourKT(s.temperature_k) / rn * band) * req) <
        1e-6);
  // A plain R_f has none.
  CHECK(test::ComputeOrFail(Receiver(), 1e-6)
            .photodiode->tee_noise_equivalent_ohm == 0);
}

}  // namespace
}  // namespace hushgain

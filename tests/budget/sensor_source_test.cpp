// The sensor's own noise (source.noise) and the input-referred noise in the
// measurand's units (source.sensitivity, noise.measurand). The sensor's noise
// enters where the signal does, so it must pass to the output with the
// signal gain exactly at every frequency; the measurand's figures are the
// input-referred figures divided by the sensitivity. Expected values are
// closed forms derived here.
#include <doctest/doctest.h>

#include <cmath>
#include <complex>
#include <string>
#include <vector>

#include "budget/compute_budget.h"
#include "circuit/expand_stage.h"
#include "noise/spectrum_evaluator.h"
#include "report/enum_words.h"
#include "test_support.h"

namespace hushgain {
namespace {

using test::RelErr;

const Contributor* Find(const Budget& b, const std::string& name) {
  for (const Contributor& c : b.contributors)
    if (c.name == name) return &c;
  return nullptr;
}

// |sensor -> output| / |signal -> output| at f, from the engine's transfers.
double SensorOverSignal(const Stage& stage, double f) {
  const Netlist net = ExpandStage(stage);
  SpectrumEvaluator ev;
  REQUIRE(SpectrumEvaluator::Create(net, stage.temperature_k, &ev).ok);
  std::vector<double> psd(ev.source_count());
  REQUIRE(ev.Densities(f, psd.data()).ok);
  const double signal = std::abs(ev.Transfer(ev.Compile(net.signal)));
  for (int k = 0; k < ev.source_count(); ++k)
    if (ev.sources()[k].name == "sensor") {
      // The sensor's own density at f is density^2 (1 + corner / f).
      const double d = stage.sensor_noise->density;
      const double own = d * d * (1 + stage.sensor_noise->corner_hz / f);
      return std::sqrt(psd[k] / own) / signal;
    }
  FAIL("no sensor source");
  return 0;
}

Stage InvertingWithSensor() {
  // 10 k into 1 M || 1.6 nF (a pole near 100 Hz, so the gain is not flat).
  Stage s = test::InvertingStage(10e3, 1e6, test::IdealOpAmp(4e-9, 1e-13));
  s.band_low_hz = 1;
  s.band_high_hz = 1e4;
  s.reference_hz = 50;
  s.feedback.capacitor_f = 1.6e-9;
  s.sensor_noise = SensorNoise{20e-9, 5.0};
  return s;
}

Stage ReceiverWithSensor() {
  Stage s;
  s.name = "receiver";
  s.temperature_k = 298.15;
  s.band_low_hz = 1;
  s.band_high_hz = 10e3;
  s.reference_hz = 100;
  s.topology = Topology::kTransimpedance;
  s.opamp = test::IdealOpAmp(10e-9, 1e-15);
  s.photodiode.capacitance_f = 100e-12;
  s.photodiode.shunt_resistance_ohm = 1e9;
  s.photodiode.responsivity_a_per_w = 0.55;
  s.feedback.resistor_ohm = 10e6;
  s.feedback.capacitor_f = 1e-12;
  s.sensor_noise = SensorNoise{2e-15, 0.0};
  return s;
}

TEST_CASE(
    "a voltage sensor's own noise passes to the output with the signal gain "
    "exactly, at every frequency") {
  const Stage s = InvertingWithSensor();
  for (double f : {1.0, 37.0, 100.0, 1e3, 1e4}) {
    CAPTURE(f);
    CHECK(RelErr(SensorOverSignal(s, f), 1.0) < test::kRelTight);
  }
  const Budget b = test::ComputeOrFail(s, 1e-9);
  const Contributor* c = Find(b, "sensor");
  REQUIRE(c);
  CHECK(std::string(NoiseKindWord(c->kind)) == "sensor");
  CHECK_FALSE(IsCurrentNoise(c->kind));
  CHECK(RelErr(c->gain_to_output_ref, b.signal_gain_ref) < test::kRelTight);
  // Its density at the reference: 20 nV sqrt(1 + 5/50) x |gain(50 Hz)|.
  CHECK(RelErr(c->output_density_ref_v_per_rthz,
               20e-9 * std::sqrt(1.1) * b.signal_gain_ref) < test::kRelTight);
}

TEST_CASE(
    "the sensor's white and 1/f noise integrate to d G sqrt(B + f_c "
    "ln(f_high/f_low)) through a flat gain") {
  // Ideal op-amp, no C_f: the gain is R_f / R_in = 100 at every frequency;
  // integral of d^2 (1 + f_c/f) df = d^2 (f_h - f_l + f_c ln(f_h/f_l)).
  Stage s = test::InvertingStage(10e3, 1e6, test::IdealOpAmp(0, 0));
  s.band_low_hz = 0.1;
  s.band_high_hz = 1e3;
  s.reference_hz = 10;
  s.sensor_noise = SensorNoise{15e-9, 20.0};
  const Budget b = test::ComputeOrFail(s, 1e-10);
  const Contributor* c = Find(b, "sensor");
  REQUIRE(c);
  const double expected =
      15e-9 * 100 * std::sqrt(1e3 - 0.1 + 20.0 * std::log(1e3 / 0.1));
  CHECK(RelErr(c->output_rms_v, expected) < test::kRelIdeal);
}

TEST_CASE(
    "a photodiode's own current noise passes with the transimpedance "
    "exactly") {
  const Stage s = ReceiverWithSensor();
  for (double f : {1.0, 100.0, 3e3, 1e4}) {
    CAPTURE(f);
    CHECK(RelErr(SensorOverSignal(s, f), 1.0) < test::kRelTight);
  }
  const Budget b = test::ComputeOrFail(s, 1e-9);
  const Contributor* c = Find(b, "sensor");
  REQUIRE(c);
  CHECK(IsCurrentNoise(c->kind));
  CHECK(RelErr(c->output_density_ref_v_per_rthz, 2e-15 * b.signal_gain_ref) <
        test::kRelTight);
}

TEST_CASE("without source.noise there is no sensor contributor") {
  Stage s = InvertingWithSensor();
  s.sensor_noise.reset();
  CHECK_FALSE(Find(test::ComputeOrFail(s, 1e-6), "sensor"));
}

TEST_CASE(
    "noise in the measurand is the input-referred noise over the "
    "sensitivity") {
  Stage s = InvertingWithSensor();
  s.sensitivity = Sensitivity{2e-3, "Pa"};  // 2 mV per Pa
  const Budget b = test::ComputeOrFail(s, 1e-8);
  REQUIRE(b.measurand);
  CHECK(b.measurand->unit == "Pa");
  CHECK(RelErr(b.measurand->input_referred_rms, b.input_rms / 2e-3) < 1e-12);
  CHECK(RelErr(b.measurand->input_referred_density_at_reference,
               b.input_density_ref_per_rthz / 2e-3) < 1e-12);
  s.sensitivity.reset();
  CHECK_FALSE(test::ComputeOrFail(s, 1e-6).measurand);
}

TEST_CASE("for light, the measurand in W is the NEP unchanged") {
  Stage s = ReceiverWithSensor();
  const Budget before = test::ComputeOrFail(s, 1e-8);
  s.sensitivity = Sensitivity{0.55, "W"};
  const Budget b = test::ComputeOrFail(s, 1e-8);
  REQUIRE(b.photodiode);
  REQUIRE(b.measurand);
  CHECK(RelErr(b.measurand->input_referred_rms, b.photodiode->nep_rms_w) <
        1e-12);
  CHECK(RelErr(b.measurand->input_referred_density_at_reference,
               b.photodiode->nep_w_per_rthz) < 1e-12);
  CHECK(RelErr(b.photodiode->nep_rms_w, before.photodiode->nep_rms_w) < 1e-12);
}

}  // namespace
}  // namespace hushgain

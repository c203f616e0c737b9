// Stages built in code, shared by the tests and the benchmarks (so both
// measure and check the same circuits). Plain values: no doctest here, so
// bench/ can include it.
#ifndef HUSHGAIN_TESTS_FIXTURE_STAGES_H_
#define HUSHGAIN_TESTS_FIXTURE_STAGES_H_

#include "circuit/stage.h"
#include "circuit/stage_at_temperature.h"

namespace hushgain::test {

// An op-amp close enough to ideal that its finite gain is below 1e-6
// (kRelIdeal) at low frequency for noise gains up to ~1e4: A0 = 1e12,
// GBW = 1e15 Hz.
inline OpAmpModel IdealOpAmp(double e_w = 0, double i_w = 0) {
  OpAmpModel m;
  m.class_name = "ideal";
  m.e_w_v_per_rthz = e_w;
  m.i_w_a_per_rthz = i_w;
  m.open_loop_gain = 1e12;
  m.gbw_hz = 1e15;
  return m;
}

// R_in into R_f around `opamp`, 0.1 .. 10 Hz, reference 1 Hz.
inline Stage InvertingStage(double rin, double rf, const OpAmpModel& opamp,
                            double temperature_k = 300.0) {
  Stage s;
  s.name = "test stage";
  s.temperature_k = temperature_k;
  s.band_low_hz = 0.1;
  s.band_high_hz = 10.0;
  s.reference_hz = 1.0;
  s.opamp = opamp;
  s.input_resistor_ohm = rin;
  s.feedback.kind = Feedback::Kind::kResistor;
  s.feedback.resistor_ohm = rf;
  return s;
}

// As InvertingStage with the T network R1, R2, R3 as feedback.
inline Stage TeeStage(double rin, double r1, double r2, double r3,
                      const OpAmpModel& opamp, double temperature_k = 300.0) {
  Stage s = InvertingStage(rin, 1.0, opamp, temperature_k);
  s.feedback.kind = Feedback::Kind::kTee;
  s.feedback.tee = {r1, r2, r3};
  return s;
}

// A JFET-like op-amp class of our own: 6 nV/rtHz with a 50 Hz corner,
// 3 fA/rtHz, A0 1e6, GBW 20 MHz, 100 ohm out, 5 pF pins, 300 uV (3 uV/K),
// 5 pA bias doubling every 10 K.
inline OpAmpModel JfetLikeOpAmp() {
  OpAmpModel m;
  m.class_name = "test JFET-like";
  m.e_w_v_per_rthz = 6e-9;
  m.f_cv_hz = 50;
  m.i_w_a_per_rthz = 3e-15;
  m.open_loop_gain = 1e6;
  m.gbw_hz = 20e6;
  m.output_resistance_ohm = 100;
  m.c_cm_f = 5e-12;
  m.c_diff_f = 5e-12;
  m.vos_v = 300e-6;
  m.vos_drift_v_per_k = 3e-6;
  m.ib_a = 5e-12;
  m.ios_a = 2e-12;
  m.ib_law = BiasTemperatureLaw::kDoubling;
  m.ib_law_value = 10;
  return m;
}

// A geophone-like T-network stage of our own on JfetLikeOpAmp: R_in 10k,
// tee 100k / 100k / 1.02k, 1k source, 2k load, thin-film-like parts
// (0.1 %, 25 ppm/K, -35 dB), -20 .. 70 degC, 10 Hz .. 5 kHz at 25 degC.
// The spread benchmark and the Monte Carlo tests use it.
inline Stage JfetTeeStage() {
  Stage s = TeeStage(10e3, 100e3, 100e3, 1.02e3, JfetLikeOpAmp(), 298.15);
  s.name = "JFET-like T-network stage";
  s.temperature_range = TemperatureRange{253.15, 343.15};
  s.band_low_hz = 10;
  s.band_high_hz = 5e3;
  s.reference_hz = 1e3;
  s.source.resistance_ohm = 1e3;
  s.load_ohm = 2e3;
  ResistorSpec spec;
  spec.technology_name = "thin-film";
  spec.technology = {"thin film", -35, 25e-6, 0.001};
  spec.tolerance = 0.001;
  s.resistors = spec;
  return s;
}

// A T-network stage with every element the netlist knows: a finite-gain
// op-amp (A0 2e5, GBW 3 MHz, 75 ohm out, pins 4 and 2 pF, 5 nV/rtHz,
// 0.5 pA/rtHz), 50 ohm source, R_in 4.7k, tee 47k / 220k / 2.2k with 10 pF
// across, an automatic bias-compensation resistor and a 2k load.
inline Stage EveryElementTeeStage() {
  OpAmpModel m = IdealOpAmp(5e-9, 0.5e-12);
  m.open_loop_gain = 2e5;
  m.gbw_hz = 3e6;
  m.output_resistance_ohm = 75;
  m.c_cm_f = 4e-12;
  m.c_diff_f = 2e-12;
  Stage stage = TeeStage(4.7e3, 47e3, 220e3, 2.2e3, m);
  stage.source.resistance_ohm = 50;
  stage.feedback.capacitor_f = 10e-12;
  stage.plus_resistor.mode = PlusResistor::Mode::kAuto;
  stage.load_ohm = 2e3;
  return stage;
}

// A photodiode receiver on `opamp` at 25 degC: C_d and R_sh into R_f || C_f,
// 1 Hz .. 10 kHz, reference 100 Hz.
inline Stage ReceiverStage(const OpAmpModel& opamp, double c_d, double r_sh,
                           double r_f, double c_f) {
  Stage s;
  s.name = "receiver";
  s.temperature_k = kDeviceReferenceK;
  s.band_low_hz = 1;
  s.band_high_hz = 10e3;
  s.reference_hz = 100;
  s.topology = Topology::kTransimpedance;
  s.opamp = opamp;
  s.photodiode.capacitance_f = c_d;
  s.photodiode.shunt_resistance_ohm = r_sh;
  s.feedback.resistor_ohm = r_f;
  s.feedback.capacitor_f = c_f;
  return s;
}

}  // namespace hushgain::test

#endif  // HUSHGAIN_TESTS_FIXTURE_STAGES_H_

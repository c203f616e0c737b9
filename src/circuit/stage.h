// A stage: what the designer described in a stage file, resolved to SI
// values. A plain copyable value; io builds it, circuit expands it into a
// Netlist, budget reads its bookkeeping fields (band, temperature).
#ifndef HUSHGAIN_CIRCUIT_STAGE_H_
#define HUSHGAIN_CIRCUIT_STAGE_H_

#include <map>
#include <optional>
#include <string>

#include "circuit/opamp_model.h"
#include "circuit/resistor_technology.h"
#include "circuit/signal_chain.h"

namespace hushgain {

enum class Topology {
  kInverting,  // Rin from the source to the - input, feedback to the output
  kTransimpedance,  // a photodiode into the - input, feedback to the output
};

// A T network in the feedback path: R1 from the - input to the tee node,
// R2 from the tee node to the output, R3 from the tee node to ground, with
// an optional C3 in series with R3 (AC coupling of the shunt arm: at DC the
// arm is open and the feedback is R1 + R2 alone; well above
// 1/(2 pi R3 C3) it is the whole T network).
struct TeeNetwork {
  double r1_ohm = 0;
  double r2_ohm = 0;
  double r3_ohm = 0;
  double c3_f = 0;  // 0 = none (R3 straight to ground)
};

struct Feedback {
  enum class Kind { kResistor, kTee };
  Kind kind = Kind::kResistor;
  double resistor_ohm = 0;  // kResistor
  TeeNetwork tee;           // kTee
  // Across the whole feedback path, - input to output; 0 = none.
  double capacitor_f = 0;
  // The feedback resistor's own capacitance, which `tia suggest` counts in
  // C_f when it fits capacitors of a series (0.2 pF for a small
  // surface-mount part: common practice). The budget takes capacitor_f as
  // the whole C_f.
  double parasitic_capacitance_f = 0.2e-12;
};

// What a feedback capacitor given as "auto" is chosen for: a maximally flat
// (Butterworth, Q = 1/sqrt 2) closed-loop response, or a loop phase margin.
struct CapacitorTarget {
  enum class Kind { kButterworth, kPhaseMargin };
  Kind kind = Kind::kButterworth;
  double phase_margin_deg = 0;  // kPhaseMargin
};

// The resistor from the + input to ground.
struct PlusResistor {
  enum class Mode { kNone, kValue, kAuto };
  Mode mode = Mode::kNone;
  double ohms = 0;  // kValue
};

// The signal source driving the input resistor: an open-circuit voltage
// behind its source resistance (noisy, a contributor).
struct SignalSource {
  double resistance_ohm = 0;
};

// A capacitive (charge) sensor in an inverting stage: a piezo element, a
// hydrophone, an accelerometer. Its charge Q is an open-circuit voltage
// V = Q / C_s behind its capacitance C_s (the Thevenin form of a charge
// generator sQ in parallel with C_s), with an optional leakage resistance
// R_leak across its terminals (noisy, a contributor). The signal is that
// open-circuit voltage, so the signal gain stays in V/V and the charge
// figures are the voltage figures scaled by C_s: Q = C_s V.
struct CapacitiveSensor {
  double capacitance_f = 0;           // C_s > 0
  double leakage_resistance_ohm = 0;  // R_leak; 0 = none (infinite)
};

// A photodiode as built. The diode's junction (photocurrent, dark current,
// capacitance C_d, shunt resistance R_sh) sits between its junction node and
// its bias node; its series resistance R_s joins the junction node to the
// - input. The bias node is ground at zero bias, and behind a supply of
// `reverse_bias_v` otherwise (AC ground; its noise, if given, in series).
//   photocurrent   the average photocurrent during the measurement (signal
//                  DC level plus ambient light): shot noise 2 q I_ph and a
//                  DC output; not an offset
//   dark current   flows only under reverse bias (photovoltaic mode: no
//                  dark current, so neither its shot noise nor its DC term;
//                  the junction's noise is then R_sh's thermal noise, which
//                  equals 4 q I_s for R_sh = V_T / I_s)
// The dark current and R_sh are given at 25 °C; at T the dark current is
// multiplied and R_sh divided by 2^((T - 25 °C) / doubling interval)
// (circuit/stage_at_temperature.h).
struct Photodiode {
  double capacitance_f = 0;
  double shunt_resistance_ohm = 0;   // 0 = none (infinite)
  double dark_current_a = 0;         // at the reverse bias, 25 °C
  double responsivity_a_per_w = 0;   // 0 = not given (no NEP)
  double photocurrent_a = 0;         // average, >= 0
  double reverse_bias_v = 0;         // >= 0; 0 = photovoltaic (zero bias)
  double bias_noise_v_per_rthz = 0;  // the bias supply's white noise
  double series_resistance_ohm = 0;  // R_s; 0 = none
  // Dark current doubles, R_sh halves, every this many kelvin (common
  // practice: about every 8 to 10 °C for silicon; 10 is the default).
  double doubling_interval_k = 10;
};

// The sensor's own noise at the source (source.noise): a white density with
// a 1/f corner, e(f)^2 = density^2 (1 + corner / f), in V/rtHz for a voltage
// source and A/rtHz for a photodiode; it enters where the signal does.
struct SensorNoise {
  double density = 0;
  double corner_hz = 0;  // 0 = white
};

// How the measurand becomes the source quantity (source.sensitivity): `value`
// source units (V, A) per one `per` (a unit name: "g", "Pa", "W"). A
// capacitive sensor may state it in coulombs instead (`in_charge`), the
// charge it produces per unit; its volts are that charge over C_s.
struct Sensitivity {
  double value = 0;  // > 0, SI source units (or C) per measurand unit
  std::string per;
  bool in_charge = false;  // value in C per unit (capacitive sensors only)
};

// The working temperature range; the stage's temperature_k is the nominal.
struct TemperatureRange {
  double min_k = 298.15;
  double max_k = 298.15;
};

// The technology of a resistor (or of all the stage's resistors): its noise
// index, temperature coefficient and tolerance (the tolerance may be set
// apart from the technology's class-typical value).
struct ResistorSpec {
  std::string technology_name;  // the device name, "thin-film"
  ResistorTechnology technology;
  double tolerance = 0;  // relative, >= 0
};

// The tolerances of the stage's capacitors (the stage file's `capacitors`
// block), drawn by spread like the resistors': `tolerance` for the stage's
// own capacitors (C_f, C3, C_input, C_plus) and per-capacitor overrides keyed
// by netlist name (these may also give the sensor's C_s or C_d one).
struct CapacitorTolerances {
  double tolerance = 0;  // relative, >= 0
  std::map<std::string, double> overrides;
};

struct Stage {
  std::string name;
  // The nominal temperature. Device and resistor values are at 25 °C; the
  // budget evaluates the stage at this temperature
  // (circuit/stage_at_temperature.h).
  double temperature_k = 298.15;
  std::optional<TemperatureRange> temperature_range;
  double band_low_hz = 0;
  double band_high_hz = 0;
  std::optional<double> reference_hz;  // default: sqrt(low * high)
  OpAmpModel opamp;
  SignalSource source;  // kInverting
  // kInverting: a capacitive sensor instead of the voltage source; then
  // input_resistor_ohm may be 0 (the sensor drives the - input directly).
  std::optional<CapacitiveSensor> capacitive;
  Photodiode photodiode;                    // kTransimpedance
  std::optional<SensorNoise> sensor_noise;  // source.noise
  std::optional<Sensitivity> sensitivity;   // source.sensitivity
  Topology topology = Topology::kInverting;
  double input_resistor_ohm = 0;  // kInverting; 0 = none (capacitive only)
  // kInverting: a capacitor in series with R_in (AC coupling: the input
  // passes no DC); 0 = none.
  double input_capacitor_f = 0;
  Feedback feedback;
  // When set, feedback.capacitor_f is chosen by the budget for this target.
  std::optional<CapacitorTarget> capacitor_target;
  PlusResistor plus_resistor;
  double plus_resistor_bypass_f = 0;  // a capacitor across R_plus; 0 = none
  std::optional<double> load_ohm;
  std::optional<double> full_scale_output_v;  // peak output swing, ±V
  // The technology of the stage's own resistors (R_in, R_f, R1, R2, R3,
  // R_plus, R_load), and per-resistor overrides keyed by contributor name
  // (these may also give R_source, R_sh and R_s one). None = ideal parts: no
  // excess noise, no tempco, no tolerance.
  std::optional<ResistorSpec> resistors;
  std::map<std::string, ResistorSpec> resistor_overrides;
  CapacitorTolerances capacitors;
  // The DC level at the input for the DC solution (excess noise): volts of
  // the voltage source, or amperes of photocurrent; default 0.
  double dc_input = 0;
  // What follows the stage up to the converter (the "chain" block); none:
  // the budget ends at the stage's output.
  std::optional<SignalChain> chain;
};

// The spec of the netlist resistor named `name` ("R_in", "R1", ...): the
// override, else the stage's technology for its own parts, else nullptr.
const ResistorSpec* ResistorSpecFor(const Stage& stage,
                                    const std::string& name);

// The tolerance of the netlist capacitor `name` ("C_f", "C3", ...): the
// override, else the stage's tolerance for its own parts, else 0.
double CapacitorToleranceFor(const Stage& stage, const std::string& name);

// sqrt(low * high) unless the stage sets it.
double ReferenceFrequencyHz(const Stage& stage);

}  // namespace hushgain

#endif  // HUSHGAIN_CIRCUIT_STAGE_H_

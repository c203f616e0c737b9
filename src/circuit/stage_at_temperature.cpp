#include "circuit/stage_at_temperature.h"

#include <cmath>

#include "circuit/expand_stage.h"
#include "circuit/stage_resistors.h"

namespace hushgain {

double BiasCurrentFactor(const OpAmpModel& opamp, double temperature_k) {
  const double delta = temperature_k - kDeviceReferenceK;
  switch (opamp.ib_law) {
    case BiasTemperatureLaw::kNone:
      return 1.0;
    case BiasTemperatureLaw::kDoubling:
      return std::exp2(delta / opamp.ib_law_value);
    case BiasTemperatureLaw::kCoefficient:
      return 1.0 + opamp.ib_law_value * delta;
  }
  return 1.0;
}

double CurrentNoiseFactor(const OpAmpModel& opamp, double temperature_k) {
  if (opamp.current_noise_temperature !=
      CurrentNoiseTemperature::kWithBiasCurrent)
    return 1.0;
  return std::sqrt(std::fabs(BiasCurrentFactor(opamp, temperature_k)));
}

double PhotodiodeTemperatureFactor(const Photodiode& photodiode,
                                   double temperature_k) {
  return std::exp2((temperature_k - kDeviceReferenceK) /
                   photodiode.doubling_interval_k);
}

double ResistorTemperatureFactor(double tempco_per_k, double temperature_k) {
  return 1.0 + tempco_per_k * (temperature_k - kDeviceReferenceK);
}

Stage StageAtTemperature(const Stage& stage, double temperature_k) {
  Stage out = stage;
  out.temperature_k = temperature_k;
  const double delta = temperature_k - kDeviceReferenceK;
  OpAmpModel& m = out.opamp;
  m.vos_v =
      std::fabs(m.vos_v) + std::fabs(m.vos_drift_v_per_k) * std::fabs(delta);
  const double k = BiasCurrentFactor(stage.opamp, temperature_k);
  m.ib_a *= k;
  m.ios_a *= k;
  const double noise_factor = CurrentNoiseFactor(stage.opamp, temperature_k);
  m.i_w_a_per_rthz *= noise_factor;
  if (noise_factor > 0)
    m.current_noise_table.Scale(noise_factor);
  else
    m.current_noise_table = NoiseTable{};  // no bias current, no shot noise
  // An "auto" R_plus is a real part: fitted at 25 °C, then it drifts with
  // its own technology like every other resistor.
  if (out.plus_resistor.mode == PlusResistor::Mode::kAuto)
    out.plus_resistor = {PlusResistor::Mode::kValue, BalanceResistorOhm(stage)};
  for (auto& [name, ohms] : StageResistors(out)) {
    const ResistorSpec* spec = ResistorSpecFor(stage, name);
    if (spec)
      *ohms *= ResistorTemperatureFactor(spec->technology.tempco_per_k,
                                         temperature_k);
  }
  if (out.topology == Topology::kTransimpedance) {
    const double d =
        PhotodiodeTemperatureFactor(stage.photodiode, temperature_k);
    out.photodiode.dark_current_a *= d;
    out.photodiode.shunt_resistance_ohm /= d;
  }
  return out;
}

}  // namespace hushgain

#include "noise/noise_source.h"

#include <cmath>
#include <variant>

#include "base/physical_constants.h"

namespace hushgain {

bool IsCurrentNoise(NoiseKind kind) {
  return kind == NoiseKind::kShot || kind == NoiseKind::kOpAmpCurrent ||
         kind == NoiseKind::kSensorCurrent;
}

std::vector<NoiseSource> CollectNoiseSources(const Netlist& net,
                                             double temperature_k) {
  std::vector<NoiseSource> sources;
  const double four_kt = 4.0 * kBoltzmannJPerK * temperature_k;
  for (const Resistor& r : net.resistors) {
    if (!r.noisy) continue;
    sources.push_back({r.name,
                       NoiseKind::kThermal,
                       CurrentInjection{r.a, r.b},
                       four_kt / r.ohms,
                       0.0,
                       0.0,
                       r.ohms,
                       {}});
  }
  for (const JunctionCurrent& j : net.junction_currents) {
    // Schottky 1918: 2 q I, white.
    sources.push_back({j.name,
                       NoiseKind::kShot,
                       CurrentInjection{j.b, j.a},
                       2.0 * kElementaryChargeC * std::fabs(j.amperes),
                       0.0,
                       0.0,
                       0.0,
                       {}});
  }
  for (std::size_t k = 0; k < net.voltage_sources.size(); ++k) {
    const VoltageSource& v = net.voltage_sources[k];
    if (!(v.noise_v_per_rthz > 0)) continue;
    sources.push_back({v.name,
                       NoiseKind::kSupply,
                       SourceVoltage{static_cast<int>(k)},
                       v.noise_v_per_rthz * v.noise_v_per_rthz,
                       0.0,
                       0.0,
                       0.0,
                       {}});
  }
  if (net.signal_noise.density > 0) {
    const bool current = std::holds_alternative<CurrentInjection>(net.signal);
    sources.push_back(
        {"sensor",
         current ? NoiseKind::kSensorCurrent : NoiseKind::kSensorVoltage,
         net.signal,
         net.signal_noise.density * net.signal_noise.density,
         net.signal_noise.corner_hz,
         0.0,
         0.0,
         {}});
  }
  const bool several = net.opamps.size() > 1;
  for (std::size_t k = 0; k < net.opamps.size(); ++k) {
    const OpAmp& op = net.opamps[k];
    const OpAmpModel& m = op.model;
    std::string suffix = several ? " (" + op.name + ")" : "";
    sources.push_back({"e_n" + suffix, NoiseKind::kOpAmpVoltage,
                       OpAmpInputVoltage{static_cast<int>(k)},
                       m.e_w_v_per_rthz * m.e_w_v_per_rthz, m.f_cv_hz, 0.0, 0.0,
                       m.voltage_noise_table});
    const double i_psd = m.i_w_a_per_rthz * m.i_w_a_per_rthz;
    if (op.minus != kGround)
      sources.push_back({"i_n-" + suffix, NoiseKind::kOpAmpCurrent,
                         CurrentInjection{op.minus, kGround}, i_psd, m.f_ci_hz,
                         0.0, 0.0, m.current_noise_table});
    if (op.plus != kGround)
      sources.push_back({"i_n+" + suffix, NoiseKind::kOpAmpCurrent,
                         CurrentInjection{op.plus, kGround}, i_psd, m.f_ci_hz,
                         0.0, 0.0, m.current_noise_table});
  }
  return sources;
}

}  // namespace hushgain

#include "circuit/stage.h"

#include <cmath>

namespace hushgain {

double ReferenceFrequencyHz(const Stage& stage) {
  if (stage.reference_hz) return *stage.reference_hz;
  return std::sqrt(stage.band_low_hz * stage.band_high_hz);
}

const ResistorSpec* ResistorSpecFor(const Stage& stage,
                                    const std::string& name) {
  auto it = stage.resistor_overrides.find(name);
  if (it != stage.resistor_overrides.end()) return &it->second;
  // The source's resistance, the photodiode's shunt and series resistances
  // and a capacitive sensor's leakage belong to the sensor, not to the
  // stage's parts.
  if (name == "R_source" || name == "R_sh" || name == "R_s" || name == "R_leak")
    return nullptr;
  return stage.resistors ? &*stage.resistors : nullptr;
}

double CapacitorToleranceFor(const Stage& stage, const std::string& name) {
  auto it = stage.capacitors.overrides.find(name);
  if (it != stage.capacitors.overrides.end()) return it->second;
  // The sensor's capacitance is its own, not one of the stage's parts.
  if (name == "C_s" || name == "C_d") return 0;
  return stage.capacitors.tolerance;
}

}  // namespace hushgain

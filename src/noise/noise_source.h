// Noise sources of a netlist, each a stimulus at an excitation point with a
// one-sided power spectral density
//   S(f) = white_psd * (1 + corner_hz / f) + flicker_psd / f + table(f)^2
// in V^2/Hz (a voltage excitation) or A^2/Hz (a current excitation):
//   resistor thermal noise  4kT/R as a current across the resistor
//                           (Johnson 1928, Nyquist 1928)
//   op-amp voltage noise    e_w^2 (1 + f_cv/f) + e_table(f)^2 in series with
//                           the + input
//   op-amp current noise    i_w^2 (1 + f_ci/f) + i_table(f)^2 from each input
//                           pin to ground
//   junction shot noise     2 q I across the junction (Schottky 1918)
//   a voltage source's own  its white density in series with it (a
//   noise                   photodiode's bias supply)
//   the sensor's own noise  density^2 (1 + corner/f) at the signal's
//                           excitation, so it passes with the signal gain
//   resistor excess noise   a 1/f current across the resistor from its noise
//                           index and DC drop (noise/excess_noise.h)
// Sources are uncorrelated: their output powers add.
#ifndef HUSHGAIN_NOISE_NOISE_SOURCE_H_
#define HUSHGAIN_NOISE_NOISE_SOURCE_H_

#include <string>
#include <vector>

#include "circuit/netlist.h"
#include "circuit/noise_table.h"

namespace hushgain {

enum class NoiseKind {
  kThermal,        // 4kTR of a resistor
  kShot,           // 2qI of a current
  kOpAmpVoltage,   // e_n
  kOpAmpCurrent,   // i_n at one pin
  kExcess,         // current (excess) noise of a resistor with a DC drop
  kSupply,         // a voltage source's own noise (a photodiode's bias)
  kSensorVoltage,  // the sensor's own noise, a voltage (source.noise)
  kSensorCurrent,  // the sensor's own noise, a current (a photodiode's)
};

// True for the kinds whose source is a current (A/rtHz): shot, i_n and a
// photodiode's own noise.
bool IsCurrentNoise(NoiseKind kind);

struct NoiseSource {
  std::string name;  // "R_in", "e_n", "i_n-": how the budget names it
  NoiseKind kind = NoiseKind::kThermal;
  Excitation excitation;
  double white_psd = 0;    // V^2/Hz or A^2/Hz
  double corner_hz = 0;    // 1/f corner; 0 = white
  double flicker_psd = 0;  // a pure 1/f part: flicker_psd / f, (V^2 or A^2)
  // For a resistor's sources (thermal, excess): its resistance, so the
  // budget can quote the source as a voltage density; 0 otherwise.
  double resistor_ohm = 0;
  // A tabulated density on top (the op-amp's e_n and i_n tables); empty
  // otherwise.
  NoiseTable table;

  double PsdAt(double f_hz) const {
    return white_psd * (1.0 + corner_hz / f_hz) + flicker_psd / f_hz +
           table.PsdAt(f_hz);
  }
};

// One source per noisy resistor, junction current and noisy voltage source,
// one e_n and two i_n per op-amp. Sources
// whose excitation lies wholly on ground (an input pin tied to ground) are
// left out: they reach no node.
std::vector<NoiseSource> CollectNoiseSources(const Netlist& netlist,
                                             double temperature_k);

}  // namespace hushgain

#endif  // HUSHGAIN_NOISE_NOISE_SOURCE_H_
